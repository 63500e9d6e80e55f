import { describe, expect, it } from 'vitest';
import { axisymmetricPanels } from './axisymmetric-panel';
import { completeEllipticIntegrals } from './elliptic-integrals';

describe('complete elliptic integrals', () => {
  it('match Abramowitz & Stegun Table 17.1 (values from memory)', () => {
    const half = completeEllipticIntegrals(0.5);
    expect(half.K).toBeCloseTo(1.8540746773, 9);
    expect(half.E).toBeCloseTo(1.3506438810, 9);
    const zero = completeEllipticIntegrals(1);
    expect(zero.K).toBeCloseTo(Math.PI / 2, 12);
    expect(zero.E).toBeCloseTo(Math.PI / 2, 12);
    // Near m = 1: K ≈ ln(4/k′) and E → 1 (A&S 17.3.26, 17.3.36).
    const near = completeEllipticIntegrals(1e-12);
    expect(near.K).toBeCloseTo(Math.log(4 / 1e-6), 6);
    expect(near.E).toBeCloseTo(1, 6);
  });
});

/** Meridian of the spheroid x²/a² + r²/b² = 1 (nose at x = −a), nodes evenly spaced in the polar angle. */
function spheroid(a: number, b: number, panels: number) {
  const x: number[] = [];
  const r: number[] = [];
  for (let k = 0; k <= panels; k++) {
    const theta = Math.PI - (Math.PI * k) / panels;
    x.push(a * Math.cos(theta));
    r.push(k === 0 || k === panels ? 0 : b * Math.sin(theta));
  }
  return { x, r };
}

describe('source-ring panels for bodies of revolution', () => {
  it('sphere: Cp = 1 − 9/4 sin²θ (exact; e.g. H. Lamb, "Hydrodynamics", 6th ed., 1932, §92), converging with panel count', () => {
    const worstError = (panels: number) => {
      const body = spheroid(1, 1, panels);
      const solution = axisymmetricPanels(body.x, body.r);
      let worst = 0;
      for (let i = 0; i < solution.x.length; i++) {
        // Exact value at the surface point on the ray through the panel midpoint.
        const theta = Math.atan2(solution.r[i], -solution.x[i]);
        worst = Math.max(worst, Math.abs(solution.cp[i] - (1 - 2.25 * Math.sin(theta) ** 2)));
      }
      return { worst, minCp: Math.min(...solution.cp) };
    };
    const coarse = worstError(80);
    const fine = worstError(160);
    expect(fine.worst).toBeLessThan(0.006);
    // Constant-strength flat panels: the error halves as the panels halve (first order).
    expect(coarse.worst / fine.worst).toBeGreaterThan(1.8);
  });

  it('prolate spheroid of fineness ratio 6: surface speed (1 + k1) V∞ cos(slope angle)', () => {
    // Lamb, "Hydrodynamics", 1932, §373 and §105 (from memory): an ellipsoid in a uniform stream along its
    // axis has a uniform interior perturbation, so q/V∞ = (1 + k1) dx/ds on its surface, with the
    // longitudinal added-mass coefficient k1 = α0/(2 − α0), α0 = (2(1 − e²)/e³)(½ ln((1 + e)/(1 − e)) − e).
    const a = 3;
    const b = 0.5;
    const e = Math.sqrt(1 - (b * b) / (a * a));
    const alpha0 = ((2 * (1 - e * e)) / (e * e * e)) * (0.5 * Math.log((1 + e) / (1 - e)) - e);
    const k1 = alpha0 / (2 - alpha0);
    const body = spheroid(a, b, 160);
    const solution = axisymmetricPanels(body.x, body.r);
    let worst = 0;
    let worstMid = 0;
    for (let i = 0; i < solution.x.length; i++) {
      // Point of the ellipse on the same polar angle of its parametrisation as the midpoint.
      const theta = Math.atan2(solution.r[i] / b, solution.x[i] / a);
      const tx = a * Math.sin(theta);
      const tr = b * Math.cos(theta);
      const q = ((1 + k1) * Math.abs(tx)) / Math.hypot(tx, tr);
      const error = Math.abs(solution.cp[i] - (1 - q * q));
      worst = Math.max(worst, error);
      if (Math.abs(solution.x[i]) < 0.8 * a) worstMid = Math.max(worstMid, error);
    }
    expect(k1).toBeCloseTo(0.045, 3); // Lamb's table of k1 for a/b = 6: 0.045 (from memory)
    expect(worstMid).toBeLessThan(0.002);
    expect(worst).toBeLessThan(0.02);
  });

  it('refuses a meridian that does not close on the axis', () => {
    expect(() => axisymmetricPanels([0, 0.1, 0.5, 0.9, 1], [0, 0.1, 0.2, 0.1, 0.05])).toThrow(/axis/);
  });
});
