import { loadRuntimeChecks } from '../shared/runtime-checks';

/**
 * The notebook's code, fetched all at once when the app starts on a study's address: the page, the
 * body of every cell kind (each a deferred block in the page) and the schemas its forms check with.
 * Without it they come in rounds: the page after the sign-in check, the bodies after the draft.
 */
export function prefetchNotebook(): void {
  const loads: (() => Promise<unknown>)[] = [
    () => import('./notebook-page'),
    () => import('./flow/flow-cell'),
    () => import('./pressure/pressure-cell'),
    () => import('./section/section-cell'),
    () => import('./body/body-cell'),
    () => import('./analysis/analysis-cell'),
    () => import('./polar/polar-cell'),
    () => import('./flat-plate/flat-plate-cell'),
    () => import('./leading-edge/leading-edge-cell'),
    () => import('./sweep/sweep-cell'),
    () => import('./comparison/comparison-cell'),
    () => import('./note/note-cell'),
    loadRuntimeChecks,
  ];
  // A failed fetch here is tried again where the code is needed.
  for (const load of loads) void load().catch(() => undefined);
}
