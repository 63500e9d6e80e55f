import type { ComponentType } from '@angular/cdk/portal';
import { type Injector, PendingTasks } from '@angular/core';
import type { MatBottomSheetConfig, MatBottomSheetRef } from '@angular/material/bottom-sheet';
import type { MatDialogConfig, MatDialogRef } from '@angular/material/dialog';

/**
 * Dialogs and bottom sheets whose code (the component, and Material's dialog code with it) is fetched the
 * first time one is asked for: a study's first screen does without them. The page counts as busy until
 * the dialog is open, so tests and `whenStable` wait for it. A fetch that fails (offline, or a newer
 * release replaced the code) rejects; the caller says so.
 */
export async function openLazyDialog<C, D, R>(injector: Injector, load: () => Promise<ComponentType<C>>, config: MatDialogConfig<D>): Promise<MatDialogRef<C, R>> {
  const done = injector.get(PendingTasks).add();
  try {
    const [{ MatDialog }, component] = await Promise.all([import('@angular/material/dialog'), load()]);
    return injector.get(MatDialog).open<C, D, R>(component, config);
  } finally {
    done();
  }
}

/** The same for a bottom sheet. */
export async function openLazyBottomSheet<C, D, R>(
  injector: Injector,
  load: () => Promise<ComponentType<C>>,
  config: MatBottomSheetConfig<D>,
): Promise<MatBottomSheetRef<C, R>> {
  const done = injector.get(PendingTasks).add();
  try {
    const [{ MatBottomSheet }, component] = await Promise.all([import('@angular/material/bottom-sheet'), load()]);
    return injector.get(MatBottomSheet).open<C, D, R>(component, config);
  } finally {
    done();
  }
}

/** What to tell the person when a dialog's code did not load. */
export const DIALOG_NOT_LOADED = {
  type: 'about:blank',
  status: 0,
  title: 'This could not be opened',
  detail: 'Its code did not load. Check the connection, then reload the page.',
} as const;
