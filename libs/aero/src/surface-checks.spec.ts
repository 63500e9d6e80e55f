import { describe, expect, it } from 'vitest';
import { oneSurfaceWarnings, type SurfacePoint } from './surface-checks';

function points(x: number[], cp: number[]): SurfacePoint[] {
  return x.map((xi, i) => ({ x: xi, cp: cp[i]!, line: i + 2 }));
}

describe('oneSurfaceWarnings', () => {
  it('says a loop running 1 → 0 → 1 is a closed loop, not one surface', () => {
    const x = [1, 0.75, 0.5, 0.25, 0.05, 0, 0.05, 0.25, 0.5, 0.75, 1];
    const cp = [0.2, -0.1, -0.3, -0.5, -0.2, 1, -0.2, -0.5, -0.3, -0.1, 0.2];
    expect(oneSurfaceWarnings(points(x, cp))).toEqual([
      'x/c runs 1.000 → 0.000 (line 7) → 1.000: this looks like a closed loop over both surfaces, not one surface; choose “Closed loop” so it is split at the stagnation point',
    ]);
  });

  it('says a surface whose first Cp is 0.80 does not start at a stagnation point', () => {
    // Stagnation Cp is 1 at M = 0 and above 1 at any Mach number (isentropic relation; common knowledge).
    const w = oneSurfaceWarnings(points([0.01, 0.1, 0.5, 1], [0.8, -0.4, -0.3, 0.1]));
    expect(w).toHaveLength(1);
    expect(w[0]).toMatch(/^the surface does not start at a stagnation point: the first Cp \(line 2\) is 0\.80/);
  });

  it('has nothing to say about a surface from its attachment line to the trailing edge', () => {
    expect(oneSurfaceWarnings(points([0, 0.01, 0.1, 0.5, 1], [1, 0.2, -0.4, -0.3, 0.1]))).toEqual([]);
  });
});
