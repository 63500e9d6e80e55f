/**
 * The notebook's code, fetched when the app starts on a study's address: the page with the bodies of the
 * kinds a study opens with (`CELL_BODIES`), rather than after the sign-in check. The schemas its forms check with come
 * once the first screen is drawn (`loadRuntimeChecksWhenIdle`).
 */
export function prefetchNotebook(): void {
  // A failed fetch here is tried again where the code is needed.
  void import('./notebook-page').catch(() => undefined);
}
