import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { Job } from '@laminote/contracts';

/**
 * The study's run under way: one bar for the whole job, the part that takes longest named in words
 * ("sweep: 370 of 1,000 cases"), and a way to stop it. Shown above the cells while a job is active.
 */
@Component({
  selector: 'lam-run-progress',
  imports: [DecimalPipe, MatButtonModule, MatIconModule, MatProgressBarModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="run-progress" role="status" aria-live="polite" [attr.aria-label]="label()">
      <div class="line">
        <mat-icon aria-hidden="true">pending</mat-icon>
        <span class="what">{{ job().state === 'queued' ? 'Waiting for a worker' : 'Running' }}</span>
        <span class="detail">{{ detail() }}</span>
        <span class="count">{{ job().done | number }} of {{ job().total | number }}</span>
        @if (mayCancel()) {
          <button mat-stroked-button type="button" class="cancel-run" (click)="cancel.emit(job().jobId)" [disabled]="cancelling()">
            <mat-icon aria-hidden="true">stop_circle</mat-icon>
            {{ cancelling() ? 'Stopping …' : 'Stop run' }}
          </button>
        }
      </div>
      <mat-progress-bar [mode]="job().state === 'queued' ? 'query' : 'determinate'" [value]="percent()" [attr.aria-label]="label()" />
    </section>
  `,
  styles: `
    .run-progress { margin: 0 0 16px; padding: 10px 14px 12px; border: 1px solid var(--mat-sys-outline-variant); border-radius: 10px; background: var(--mat-sys-surface-container-low); }
    .line { display: flex; align-items: center; gap: 10px; margin-bottom: 8px; flex-wrap: wrap; }
    .what { font-weight: 700; }
    .detail { color: var(--mat-sys-on-surface-variant); flex: 1; min-width: 12ch; }
    .count { font-family: 'JetBrains Mono', monospace; font-variant-numeric: tabular-nums; }
    mat-icon { color: var(--mat-sys-primary); }
  `,
})
export class RunProgress {
  readonly job = input.required<Job>();
  /** Labels of the cells by id, to name what is running. */
  readonly titles = input<ReadonlyMap<string, string>>(new Map());
  readonly mayCancel = input(false);
  readonly cancelling = input(false);
  readonly cancel = output<string>();

  protected readonly percent = computed(() => (this.job().total > 0 ? (100 * this.job().done) / this.job().total : 0));
  protected readonly detail = computed(() => {
    const job = this.job();
    const open = job.cells.filter((c) => c.done < c.total);
    const big = [...open].sort((a, b) => b.total - a.total)[0];
    if (!big) return 'putting the results together';
    const name = this.titles().get(big.cellId) || 'sweep';
    if (big.total > 1) return `${name}: ${big.done.toLocaleString('en')} of ${big.total.toLocaleString('en')} cases`;
    return `${open.length} ${open.length === 1 ? 'cell' : 'cells'} to go`;
  });
  protected readonly label = computed(() => `Run ${Math.round(this.percent())} % done: ${this.detail()}`);
}
