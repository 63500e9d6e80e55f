import { describe, expect, it } from 'vitest';
import { Odex, type DerivativeInto } from './odex';
import { Solver } from './odex-solver';

/**
 * odex.ts is the odex npm package's algorithm with cheaper plumbing; it must take the same steps and
 * give the same numbers bit for bit. The reference is the package itself (odex 2.0.4, C. Smith's port of
 * Hairer & Wanner's ODEX.F), run with the options Head's march uses; the exact solutions are the usual
 * closed forms of each equation.
 */

interface Trace {
  steps: number[][];
  dense: number[];
}

const FRACTIONS = [0.1, 0.37, 0.5, 0.81, 1];

interface Problem {
  n: number;
  f: (x: number, y: number[]) => number[];
  x0: number;
  y0: number[];
  xEnd: number;
  options: { rTol: number; aTol: number[]; h0: number };
}

function traceOfPackage({ n, f, x0, y0, xEnd, options }: Problem, stopWhen?: (x: number) => boolean): Trace & { nEval: number; nAccept: number; nReject: number; outcome: number } {
  const solver = new Solver(n);
  solver.denseOutput = true;
  solver.relativeTolerance = options.rTol;
  solver.absoluteTolerance = options.aTol;
  solver.maxSteps = 1_000_000;
  solver.initialStepSize = options.h0;
  const steps: number[][] = [];
  const dense: number[] = [];
  const result = solver.solve(f, x0, y0, xEnd, (_step, xOld, x, y, interpolate) => {
    if (!interpolate) return true;
    steps.push([xOld, x, ...y]);
    for (const fraction of FRACTIONS) for (let c = 0; c < n; c++) dense.push(interpolate(c, xOld + fraction * (x - xOld)));
    return stopWhen === undefined || !stopWhen(x);
  });
  return { steps, dense, nEval: result.nEval, nAccept: result.nAccept, nReject: result.nReject, outcome: result.outcome };
}

function traceOfPort({ n, f, x0, y0, xEnd, options }: Problem) {
  const odex = new Odex(n);
  const into: DerivativeInto = (x, y, dy) => dy.set(f(x, Array.from(y)));
  const steps: number[][] = [];
  const dense: number[] = [];
  const stats = odex.solve(into, x0, y0, xEnd, { relativeTolerance: options.rTol, absoluteTolerance: options.aTol, initialStepSize: options.h0, maxSteps: 1_000_000 }, (xOld, x, y) => {
    steps.push([xOld, x, ...y]);
    for (const fraction of FRACTIONS) for (let c = 0; c < n; c++) dense.push(odex.dense(c, xOld + fraction * (x - xOld)));
    return true;
  });
  return { steps, dense, ...stats };
}

// Test equations (E. Hairer, S. P. Nørsett & G. Wanner, "Solving Ordinary Differential Equations I",
// 2nd ed., 1993: the Arenstorf orbit is their eq. (II.0.1); the others are textbook closed forms).
const MU = 0.012277471;
const arenstorf = (_x: number, y: number[]) => {
  const mu1 = 1 - MU;
  const d1 = Math.pow((y[0] + MU) ** 2 + y[1] ** 2, 1.5);
  const d2 = Math.pow((y[0] - mu1) ** 2 + y[1] ** 2, 1.5);
  return [y[2], y[3], y[0] + 2 * y[3] - (mu1 * (y[0] + MU)) / d1 - (MU * (y[0] - mu1)) / d2, y[1] - 2 * y[2] - (mu1 * y[1]) / d1 - (MU * y[1]) / d2];
};
const ARENSTORF_PERIOD = 17.0652165601579625588917206249;
const ARENSTORF_START = [0.994, 0, 0, -2.00158510637908252240537862224];

const cases: (Problem & { name: string })[] = [
  { name: 'harmonic oscillator y″ = −y', n: 2, f: (_x: number, y: number[]) => [y[1], -y[0]], x0: 0, y0: [0, 1], xEnd: 10, options: { rTol: 1e-6, aTol: [1e-9, 1e-6], h0: 0.01 } },
  { name: 'growth y′ = y', n: 1, f: (_x: number, y: number[]) => [y[0]], x0: 0, y0: [1], xEnd: 5, options: { rTol: 1e-10, aTol: [1e-10], h0: 1e-3 } },
  { name: 'Van der Pol, ε = 1', n: 2, f: (_x: number, y: number[]) => [y[1], (1 - y[0] * y[0]) * y[1] - y[0]], x0: 0, y0: [2, 0], xEnd: 12, options: { rTol: 1e-6, aTol: [1e-6, 1e-6], h0: 0.05 } },
  { name: 'Arenstorf orbit', n: 4, f: arenstorf, x0: 0, y0: ARENSTORF_START, xEnd: ARENSTORF_PERIOD, options: { rTol: 1e-9, aTol: [1e-9, 1e-9, 1e-9, 1e-9], h0: 1e-4 } },
];

