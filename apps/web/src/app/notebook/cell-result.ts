import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { CellOutput, DraftCell } from '@laminote/contracts';
import { DraftSession } from '../shared/draft-session';
import { NotebookApi } from '../shared/notebook-api';
import { MethodLinks } from './method-links';

/** The output a cell shows: the newest good one, and whether it still matches the inputs. */
export interface ShownResult {
  readonly output: CellOutput;
  /** The inputs (or something upstream) changed since, or the newest run failed. */
  readonly stale: boolean;
}

export function shownResult(cell: DraftCell): ShownResult | null {
  const output = cell.output?.status === 'ok' ? cell.output : cell.lastGoodOutput?.status === 'ok' ? cell.lastGoodOutput : null;
  if (!output) return null;
  return { output, stale: cell.runState !== 'current' || output !== cell.output };
}

/**
 * The frame around a cell's result: when and how it was computed, a clear mark when it no longer
 * matches the inputs, the export links, and under it the methods its numbers come from. The kind's own
 * tables and plots are projected inside.
 */
@Component({
  selector: 'lam-cell-result',
  imports: [DatePipe, DecimalPipe, MatButtonModule, MatIconModule, MethodLinks],
  template: `
    @if (shown(); as shown) {
      <section class="result" [class.stale]="shown.stale" [attr.aria-label]="'Result of ' + (cell().title || 'the cell')">
        <div class="result-bar">
          @if (shown.stale) {
            <span class="stale-tag"><mat-icon aria-hidden="true">update</mat-icon>Needs a rerun: computed from earlier inputs</span>
          }
          <span class="computed">
            Computed <time class="lam-mono" [attr.datetime]="shown.output.computedAt">{{ shown.output.computedAt | date: 'yyyy-MM-dd HH:mm' }}</time>
            @if (shown.output.durationMs < 1) {
              in under <span class="lam-mono">1 ms</span> · engine
            } @else {
              in <span class="lam-mono">{{ shown.output.durationMs | number: '1.0-0' }} ms</span> · engine
            }
            <span class="lam-mono">{{ shown.output.engineVersion }}</span>
          </span>
          <span class="spacer"></span>
          @if (exportable() && branchId(); as branchId) {
            <a mat-button [href]="exportUrl(branchId, 'csv')" download [attr.aria-label]="'Export ' + (cell().title || 'result') + ' as CSV'">
              <mat-icon aria-hidden="true">download</mat-icon>CSV
            </a>
            <a mat-button [href]="exportUrl(branchId, 'json')" download [attr.aria-label]="'Export ' + (cell().title || 'result') + ' as JSON'">
              <mat-icon aria-hidden="true">data_object</mat-icon>JSON
            </a>
          }
        </div>
        <ng-content />
        <lam-method-links [kind]="cell().kind" [output]="shown.output" />
      </section>
    }
  `,
  styles: `
    .result {
      margin-top: 1rem;
      padding-top: 0.5rem;
      border-top: 1px solid var(--mat-sys-outline-variant);
    }
    .result.stale > :not(.result-bar) {
      opacity: 0.62;
    }
    .result-bar {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 0.5rem;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
      margin-bottom: 0.5rem;
    }
    .stale-tag {
      display: inline-flex;
      align-items: center;
      gap: 0.25rem;
      padding: 0.125rem 0.5rem;
      border-radius: 4px;
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
      font: var(--mat-sys-label-medium);
      mat-icon {
        width: 16px;
        height: 16px;
        font-size: 16px;
      }
    }
    .spacer {
      flex: 1;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CellResult {
  private readonly api = inject(NotebookApi);
  private readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();
  /** Whether the server exports this kind's result (and the shown output is the saved one). */
  readonly exportable = input(true);

  protected readonly shown = computed(() => shownResult(this.cell()));
  protected readonly branchId = computed(() => (this.session.draft() ? this.session.currentBranchId : null));

  protected exportUrl(branchId: string, format: 'csv' | 'json'): string {
    return this.api.exportUrl(branchId, this.cell().cellId, format);
  }
}
