import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatIconModule } from '@angular/material/icon';
import { cellKindInfo } from '../shared/cell-kinds';
import type { RemovedCell } from '../shared/draft-session';

/** The draft's recently removed cells, each one click from coming back. */
@Component({
  selector: 'lam-removed-cells',
  imports: [DatePipe, MatButtonModule, MatExpansionModule, MatIconModule],
  template: `
    <mat-expansion-panel class="panel">
      <mat-expansion-panel-header>
        <mat-panel-title>
          <mat-icon aria-hidden="true">restore_from_trash</mat-icon>
          Recently removed ({{ cells().length }})
        </mat-panel-title>
      </mat-expansion-panel-header>
      <ul class="removed">
        @for (cell of cells(); track cell.cellId) {
          <li>
            <mat-icon aria-hidden="true">{{ icon(cell) }}</mat-icon>
            <span class="name">{{ cell.title || label(cell) }}</span>
            <span class="meta">
              {{ label(cell) }} ·
              @if (cell.pending) {
                removed just now, not saved yet
              } @else {
                removed
                <time class="lam-mono" [attr.datetime]="cell.deletedAt">{{ cell.deletedAt | date: 'yyyy-MM-dd HH:mm' }}</time>
                @if (cell.deletedByName) {
                  by {{ cell.deletedByName }}
                }
              }
            </span>
            @if (editable()) {
              <button mat-button type="button" (click)="restore.emit(cell.cellId)" [attr.aria-label]="'Bring back ' + (cell.title || label(cell))">
                <mat-icon aria-hidden="true">undo</mat-icon>
                Bring back
              </button>
            }
          </li>
        }
      </ul>
    </mat-expansion-panel>
  `,
  styles: `
    :host {
      display: block;
      margin-top: 1.5rem;
    }
    .panel {
      --mat-expansion-container-background-color: var(--mat-sys-surface-container-low);
      box-shadow: none !important;
      border: 1px solid var(--mat-sys-outline-variant);
    }
    mat-panel-title {
      gap: 0.5rem;
      align-items: center;
    }
    .removed {
      list-style: none;
      margin: 0;
      padding: 0;
      li {
        display: flex;
        align-items: center;
        gap: 0.5rem;
        padding: 0.25rem 0;
        border-bottom: 1px solid var(--mat-sys-outline-variant);
      }
      li:last-child {
        border-bottom: none;
      }
    }
    .name {
      font-weight: 700;
    }
    .meta {
      flex: 1;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RemovedCells {
  readonly cells = input.required<readonly RemovedCell[]>();
  readonly editable = input(false);
  readonly restore = output<string>();

  protected icon(cell: RemovedCell): string {
    return cellKindInfo(cell.kind).icon;
  }

  protected label(cell: RemovedCell): string {
    return cellKindInfo(cell.kind).label;
  }
}
