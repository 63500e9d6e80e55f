import { HISTORY_REVIEW_WORDS } from '../review/verdict-words';

/** How a version's review state reads in the history and on the version page. */
export const REVIEW_LABELS = HISTORY_REVIEW_WORDS;
