import { describe, expect, it } from 'vitest';
import {
  criticalPressureCoefficient,
  edgeVelocityRatio,
  isentropicPressureRatio,
  localMach,
  localMachFromVelocity,
  pressureCoefficientFromVelocity,
  stagnationPressureCoefficient,
} from './compressible';

// NACA Report 1135 (Ames Research Staff, 1953), Table I, isentropic p/p0 for γ = 1.4
// (five-figure values from memory).
const PRESSURE_RATIO: Record<string, number> = { '0.3': 0.93947, '0.5': 0.84302, '0.7': 0.72093, '0.8': 0.65602, '1': 0.52828, '1.2': 0.41238 };

describe('isentropic relations against NACA Report 1135', () => {
  it('p/p0 from the table', () => {
    for (const [mach, ratio] of Object.entries(PRESSURE_RATIO)) expect(isentropicPressureRatio(Number(mach))).toBeCloseTo(ratio, 5);
  });

  it('local Mach number from Cp built from tabulated pressure ratios', () => {
    // Cp = 2/(γ M∞²) [(p/p0)_local / (p/p0)_∞ − 1]: free stream at 0.5 or 0.7, local 0.3 … 1.2.
    for (const free of ['0.5', '0.7']) {
      for (const local of ['0.3', '0.8', '1', '1.2']) {
        const mInf = Number(free);
        const cp = (2 / (1.4 * mInf * mInf)) * (PRESSURE_RATIO[local] / PRESSURE_RATIO[free] - 1);
        expect(localMach(cp, mInf)).toBeCloseTo(Number(local), 3);
      }
    }
  });

  it('sonic Cp* from the table value of p/p0 at M = 1', () => {
    for (const free of ['0.5', '0.7', '0.8']) {
      const mInf = Number(free);
      const expected = (2 / (1.4 * mInf * mInf)) * (PRESSURE_RATIO['1'] / PRESSURE_RATIO[free] - 1);
      expect(criticalPressureCoefficient(mInf)).toBeCloseTo(expected, 4);
    }
  });

  it('stagnation Cp follows the series 1 + M²/4 + M⁴/40 at low Mach (common practice)', () => {
    const m = 0.2;
    expect(stagnationPressureCoefficient(m)).toBeCloseTo(1 + m * m / 4 + m ** 4 / 40, 6);
    expect(stagnationPressureCoefficient(0)).toBe(1);
    expect(edgeVelocityRatio(stagnationPressureCoefficient(0.6), 0.6)).toBeCloseTo(0, 6);
  });

  it('edge velocity: Bernoulli at M = 0, continuous as M → 0, consistent with the local Mach number', () => {
    expect(edgeVelocityRatio(-0.44, 0)).toBeCloseTo(1.2, 12);
    expect(edgeVelocityRatio(-0.44, 1e-4)).toBeCloseTo(1.2, 6);
    for (const cp of [-0.8, -0.2, 0, 0.5]) {
      const mInf = 0.7;
      const u = edgeVelocityRatio(cp, mInf);
      expect(pressureCoefficientFromVelocity(u, mInf)).toBeCloseTo(cp, 10);
      expect(localMachFromVelocity(u, mInf)).toBeCloseTo(localMach(cp, mInf), 10);
    }
    expect(edgeVelocityRatio(0, 0.7)).toBeCloseTo(1, 12);
  });

  it('gives NaN for Cp above the stagnation value', () => {
    expect(edgeVelocityRatio(1.01, 0)).toBeNaN();
    expect(edgeVelocityRatio(stagnationPressureCoefficient(0.5) + 1e-3, 0.5)).toBeNaN();
  });
});
