import { ChangeDetectionStrategy, Component, PendingTasks, computed, inject, input, output, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule, MatMenuTrigger } from '@angular/material/menu';
import type { CellKind } from '@laminote/contracts/cell-kinds';
import { ADDABLE_KINDS, cellKindInfo } from '../shared/cell-kinds';
import { loadRuntimeChecksWhenIdle, runtimeChecks } from '../shared/runtime-checks';

/**
 * Adds a cell at one place in the stack: a thin insertion line between cells, or the full button at
 * the end. Both open the same list of kinds.
 */
@Component({
  selector: 'lam-add-cell',
  imports: [MatButtonModule, MatIconModule, MatMenuModule],
  template: `
    @if (variant() === 'line') {
      <div class="line">
        <button
          mat-icon-button
          type="button"
          class="insert-button"
          [matMenuTriggerFor]="kinds"
          [attr.aria-label]="'Insert a cell at position ' + (index() + 1)"
        >
          <mat-icon aria-hidden="true">add</mat-icon>
        </button>
      </div>
    } @else {
      <button mat-stroked-button type="button" class="add-button" [matMenuTriggerFor]="kinds">
        <mat-icon aria-hidden="true">add</mat-icon>
        Add cell
      </button>
    }
    <!-- The kinds are made when the list opens: a long study has an insertion line between every two cells. -->
    <mat-menu #kinds="matMenu" class="lam-add-cell-menu">
      <ng-template matMenuContent>
        @for (kind of kinds_; track kind.kind) {
          <button mat-menu-item type="button" class="kind-item" [disabled]="!ready()" (click)="add.emit(kind.kind)">
            <mat-icon aria-hidden="true">{{ kind.icon }}</mat-icon>
            <span class="kind-name">{{ kind.label }}</span>
            <span class="kind-hint">{{ kind.hint }}</span>
          </button>
        }
      </ng-template>
    </mat-menu>
  `,
  styleUrl: './add-cell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AddCell {
  /** Where the new cell goes, 0-based. */
  readonly index = input.required<number>();
  readonly variant = input<'line' | 'button'>('line');
  readonly add = output<CellKind>();

  protected readonly kinds_ = ADDABLE_KINDS.map(cellKindInfo);
  /** A new cell takes its defaults from its kind's schema, loaded apart from the first screen. */
  protected readonly ready = computed(() => runtimeChecks() !== null);
  private readonly trigger = viewChild.required(MatMenuTrigger);

  constructor() {
    inject(PendingTasks).run(() => loadRuntimeChecksWhenIdle());
  }

  /** Opens the list of kinds (the Alt+Enter shortcut). */
  open(): void {
    this.trigger().openMenu();
    this.trigger().focus('keyboard');
  }
}
