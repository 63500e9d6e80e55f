import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatBottomSheetRef } from '@angular/material/bottom-sheet';
import { inject } from '@angular/core';

/** A keyboard shortcut of the notebook page. `mod` is Ctrl, or ⌘ on a Mac. */
export interface Shortcut {
  readonly keys: readonly string[];
  readonly does: string;
}

/**
 * The shortcuts, chosen to stay clear of the browser's and the screen readers' own: Ctrl/⌘ + Enter is
 * free in text fields, Alt + Shift + arrows is not a browser or text-editing command.
 */
export const SHORTCUTS: readonly Shortcut[] = [
  { keys: ['Ctrl/⌘', 'Enter'], does: 'Run the cell you are in' },
  { keys: ['Ctrl/⌘', 'Shift', 'Enter'], does: 'Run the whole study, in dependency order' },
  { keys: ['Alt', 'Enter'], does: 'Add a cell below the one you are in' },
  { keys: ['Alt', 'Shift', '↑'], does: 'Move the cell up' },
  { keys: ['Alt', 'Shift', '↓'], does: 'Move the cell down' },
  { keys: ['Alt', '↑'], does: 'Go to the cell above' },
  { keys: ['Alt', '↓'], does: 'Go to the cell below' },
  { keys: ['Ctrl/⌘', 'S'], does: 'Save the draft now (it also saves by itself)' },
  { keys: ['?'], does: 'Show this list (outside text fields)' },
];

/** The list of shortcuts, opened with `?`. */
@Component({
  selector: 'lam-shortcuts',
  imports: [MatButtonModule],
  template: `
    <h2 class="heading">Keyboard shortcuts</h2>
    <table class="shortcuts">
      <tbody>
        @for (shortcut of shortcuts; track shortcut.does) {
          <tr>
            <td class="keys">
              @for (key of shortcut.keys; track key; let last = $last) {
                <kbd>{{ key }}</kbd>
                @if (!last) {
                  <span aria-hidden="true">+</span>
                }
              }
            </td>
            <td>{{ shortcut.does }}</td>
          </tr>
        }
      </tbody>
    </table>
    <div class="actions">
      <button mat-button type="button" (click)="close()">Close</button>
    </div>
  `,
  styles: `
    .heading {
      font: var(--mat-sys-title-medium);
      margin: 0.5rem 0 0.75rem;
    }
    .shortcuts {
      border-collapse: collapse;
      width: 100%;
    }
    td {
      padding: 0.3rem 0.75rem 0.3rem 0;
      vertical-align: middle;
    }
    .keys {
      white-space: nowrap;
      width: 1%;
    }
    kbd {
      display: inline-block;
      min-width: 1.25rem;
      padding: 0.05rem 0.4rem;
      margin: 0 0.15rem;
      border: 1px solid var(--mat-sys-outline);
      border-bottom-width: 2px;
      border-radius: 4px;
      font-family: var(--lam-mono);
      font-size: 0.8rem;
      text-align: center;
    }
    .actions {
      display: flex;
      justify-content: flex-end;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Shortcuts {
  private readonly ref = inject(MatBottomSheetRef<Shortcuts>);
  protected readonly shortcuts = SHORTCUTS;

  protected close(): void {
    this.ref.dismiss();
  }
}
