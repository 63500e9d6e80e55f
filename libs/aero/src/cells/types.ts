import type { CellInputs, CellKind } from '@laminote/contracts';
import { fail } from './errors';

/**
 * A cell as a computation sees it: its kind, its inputs validated by its kind's schema (defaults
 * applied), and the cells its reference fields name, by field, each the same way. A cell's result
 * depends on nothing else, so the worker threads, the job workers and the command line compute alike.
 */
export interface CellSource<K extends CellKind = CellKind> {
  readonly kind: K;
  readonly inputs: CellInputs[K];
  readonly upstream: Upstream;
}

/** The cells a cell names, by its reference field (`flowCellId`, …); null where it names none. */
export type Upstream = Readonly<Record<string, CellSource | null | undefined>>;

/** The cell a reference field names, which must be of `kind`. */
export function upstreamOf<K extends CellKind>(upstream: Upstream, field: string, kind: K): CellSource<K> {
  const source = upstream[field];
  if (!source) return fail(field, `${field} names no cell`);
  if (source.kind !== kind) return fail(field, `${field} names a ${source.kind} cell, not a ${kind} cell`);
  return source as CellSource<K>;
}

/** Like upstreamOf, for a reference the cell may leave empty. */
export function optionalUpstreamOf<K extends CellKind>(upstream: Upstream, field: string, kind: K): CellSource<K> | null {
  return upstream[field] ? upstreamOf(upstream, field, kind) : null;
}
