import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';

/** A cell's share of a run under way: a thin bar, and for a sweep the cases done. */
@Component({
  selector: 'lam-cell-progress',
  imports: [DecimalPipe, MatProgressBarModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="cell-progress" role="progressbar" [attr.aria-valuenow]="done()" [attr.aria-valuemin]="0" [attr.aria-valuemax]="total()" [attr.aria-label]="label()">
      <mat-progress-bar [mode]="total() > 1 ? 'determinate' : 'indeterminate'" [value]="percent()" />
      @if (total() > 1) {
        <span class="cases">{{ done() | number }} of {{ total() | number }} cases</span>
      }
    </div>
  `,
  styles: `
    .cell-progress { display: flex; align-items: center; gap: 10px; margin: 0 4px 6px; }
    mat-progress-bar { flex: 1; }
    .cases { font-family: 'JetBrains Mono', monospace; font-size: 12px; font-variant-numeric: tabular-nums; color: var(--mat-sys-on-surface-variant); white-space: nowrap; }
  `,
})
export class CellProgress {
  readonly done = input.required<number>();
  readonly total = input.required<number>();
  protected readonly percent = computed(() => (this.total() > 0 ? (100 * this.done()) / this.total() : 0));
  protected readonly label = computed(() => (this.total() > 1 ? `${this.done()} of ${this.total()} cases computed` : 'computing'));
}
