import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { ReviewSummary } from '@laminote/contracts';
import { REVIEW_STATE_WORDS, verdictPast } from './verdict-words';

/**
 * A version's review state as a tag; for a version with no verdict of its own, also the nearest
 * earlier version's verdict, said to apply to that older version.
 */
@Component({
  selector: 'lam-review-state',
  imports: [MatIconModule],
  template: `
    <span class="state" [attr.data-state]="summary().state">
      <mat-icon aria-hidden="true">{{ words[summary().state].icon }}</mat-icon>{{ words[summary().state].label }}
      @if (summary().pendingReviewers.length && summary().state !== 'requested') {
        <span class="pending">· {{ summary().pendingReviewers.length }} pending</span>
      }
    </span>
    @if (earlier(); as e) {
      <span class="earlier" [attr.data-state]="e.state">
        <span [attr.title]="'The verdict was given on version ' + e.versionNumber + ', an older version; this one has none yet'">v{{ e.versionNumber }}{{ e.branchName !== branchName() ? ' (' + e.branchName + ')' : '' }} {{ past(e.state) }} · not this version</span>
      </span>
    }
  `,
  styles: `
    :host { display: inline-flex; align-items: center; flex-wrap: wrap; gap: 0.25rem 0.5rem; font-size: 0.8rem; }
    .state, .earlier { display: inline-flex; align-items: center; gap: 0.25rem; padding: 0.05rem 0.5rem; border-radius: 999px; border: 1px solid var(--mat-sys-outline-variant); }
    .state mat-icon { font-size: 15px; width: 15px; height: 15px; }
    [data-state='approved'] { color: #3f4a12; border-color: #6f7d2c; background: #f3f5e6; }
    [data-state='changes_requested'] { color: #6e3510; border-color: var(--lam-copper, #b5652f); background: #fbf0e7; }
    [data-state='requested'] { color: var(--mat-sys-primary); border-color: var(--mat-sys-primary); border-style: dotted; }
    .earlier { border-style: dashed; background: none; }
    .pending { color: var(--mat-sys-on-surface-variant); }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReviewStateTag {
  readonly summary = input.required<ReviewSummary>();
  /** The branch the version is on, to name another branch only when the earlier verdict is there. */
  readonly branchName = input<string | null>(null);

  protected readonly words = REVIEW_STATE_WORDS;
  protected readonly past = verdictPast;
  protected readonly earlier = computed(() => (this.summary().state === 'approved' || this.summary().state === 'changes_requested' ? null : this.summary().earlierVerdict));
}
