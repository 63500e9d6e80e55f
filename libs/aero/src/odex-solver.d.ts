/**
 * Types of the part of odex (E. Hairer & G. Wanner's ODEX, ported by C. Smith, BSD-2-Clause) that the
 * engine uses. See odex-solver.js for why the package is not imported directly from TypeScript.
 */
export type Derivative = (x: number, y: number[]) => number[];

/** Called after every accepted step; return false to stop. `dense(i, x)` interpolates component i. */
export type OutputFunction = (
  step: number,
  xOld: number,
  x: number,
  y: number[],
  dense: ((component: number, x: number) => number) | false | undefined,
) => boolean | void;

export interface SolverResult {
  y: number[];
  outcome: number;
  nStep: number;
  xEnd: number;
  nAccept: number;
  nReject: number;
  nEval: number;
}

export declare class Solver {
  constructor(n: number);
  n: number;
  maxSteps: number;
  initialStepSize: number;
  maxStepSize: number;
  denseOutput: boolean;
  denseComponents: number[] | undefined;
  relativeTolerance: number | number[];
  absoluteTolerance: number | number[];
  solve(f: Derivative, x: number, y0: number[], xEnd: number, solOut?: OutputFunction): SolverResult;
}
