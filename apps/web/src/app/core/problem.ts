import { HttpErrorResponse } from '@angular/common/http';
import type { AbstractControl } from '@angular/forms';
import type { Problem } from '@laminote/contracts';
import { readableMessage } from '@laminote/contracts/field-words';

function isProblem(body: unknown): body is Problem {
  return (
    typeof body === 'object' &&
    body !== null &&
    typeof (body as Problem).title === 'string' &&
    typeof (body as Problem).status === 'number'
  );
}

/** Turns whatever an API call failed with into a Problem the user can be shown. */
export function toProblem(error: unknown): Problem {
  if (error instanceof HttpErrorResponse) {
    if (isProblem(error.error)) return error.error;
    if (error.status === 0) {
      return {
        type: 'about:blank',
        title: 'The Laminote server could not be reached',
        status: 0,
        detail: 'Check the connection and try again.',
      };
    }
    return { type: 'about:blank', title: error.statusText || 'The request failed', status: error.status };
  }
  if (isProblem(error)) return error;
  return {
    type: 'about:blank',
    title: 'Something went wrong',
    status: 0,
    detail: error instanceof Error ? error.message : undefined,
  };
}

/** One line for a snackbar: the title, then the detail when there is one. */
export function problemMessage(problem: Problem): string {
  // The API names fields by their paths for scripts; a person reads their labels.
  return problem.detail ? `${problem.title}: ${readableMessage(problem.detail, null, false)}` : problem.title;
}

/** The messages a problem carries for named fields, from `errors[]` and from `field` with its detail. */
export function fieldMessages(problem: Problem): Map<string, string> {
  const messages = new Map<string, string>();
  for (const { field, message } of problem.errors ?? []) {
    if (!messages.has(field)) messages.set(field, message);
  }
  if (problem.field && !messages.has(problem.field)) {
    messages.set(problem.field, problem.detail ?? problem.title);
  }
  return messages;
}

/**
 * Puts a problem's field messages on the matching form controls as a `server` error, so the form field
 * shows it where the user typed. Answers the messages that named no control, for the caller to show
 * elsewhere (a snackbar); an empty list means everything landed on a field.
 */
export function applyProblemToControls(
  problem: Problem,
  controls: Readonly<Record<string, AbstractControl>>,
): string[] {
  const unplaced: string[] = [];
  const messages = fieldMessages(problem);
  for (const [field, message] of messages) {
    const control = controls[field];
    if (control) {
      control.setErrors({ ...control.errors, server: message });
      control.markAsTouched();
    } else {
      unplaced.push(`${field}: ${message}`);
    }
  }
  if (messages.size === 0) unplaced.push(problemMessage(problem));
  return unplaced;
}
