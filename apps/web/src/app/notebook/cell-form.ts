import { DestroyRef, PendingTasks, type Signal, computed, effect, inject, untracked } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type { FormGroup } from '@angular/forms';
import type { DraftCell } from '@laminote/contracts';
import { sameJson } from '@laminote/contracts/values';
import { DraftSession } from '../shared/draft-session';
import { type RuntimeChecks, loadRuntimeChecksWhenIdle, runtimeChecks } from '../shared/runtime-checks';

const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * A number field's text as the person typed it, read as a number where it is one. Spaces and
 * underscores group digits (`6 000 000`), a lone decimal comma reads as a point (`0,78`). Text that is
 * not a number is kept as typed, so nothing is lost and the schema names the field as wrong.
 */
export function parseNumberText(text: string): number | string | null {
  let compact = text.trim().replace(/[\s_\u202f\u00a0]/g, '');
  if (compact === '') return null;
  if (/^[+-]?\d*,\d+(?:[eE][+-]?\d+)?$/.test(compact)) compact = compact.replace(',', '.');
  return PLAIN_NUMBER.test(compact) ? Number(compact) : text;
}

/** How a stored number reads back in its field: large and small ones in exponent form (6e6, 7e-4). */
export function numberText(value: unknown): string {
  if (typeof value === 'string') return value;
  if (typeof value !== 'number' || !Number.isFinite(value)) return '';
  const magnitude = Math.abs(value);
  if (magnitude !== 0 && (magnitude >= 1e6 || magnitude < 1e-3)) {
    return Number(value.toPrecision(12)).toExponential().replace('e+', 'e');
  }
  return String(Number(value.toPrecision(12)));
}

/** A number field's value for the inputs: the number, the text when it is no number, or left out when empty. */
export function numberInput(text: string | null | undefined): number | string | undefined {
  const parsed = parseNumberText(text ?? '');
  return parsed === null ? undefined : parsed;
}

/** A schema message said on its field: "mach must be below 1" on the Mach field reads "Must be below 1". */
export function fieldMessage(field: string, message: string): string {
  const prefix = `${field} `;
  const text = message.startsWith(prefix) ? message.slice(prefix.length) : message;
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/**
 * The problems of a cell's inputs as they stand: the kind's schema here (once the schemas are loaded,
 * `runtime-checks.ts`), and what the server reported.
 */
export function cellProblems(cell: DraftCell, checks: RuntimeChecks | null): Map<string, string> {
  const problems = new Map<string, string>();
  const parsed = checks?.CELL_INPUT_SCHEMAS[cell.kind].safeParse(cell.inputs);
  if (parsed && !parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = issue.path.map(String).join('.') || 'inputs';
      if (!problems.has(field)) problems.set(field, fieldMessage(String(issue.path[0] ?? ''), issue.message));
    }
  }
  for (const problem of cell.problems) {
    if (!problems.has(problem.field)) problems.set(problem.field, fieldMessage(problem.field.split('.').pop() ?? '', problem.message));
  }
  return problems;
}

export interface CellFormOptions<V> {
  readonly form: FormGroup;
  readonly cell: Signal<DraftCell>;
  /** The form's value for a cell's inputs. */
  readonly toForm: (inputs: Record<string, unknown>) => V;
  /** The inputs for the form's value; `previous` keeps what the form does not show. */
  readonly fromForm: (value: V, previous: Record<string, unknown>) => Record<string, unknown>;
  /** Which control shows the problem of an input field (default: the control of the same name). */
  readonly controlOf?: (field: string) => string | null;
  /** Whether the cell's own checks of what is typed (beyond the schema) have loaded; the form waits for them. */
  readonly ready?: Signal<boolean>;
}

/**
 * Ties a cell's form to the draft: typing updates the cell's inputs (and so the autosave), a change that
 * comes from elsewhere (the other side of a conflict) updates the form, problems land on their fields,
 * and the form is read-only for people who may not edit, and for everyone until the schemas that check
 * it have loaded (so nothing typed looks valid before it has been checked). Call in an injection context.
 */
export function bindCellForm<V>(options: CellFormOptions<V>): { readonly problems: Signal<Map<string, string>> } {
  const session = inject(DraftSession);
  const { form, cell, toForm, fromForm } = options;
  // Unit tests and server-side stability wait for the schemas like any other pending work.
  inject(PendingTasks).run(() => loadRuntimeChecksWhenIdle());
  let shown: Record<string, unknown> | null = null;

  effect(() => {
    const inputs = cell().inputs;
    if (shown !== null && sameJson(shown, inputs)) return;
    shown = inputs;
    untracked(() => form.patchValue(toForm(inputs) as Record<string, unknown>, { emitEvent: false }));
  });

  form.valueChanges.pipe(takeUntilDestroyed(inject(DestroyRef))).subscribe(() => {
    const current = untracked(cell);
    const inputs = fromForm(form.getRawValue() as V, current.inputs);
    shown = inputs;
    session.setInputs(current.cellId, inputs);
  });

  effect(() => {
    if (session.editable() && runtimeChecks() && (options.ready?.() ?? true)) form.enable({ emitEvent: false });
    else form.disable({ emitEvent: false });
  });

  const problems = computed(() => cellProblems(cell(), runtimeChecks()));
  effect(() => {
    const byControl = new Map<string, string>();
    for (const [field, message] of problems()) {
      const control = options.controlOf ? options.controlOf(field) : field.split('.')[0];
      if (control && !byControl.has(control)) byControl.set(control, message);
    }
    untracked(() => {
      for (const [name, control] of Object.entries(form.controls)) {
        const message = byControl.get(name);
        if (message) {
          control.setErrors({ problem: message });
          control.markAsTouched();
        } else if (control.hasError('problem')) {
          control.setErrors(null);
        }
      }
    });
  });
  return { problems };
}
