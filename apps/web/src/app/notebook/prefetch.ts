import { loadRuntimeChecks } from '../shared/runtime-checks';
import { CELL_BODIES } from './cell-bodies';

/**
 * The notebook's code, fetched all at once when the app starts on a study's address: the page, the
 * body of every cell kind (`CELL_BODIES`) and the schemas its forms check with.
 * Without it they come in rounds: the page after the sign-in check, the bodies after the draft.
 */
export function prefetchNotebook(): void {
  const loads: (() => Promise<unknown>)[] = [() => import('./notebook-page'), ...Object.values(CELL_BODIES), loadRuntimeChecks];
  // A failed fetch here is tried again where the code is needed.
  for (const load of loads) void load().catch(() => undefined);
}
