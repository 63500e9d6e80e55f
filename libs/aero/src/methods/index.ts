import type { MethodEntry } from './method';
import { BOUNDARY_LAYER_METHODS } from './boundary-layer';
import { FLOW_METHODS } from './flow';
import { INVISCID_METHODS } from './inviscid';
import { TRANSITION_METHODS } from './transition';

export type { MethodEntry, MethodSymbol } from './method';
export { resultMethods } from './result-methods';

/**
 * Every method of the engine, in the order the methods page lists them. A module that adds methods
 * (crossflow, compressible layer, panel methods) adds its list here, one entry.
 */
export const METHODS: readonly MethodEntry[] = [...FLOW_METHODS, ...INVISCID_METHODS, ...BOUNDARY_LAYER_METHODS, ...TRANSITION_METHODS];

export function findMethod(id: string): MethodEntry | undefined {
  return METHODS.find((m) => m.id === id);
}
