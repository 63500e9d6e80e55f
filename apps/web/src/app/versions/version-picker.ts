import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type { BranchOverview, VersionSummary } from '@laminote/contracts';

export interface VersionGroup {
  readonly branch: BranchOverview;
  readonly versions: readonly VersionSummary[];
}

/** Picks one version of a study, the versions grouped by branch, newest first. */
@Component({
  selector: 'lam-version-picker',
  imports: [MatFormFieldModule, MatSelectModule],
  template: `
    <mat-form-field subscriptSizing="dynamic">
      <mat-label>{{ label() }}</mat-label>
      <mat-select [value]="value()" (selectionChange)="picked.emit($event.value)">
        @for (g of groups(); track g.branch.id) {
          <mat-optgroup [label]="g.branch.name">
            @for (v of g.versions; track v.id) {
              <mat-option [value]="v.id">{{ v.branchName }} v{{ v.number }} — {{ v.message }}{{ v.id === baselineId() ? ' (baseline)' : '' }}</mat-option>
            }
          </mat-optgroup>
        }
      </mat-select>
    </mat-form-field>
  `,
  styles: `
    :host {
      display: block;
    }
    mat-form-field {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VersionPicker {
  readonly label = input.required<string>();
  readonly groups = input.required<readonly VersionGroup[]>();
  readonly value = input<string | undefined>(undefined);
  readonly baselineId = input<string | null>(null);
  readonly picked = output<string>();
}
