import { describe, expect, it } from 'vitest';
import { geopotentialAltitude, isaAtmosphere, sutherlandViscosity } from './atmosphere';
import { deriveFlowCondition } from './flow-condition';

describe('ISA against the U.S. Standard Atmosphere 1976 table (geopotential altitude)', () => {
  // U.S. Standard Atmosphere, 1976, Table I / layer-base values (ICAO identical below 32 km);
  // values from memory of the table.
  const table = [
    { h: 0, t: 288.15, p: 101325, rho: 1.225 },
    { h: 11000, t: 216.65, p: 22632.06, rho: 0.36392 },
    { h: 20000, t: 216.65, p: 5474.889, rho: 0.088035 },
    { h: 32000, t: 228.65, p: 868.0187, rho: 0.013225 },
    { h: 47000, t: 270.65, p: 110.9063, rho: 0.0014275 },
    { h: 51000, t: 270.65, p: 66.93887, rho: 0.00086160 },
    { h: 71000, t: 214.65, p: 3.956420, rho: 0.000064211 },
  ];
  for (const row of table) {
    it(`${row.h} m`, () => {
      const air = isaAtmosphere(row.h);
      expect(air.temperature_K).toBeCloseTo(row.t, 3);
      expect(Math.abs(air.pressure_Pa / row.p - 1)).toBeLessThan(2e-5);
      expect(Math.abs(air.density_kgm3 / row.rho - 1)).toBeLessThan(5e-4);
    });
  }

  it('sea-level speed of sound and viscosity', () => {
    // U.S. Standard Atmosphere 1976: a0 = 340.294 m/s, μ0 = 1.7894e-5 Pa s (from memory).
    const air = isaAtmosphere(0);
    expect(air.speedOfSound_ms).toBeCloseTo(340.294, 2);
    expect(air.viscosity_Pas).toBeCloseTo(1.7894e-5, 8);
    expect(sutherlandViscosity(216.65)).toBeCloseTo(1.4216e-5, 8); // 1976 table at 11 km (from memory)
  });

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

  it('converts geometric to geopotential altitude (H = r0 Z/(r0 + Z), r0 = 6 356 766 m)', () => {
    expect(geopotentialAltitude(11019.1)).toBeCloseTo(11000, 0);
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
