/**
 * The shape of a validation case: one published (or exact) reference value, the engine's value for the
 * same quantity, and the tolerance the engine is held to. The engine's tests and the product's
 * validation page both read the one list in `./index.ts`, so they cannot disagree.
 */

/** How far the engine's value may lie from the reference. */
export type Tolerance =
  /** |value / reference − 1| < value */
  | { kind: 'relative'; value: number }
  /** |value − reference| < value */
  | { kind: 'absolute'; value: number };

export interface ValidationCase {
  /** Stable id, unique across all suites, e.g. `blasius.theta.x0.5`. */
  id: string;
  /** What is compared, in the words of the trade. */
  title: string;
  /** The quantity and its symbol with units, e.g. `θ √Re_x / x (–)`. */
  quantity: string;
  tolerance: Tolerance;
  /** Where the reference value comes from: author, title, year, table or equation; "from memory" when it is. */
  source: string;
  /** The engine's value and the reference for it (a reference may itself be computed, e.g. by shooting). */
  measure(): { value: number; reference: number };
}

export interface ValidationSuite {
  /** Stable id, e.g. `blasius`. */
  id: string;
  title: string;
  /** Ids of the methods (see `../methods`) this suite checks. */
  methods: readonly string[];
  /** One sentence: what the reference is and why the tolerance is what it is. */
  summary: string;
  /** The cases; built when asked for, as some of them run the engine. */
  cases(): ValidationCase[];
}

export interface ValidationCaseResult {
  id: string;
  title: string;
  quantity: string;
  source: string;
  tolerance: Tolerance;
  reference: number;
  value: number;
  /** The error in the tolerance's own kind (relative or absolute). */
  error: number;
  pass: boolean;
}

export interface ValidationSuiteResult {
  id: string;
  title: string;
  methods: readonly string[];
  summary: string;
  cases: ValidationCaseResult[];
}

/** The error of `value` against `reference` in the tolerance's kind, and whether it is inside it. */
export function judge(value: number, reference: number, tolerance: Tolerance): { error: number; pass: boolean } {
  const error = tolerance.kind === 'relative' ? value / reference - 1 : value - reference;
  return { error, pass: Number.isFinite(error) && Math.abs(error) < tolerance.value };
}

export function runCase(c: ValidationCase): ValidationCaseResult {
  const { value, reference } = c.measure();
  return { id: c.id, title: c.title, quantity: c.quantity, source: c.source, tolerance: c.tolerance, reference, value, ...judge(value, reference, c.tolerance) };
}

export function runSuite(suite: ValidationSuite): ValidationSuiteResult {
  return { id: suite.id, title: suite.title, methods: suite.methods, summary: suite.summary, cases: suite.cases().map(runCase) };
}

/** Tolerance matching vitest's `toBeCloseTo(x, digits)`: |value − x| < 10^−digits / 2. */
export function digits(count: number): Tolerance {
  return { kind: 'absolute', value: Math.pow(10, -count) / 2 };
}

export function relativeWithin(value: number): Tolerance {
  return { kind: 'relative', value };
}

/** Runs `compute` once, the first time it is needed. */
export function once<T>(compute: () => T): () => T {
  let done = false;
  let value: T;
  return () => {
    if (!done) {
      value = compute();
      done = true;
    }
    return value;
  };
}
