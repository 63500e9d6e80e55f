import { findMethod } from './index';
import type { MethodEntry } from './method';
import { resultMethodIds } from './result-method-ids';

export { CRITERION_METHODS, resultMethodIds } from './result-method-ids';

/**
 * The methods a cell's computed result comes from, in the order its numbers are worked out — what the
 * notebook links under each result and the report lists per cell, so both name the same methods. Ids
 * not in the catalogue (a kind whose methods have no page yet) are left out, never shown as dead links.
 */
export function resultMethods(kind: string, result: unknown): MethodEntry[] {
  return resultMethodIds(kind, result).map((id) => findMethod(id)).filter((m): m is MethodEntry => m !== undefined);
}
