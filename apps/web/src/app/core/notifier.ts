import { Injectable, inject } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import { MatSnackBar } from '@angular/material/snack-bar';
import { applyProblemToControls, problemMessage, toProblem } from './problem';

/** Short, non-blocking messages at the bottom of the page. */
@Injectable({ providedIn: 'root' })
export class Notifier {
  private readonly snackBar = inject(MatSnackBar);

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
    this.snackBar.open(message, undefined, { duration: 4000 });
  }

  private showProblem(message: string): void {
    this.snackBar.open(message, 'Dismiss', { duration: 8000, politeness: 'assertive' });
  }
}
