import type { VersionReview } from '@laminote/contracts';

/** How a version's review state reads in the history. */
export const REVIEW_LABELS: Record<VersionReview['state'], { readonly label: string; readonly icon: string }> = {
  requested: { label: 'Review requested', icon: 'rate_review' },
  approved: { label: 'Approved', icon: 'verified' },
  changesRequested: { label: 'Changes requested', icon: 'report' },
};
