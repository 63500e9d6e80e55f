import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { Problem } from '@laminote/contracts';
import { problemMessage } from '../core/problem';
import type { SaveStatus } from '../shared/draft-session';

const TEXT: Record<SaveStatus, { label: string; icon: string }> = {
  saved: { label: 'All edits saved', icon: 'cloud_done' },
  pending: { label: 'Edits waiting to save', icon: 'edit_note' },
  saving: { label: 'Saving…', icon: 'cloud_sync' },
  offline: { label: 'Offline: edits kept here, retrying', icon: 'cloud_off' },
  failed: { label: 'Not saved', icon: 'error' },
  conflict: { label: 'Someone else saved: choose what to keep', icon: 'call_split' },
};

/** A quiet line that says whether the draft is safe on the server. */
@Component({
  selector: 'lam-save-indicator',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule],
  template: `
    <span class="status" role="status" aria-live="polite" [matTooltip]="detail() ?? ''" [matTooltipDisabled]="!detail()">
      <mat-icon aria-hidden="true">{{ text().icon }}</mat-icon>
      <span class="label">{{ text().label }}</span>
    </span>
    @if (status() === 'failed' || status() === 'offline') {
      <button mat-button type="button" (click)="retry.emit()">Retry now</button>
    }
    @if (status() === 'conflict') {
      <button mat-flat-button type="button" (click)="resolve.emit()">Choose…</button>
    }
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 0.25rem;
      font: var(--mat-sys-label-medium);
      color: var(--mat-sys-on-surface-variant);
    }
    :host(.lam-save-alert) {
      color: var(--mat-sys-error);
    }
    .status {
      display: inline-flex;
      align-items: center;
      gap: 0.25rem;
    }
    mat-icon {
      width: 18px;
      height: 18px;
      font-size: 18px;
    }
  `,
  host: { '[class.lam-save-alert]': 'alert()' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SaveIndicator {
  readonly status = input.required<SaveStatus>();
  readonly problem = input<Problem | null>(null);
  readonly retry = output<void>();
  readonly resolve = output<void>();

  protected readonly text = computed(() => {
    const base = TEXT[this.status()];
    const problem = this.problem();
    return this.status() === 'failed' && problem ? { ...base, label: `Not saved: ${problem.title}` } : base;
  });
  protected readonly detail = computed(() => {
    const problem = this.problem();
    return this.status() === 'failed' && problem ? problemMessage(problem) : null;
  });
  protected readonly alert = computed(() => ['failed', 'offline', 'conflict'].includes(this.status()));
}
