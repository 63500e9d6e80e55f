import type { ComponentType } from '@angular/cdk/portal';
import { type Injector, PendingTasks } from '@angular/core';
import type { MatBottomSheetConfig, MatBottomSheetRef } from '@angular/material/bottom-sheet';
import type { MatDialogConfig, MatDialogRef } from '@angular/material/dialog';

/**
 * Dialogs and bottom sheets whose code (the component, and Material's dialog or bottom-sheet code with
 * it) is fetched the first time one is asked for: a study's first screen does without them. The page
 * counts as busy until the dialog is open, so tests and `whenStable` wait for it. A fetch that fails
 * (offline, or a newer release replaced the code) rejects; the caller says so (`DIALOG_NOT_LOADED`).
 */
export function openLazyDialog<C, D, R>(injector: Injector, load: () => Promise<ComponentType<C>>, config: MatDialogConfig<D>): Promise<MatDialogRef<C, R>> {
  return busyUntil(injector, async () => {
    const [{ MatDialog }, component] = await Promise.all([import('@angular/material/dialog'), load()]);
    return injector.get(MatDialog).open<C, D, R>(component, config);
  });
}

/** The same for a bottom sheet. */
export function openLazyBottomSheet<C, D, R>(
  injector: Injector,
  load: () => Promise<ComponentType<C>>,
  config: MatBottomSheetConfig<D>,
): Promise<MatBottomSheetRef<C, R>> {
  return busyUntil(injector, async () => {
    const [{ MatBottomSheet }, component] = await Promise.all([import('@angular/material/bottom-sheet'), load()]);
    return injector.get(MatBottomSheet).open<C, D, R>(component, config);
  });
}

/** What to tell the person when a dialog's code did not load. */
export const DIALOG_NOT_LOADED = {
  type: 'about:blank',
  status: 0,
  title: 'This could not be opened',
  detail: 'Its code did not load. Check the connection, then reload the page.',
} as const;

/** Runs the given work with a pending task held (Angular's PendingTasks.run gives back no result). */
async function busyUntil<T>(injector: Injector, work: () => Promise<T>): Promise<T> {
  const done = injector.get(PendingTasks).add();
  try {
    return await work();
  } finally {
    done();
  }
}
