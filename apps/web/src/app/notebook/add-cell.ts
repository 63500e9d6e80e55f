import { ChangeDetectionStrategy, Component, PendingTasks, computed, inject, input, output, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenu, MatMenuModule, MatMenuTrigger } from '@angular/material/menu';
import type { CellKind } from '@laminote/contracts/cell-kinds';
import { ADDABLE_KINDS, cellKindInfo } from '../shared/cell-kinds';
import { loadRuntimeChecksWhenIdle, runtimeChecks } from '../shared/runtime-checks';

/**
 * The list of kinds every add-cell control of a page opens: one menu for the page, not one per
 * control (a long study has an insertion line between every two cells, and each menu of its own cost
 * about 1 ms of the first drawing). The control that opened it gets the kind picked.
 */
@Component({
  selector: 'lam-add-cell-menu',
  exportAs: 'addCellMenu',
  imports: [MatIconModule, MatMenuModule],
  template: `
    <!-- The kinds are made when the list opens. -->
    <mat-menu #kinds="matMenu" class="lam-add-cell-menu">
      <ng-template matMenuContent let-from="from">
        @for (kind of kinds_; track kind.kind) {
          <button mat-menu-item type="button" class="kind-item" [disabled]="!ready()" (click)="from.add.emit(kind.kind)">
            <mat-icon aria-hidden="true">{{ kind.icon }}</mat-icon>
            <span class="kind-name">{{ kind.label }}</span>
            <span class="kind-hint">{{ kind.hint }}</span>
          </button>
        }
      </ng-template>
    </mat-menu>
  `,
  styleUrl: './add-cell-menu.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AddCellMenu {
  protected readonly kinds_ = ADDABLE_KINDS.map(cellKindInfo);
  /** A new cell takes its defaults from its kind's schema, loaded apart from the first screen. */
  protected readonly ready = computed(() => runtimeChecks() !== null);
  /** The menu, for the controls' triggers. */
  readonly panel = viewChild.required<MatMenu>('kinds');

  constructor() {
    inject(PendingTasks).run(() => loadRuntimeChecksWhenIdle());
  }
}

/**
 * Adds a cell at one place in the stack: a thin insertion line between cells, or the full button at
 * the end. Both open the page's one list of kinds, an `AddCellMenu` given as an input.
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
          [matMenuTriggerFor]="menu().panel()"
          [matMenuTriggerData]="triggerData"
          [attr.aria-label]="'Insert a cell at position ' + (index() + 1)"
        >
          <mat-icon aria-hidden="true">add</mat-icon>
        </button>
      </div>
    } @else {
      <button mat-stroked-button type="button" class="add-button" [matMenuTriggerFor]="menu().panel()" [matMenuTriggerData]="triggerData">
        <mat-icon aria-hidden="true">add</mat-icon>
        Add cell
      </button>
    }
  `,
  styleUrl: './add-cell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AddCell {
  /** Where the new cell goes, 0-based. */
  readonly index = input.required<number>();
  readonly variant = input<'line' | 'button'>('line');
  /** The page's list of kinds. */
  readonly menu = input.required<AddCellMenu>();
  /** The kind picked from the list this control opened. */
  readonly add = output<CellKind>();

  /** Tells the shared list which control opened it. */
  protected readonly triggerData = { from: this };
  private readonly trigger = viewChild.required(MatMenuTrigger);

  /** Opens the list of kinds (the Alt+Enter shortcut). */
  open(): void {
    this.trigger().openMenu();
    this.trigger().focus('keyboard');
  }
}
