import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { loader } from '../shared/load-state';
import { ReviewApi } from './review-api';
import { ReviewStateTag } from './review-state';

/**
 * The study header's review line: the review state of the branch's newest version, linked to that
 * version (where reviews are asked for and given); nothing while the branch has no version.
 */
@Component({
  selector: 'lam-study-review-state',
  imports: [ReviewStateTag, RouterLink],
  template: `
    @if (head(); as head) {
      <a class="review-link" [routerLink]="['/studies', studyId(), 'versions', head.summary.versionId]" [attr.aria-label]="'Review of version ' + head.summary.versionNumber">
        <span class="label">Review</span>
        <lam-review-state [summary]="head.summary" [branchName]="head.branchName" />
      </a>
    }
  `,
  styles: `
    .review-link { display: inline-flex; align-items: center; gap: 0.5rem; color: inherit; text-decoration: none; }
    .review-link:hover .label, .review-link:focus-visible .label { text-decoration: underline; }
    .label { font-size: 0.8rem; color: var(--mat-sys-on-surface-variant); }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyReviewState {
  private readonly api = inject(ReviewApi);

  readonly studyId = input.required<string>();
  readonly branchId = input.required<string>();
  /** Changes when a version is saved, so the line is asked again. */
  readonly headVersionId = input<string | null>(null);
  /** Changes when the head was sent for review from the page, so the line is asked again. */
  readonly refresh = input(0);

  private readonly load = loader(
    () => ({ studyId: this.studyId(), head: this.headVersionId(), refresh: this.refresh() }),
    ({ studyId }) => this.api.studyReview(studyId),
  );
  protected readonly head = computed(() => {
    const review = this.load.state().value;
    const branch = review?.branches.find((b) => b.branchId === this.branchId());
    return branch?.head ? { summary: branch.head, branchName: branch.branchName } : null;
  });
}
