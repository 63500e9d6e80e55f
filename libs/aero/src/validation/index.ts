import { runSuite, type ValidationSuite, type ValidationSuiteResult } from './case';
import { isa } from './atmosphere';
import { poll } from './attachment-line';
import { flatPlateEstimates } from './flat-plate';
import { blasius, cylinder, falknerSkanSuite, howarth, mangler, thwaitesTable } from './laminar';
import { flatPlateTransition, mack } from './transition';
import { turbulentPlateSuite } from './turbulent';

export * from './case';

/**
 * Every reference case of the engine, in the order the validation page shows them. The engine's tests
 * (validation.spec.ts) and the server's validation page both run this list. A module that adds a method
 * adds its suite here, one entry.
 */
export const VALIDATION_SUITES: readonly ValidationSuite[] = [
  thwaitesTable,
  blasius,
  falknerSkanSuite,
  howarth,
  cylinder,
  mangler,
  flatPlateTransition,
  mack,
  turbulentPlateSuite,
  flatPlateEstimates,
  isa,
  poll,
];

/** Runs every suite (about a second on one core). */
export function runValidation(suites: readonly ValidationSuite[] = VALIDATION_SUITES): ValidationSuiteResult[] {
  return suites.map(runSuite);
}