describe('odex.ts against the odex package (bit for bit)', () => {
  for (const c of cases) {
    it(`takes the same steps with the same dense output: ${c.name}`, () => {
      const reference = traceOfPackage(c);
      const port = traceOfPort(c);
      expect(reference.steps.length).toBeGreaterThan(5);
      expect(port.steps).toEqual(reference.steps);
      expect(port.dense).toEqual(reference.dense);
      expect(port.nEval).toBe(reference.nEval);
      expect(port.nAccept).toBe(reference.nAccept);
      expect(port.nReject).toBe(reference.nReject);
      expect(port.outcome).toBe('converged');
    });
  }

  it('rejects and shrinks steps the same way (Arenstorf orbit from a too large first step)', () => {
    const problem: Problem = { n: 4, f: arenstorf, x0: 0, y0: ARENSTORF_START, xEnd: ARENSTORF_PERIOD, options: { rTol: 1e-7, aTol: [1e-7, 1e-7, 1e-7, 1e-7], h0: 2 } };
    const reference = traceOfPackage(problem);
    const port = traceOfPort(problem);
    expect(reference.nReject).toBeGreaterThan(0);
    expect(port.steps).toEqual(reference.steps);
    expect(port.nReject).toBe(reference.nReject);
  });

  it('stops when the observer says so, and a reused integrator starts afresh', () => {
    const c = cases[0];
    const stop = (x: number) => x > 4;
    const reference = traceOfPackage(c, stop);
    const odex = new Odex(2);
    const into: DerivativeInto = (_x, y, dy) => {
      dy[0] = y[1];
      dy[1] = -y[0];
    };
    const run = () => {
      const steps: number[][] = [];
      const stats = odex.solve(into, c.x0, c.y0, c.xEnd, { relativeTolerance: c.options.rTol, absoluteTolerance: c.options.aTol, initialStepSize: c.options.h0 }, (xOld, x, y) => {
        steps.push([xOld, x, ...y]);
        return !stop(x);
      });
      return { steps, stats };
    };
    const first = run();
    expect(first.stats.outcome).toBe('stopped');
    expect(first.steps).toEqual(reference.steps);
    expect(run().steps).toEqual(reference.steps);
  });
});

describe('odex.ts against exact solutions', () => {
  it('y′ = y from 0 to 5 gives e^x at every step and in between (closed form)', () => {
    const odex = new Odex(1);
    let worst = 0;
    odex.solve((_x, y, dy) => (dy[0] = y[0]), 0, [1], 5, { relativeTolerance: 1e-10, absoluteTolerance: [1e-10], initialStepSize: 1e-3 }, (xOld, x, y) => {
      worst = Math.max(worst, Math.abs(y[0] / Math.exp(x) - 1));
      const mid = 0.5 * (xOld + x);
      worst = Math.max(worst, Math.abs(odex.dense(0, mid) / Math.exp(mid) - 1));
      return true;
    });
    expect(worst).toBeLessThan(1e-8);
  });

  it('returns to the start after one period of the Arenstorf orbit (Hairer, Nørsett & Wanner, eq. II.0.1)', () => {
    const odex = new Odex(4);
    const end: number[] = [];
    odex.solve((x, y, dy) => dy.set(arenstorf(x, Array.from(y))), 0, ARENSTORF_START, ARENSTORF_PERIOD, { relativeTolerance: 1e-10, absoluteTolerance: [1e-10, 1e-10, 1e-10, 1e-10], initialStepSize: 1e-4 }, (_xOld, _x, y) => {
      end.splice(0, 4, ...y);
      return true;
    });
    expect(Math.abs(end[0] - ARENSTORF_START[0])).toBeLessThan(1e-5);
    expect(Math.abs(end[1] - ARENSTORF_START[1])).toBeLessThan(1e-5);
  });
});
