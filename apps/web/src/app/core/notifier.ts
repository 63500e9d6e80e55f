import { Injectable, Injector, PendingTasks, inject } from '@angular/core';
import { LiveAnnouncer } from '@angular/cdk/a11y';
import type { AbstractControl } from '@angular/forms';
import type { MatSnackBarConfig } from '@angular/material/snack-bar';
import { lazyModule } from '../shared/lazy-module';
import { applyProblemToControls, problemMessage, toProblem } from './problem';

/** Material's snackbar, fetched once the first screen is drawn (or at the first message, if sooner). */
const snackBarCode = lazyModule(() => import('@angular/material/snack-bar'));

/** Short, non-blocking messages at the bottom of the page. */
@Injectable({ providedIn: 'root' })
export class Notifier {
  private readonly injector = inject(Injector);
  private readonly pendingTasks = inject(PendingTasks);
  private readonly announcer = inject(LiveAnnouncer);

  constructor() {
    void snackBarCode.loadWhenIdle().catch(() => undefined);
  }

  /** Reports a failed request: the problem's title and detail. */
  problem(error: unknown): void {
    this.showProblem(problemMessage(toProblem(error)));
  }

  /**
   * Reports a failed form submission: messages that name a field go on that field, and the snackbar
   * carries only what no field could show.
   */
  formProblem(error: unknown, controls: Readonly<Record<string, AbstractControl>>): void {
    const unplaced = applyProblemToControls(toProblem(error), controls);
    if (unplaced.length > 0) this.showProblem(unplaced.join('; '));
  }

  done(message: string): void {
    this.show(message, undefined, { duration: 4000 });
  }

  private showProblem(message: string): void {
    this.show(message, 'Dismiss', { duration: 8000, politeness: 'assertive' });
  }

  /** The message in the snackbar; if its code cannot be fetched (offline), read out instead. */
  private show(message: string, action: string | undefined, config: MatSnackBarConfig): void {
    const done = this.pendingTasks.add();
    snackBarCode
      .load()
      .then(
        ({ MatSnackBar }) => void this.injector.get(MatSnackBar).open(message, action, config),
        () => void this.announcer.announce(message, config.politeness ?? 'polite'),
      )
      .finally(done);
  }
}
