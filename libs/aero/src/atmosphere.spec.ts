import { describe, expect, it } from 'vitest';
import { isaAtmosphere } from './atmosphere';
import { deriveFlowCondition } from './flow-condition';

// The table values (U.S. Standard Atmosphere 1976), sea-level speed of sound and viscosity, and
// geopotential altitude are shared reference cases (./validation/atmosphere.ts), run by the validation page too.
describe('ISA', () => {
  it('is continuous across layer boundaries', () => {
    for (const h of [11000, 20000, 32000, 47000, 51000, 71000]) {
      const below = isaAtmosphere(h - 1e-6);
      const above = isaAtmosphere(h + 1e-6);
      expect(above.pressure_Pa / below.pressure_Pa).toBeCloseTo(1, 8);
      expect(above.temperature_K - below.temperature_K).toBeCloseTo(0, 6);
    }
  });

  it('ISA + ΔT keeps pressure and lowers density', () => {
    const standard = isaAtmosphere(5000);
    const hot = isaAtmosphere(5000, 15);
    expect(hot.pressure_Pa).toBe(standard.pressure_Pa);
    expect(hot.temperature_K).toBeCloseTo(standard.temperature_K + 15, 10);
    expect(hot.density_kgm3 / standard.density_kgm3).toBeCloseTo(standard.temperature_K / hot.temperature_K, 10);
  });

  it('refuses altitudes outside the standard', () => {
    expect(() => isaAtmosphere(90000)).toThrow(RangeError);
    expect(() => isaAtmosphere(-6000)).toThrow(RangeError);
  });
});

describe('flow condition', () => {
  it('derives Re, V and q from altitude, Mach and length', () => {
    const flow = deriveFlowCondition({ altitude_m: 11000, mach: 0.75, referenceLength_m: 2 });
    const air = isaAtmosphere(11000);
    const speed = 0.75 * air.speedOfSound_ms;
    expect(flow.speed_ms).toBeCloseTo(speed, 10);
    expect(flow.reynolds).toBeCloseTo((speed * 2) / air.kinematicViscosity_m2s, 3);
    // q = ½ ρ V² = ½ γ p M² (identity of the perfect gas).
    expect(flow.dynamicPressure_Pa!).toBeCloseTo(0.5 * 1.4 * air.pressure_Pa * 0.75 ** 2, 6);
    // Common practice: a cruise Reynolds number of order 1e7 per 2 m chord at M 0.75, 11 km.
    expect(flow.reynolds).toBeGreaterThan(1.0e7);
    expect(flow.reynolds).toBeLessThan(1.4e7);
  });

  it('passes a given Reynolds number through without dimensional quantities', () => {
    expect(deriveFlowCondition({ reynolds: 6e6, mach: 0.2 })).toEqual({ reynolds: 6e6, mach: 0.2 });
  });

  it('refuses a zero Mach number with altitude, and supersonic Mach numbers', () => {
    expect(() => deriveFlowCondition({ altitude_m: 0, mach: 0, referenceLength_m: 1 })).toThrow(/mach/);
    expect(() => deriveFlowCondition({ reynolds: 1e6, mach: 1.2 })).toThrow(/mach/);
  });
});
