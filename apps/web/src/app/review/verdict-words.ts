import type { ReviewState, VerdictKind, VersionReview } from '@laminote/contracts';

/**
 * Laminote's words for a design review: a reviewer clears a version for the next step or sends it back
 * for rework, and a version is sent for review to named reviewers. The stored values (`approved`,
 * `changes_requested`) stay as the API names them; only these words are shown.
 */
export interface VerdictWords {
  /** On a verdict and on a version's badge. */
  readonly label: string;
  /** After a name or a version: "v2 cleared", "Version 2 was sent back for rework". */
  readonly past: string;
  /** The reviewer's choice in the verdict form. */
  readonly action: string;
  readonly icon: string;
}

export const VERDICT_WORDS: Record<VerdictKind, VerdictWords> = {
  approved: { label: 'Cleared', past: 'cleared', action: 'Clear this version', icon: 'task_alt' },
  changes_requested: { label: 'Rework needed', past: 'sent back for rework', action: 'Send back for rework', icon: 'build' },
};

export const REVIEW_STATE_WORDS: Record<ReviewState, { readonly label: string; readonly icon: string }> = {
  none: { label: 'Not reviewed', icon: 'radio_button_unchecked' },
  requested: { label: 'Awaiting review', icon: 'hourglass_top' },
  approved: { label: VERDICT_WORDS.approved.label, icon: VERDICT_WORDS.approved.icon },
  changes_requested: { label: VERDICT_WORDS.changes_requested.label, icon: VERDICT_WORDS.changes_requested.icon },
};

/** The history's review states (the versions API spells the second verdict in camel case). */
export const HISTORY_REVIEW_WORDS: Record<VersionReview['state'], { readonly label: string; readonly icon: string }> = {
  requested: REVIEW_STATE_WORDS.requested,
  approved: REVIEW_STATE_WORDS.approved,
  changesRequested: REVIEW_STATE_WORDS.changes_requested,
};

/** Past-tense words of a review state with a verdict, for "v1 cleared · not this version". */
export function verdictPast(state: ReviewState): string {
  return state === 'approved' || state === 'changes_requested' ? VERDICT_WORDS[state].past : REVIEW_STATE_WORDS[state].label.toLowerCase();
}
