import { describe, expect, it } from 'vitest';
import { flatPlateEstimate, laminarMeanCf, mixedMeanCf, turbulentMeanCfPrandtl, turbulentMeanCfSchlichting } from './flat-plate';

// Blasius' laminar values and Schlichting's mixed-plate constant are shared reference cases
// (./validation/flat-plate.ts), run by the validation page too.
describe('flat-plate estimates', () => {
  it('turbulent laws at Re = 1e7', () => {
    expect(turbulentMeanCfPrandtl(1e7)).toBeCloseTo(0.074 / Math.pow(1e7, 0.2), 12);
    expect(turbulentMeanCfSchlichting(1e7)).toBeCloseTo(0.455 / Math.pow(7, 2.58), 12);
  });

  it('mixed plate: the −A/Re_L form (A against Schlichting’s 1700: ./validation/flat-plate.ts)', () => {
    const a = 5e5 * (turbulentMeanCfSchlichting(5e5) - laminarMeanCf(5e5));
    for (const re of [3e6, 1e7, 1e8]) expect(mixedMeanCf(re, 5e5)).toBeCloseTo(turbulentMeanCfSchlichting(re) - a / re, 12);
  });

  it('the estimate brackets mixed flow between laminar and turbulent', () => {
    const estimate = flatPlateEstimate(2e7, 0.4);
    expect(estimate.cfMixed).toBeGreaterThan(estimate.cfLaminar);
    expect(estimate.cfMixed).toBeLessThan(estimate.cfTurbulent);
    expect(estimate.laminarSaving).toBeGreaterThan(0.2);
    expect(flatPlateEstimate(2e7, 1).cfMixed).toBe(estimate.cfLaminar);
    expect(flatPlateEstimate(2e7, 0).cfMixed).toBe(estimate.cfTurbulent);
    expect(() => flatPlateEstimate(2e7, 1.2)).toThrow(RangeError);
  });
});
