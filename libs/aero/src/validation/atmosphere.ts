import { geopotentialAltitude, isaAtmosphere, sutherlandViscosity } from '../atmosphere';
import { digits, relativeWithin, type ValidationCase, type ValidationSuite } from './case';

export const isa: ValidationSuite = {
  id: 'isa',
  title: 'International Standard Atmosphere',
  methods: ['isa', 'sutherland'],
  summary: 'Layer-base values of the U.S. Standard Atmosphere 1976 (identical to ICAO below 32 km), geopotential altitude.',
  cases: () => {
    const table = 'U.S. Standard Atmosphere, 1976, Table I, layer-base values (from memory of the table)';
    const rows = [
      { h: 0, t: 288.15, p: 101325, rho: 1.225 },
      { h: 11000, t: 216.65, p: 22632.06, rho: 0.36392 },
      { h: 20000, t: 216.65, p: 5474.889, rho: 0.088035 },
      { h: 32000, t: 228.65, p: 868.0187, rho: 0.013225 },
      { h: 47000, t: 270.65, p: 110.9063, rho: 0.0014275 },
      { h: 51000, t: 270.65, p: 66.93887, rho: 0.0008616 },
      { h: 71000, t: 214.65, p: 3.95642, rho: 0.000064211 },
    ];
    const cases: ValidationCase[] = [];
    for (const row of rows) {
      cases.push(
        { id: `isa.${row.h}.temperature`, title: `temperature at ${row.h} m`, quantity: 'T (K)', tolerance: digits(3), source: table, measure: () => ({ value: isaAtmosphere(row.h).temperature_K, reference: row.t }) },
        { id: `isa.${row.h}.pressure`, title: `pressure at ${row.h} m`, quantity: 'p (Pa)', tolerance: relativeWithin(2e-5), source: table, measure: () => ({ value: isaAtmosphere(row.h).pressure_Pa, reference: row.p }) },
        { id: `isa.${row.h}.density`, title: `density at ${row.h} m`, quantity: 'ρ (kg/m³)', tolerance: relativeWithin(5e-4), source: table, measure: () => ({ value: isaAtmosphere(row.h).density_kgm3, reference: row.rho }) },
      );
    }
    const memory = 'U.S. Standard Atmosphere, 1976 (from memory)';
    cases.push(
      { id: 'isa.speed-of-sound', title: 'sea-level speed of sound', quantity: 'a₀ (m/s)', tolerance: digits(2), source: memory, measure: () => ({ value: isaAtmosphere(0).speedOfSound_ms, reference: 340.294 }) },
      { id: 'isa.viscosity', title: 'sea-level viscosity', quantity: 'μ₀ (Pa s)', tolerance: digits(8), source: memory, measure: () => ({ value: isaAtmosphere(0).viscosity_Pas, reference: 1.7894e-5 }) },
      { id: 'isa.sutherland.216.65', title: 'Sutherland viscosity at 216.65 K (11 km)', quantity: 'μ (Pa s)', tolerance: digits(8), source: memory, measure: () => ({ value: sutherlandViscosity(216.65), reference: 1.4216e-5 }) },
      { id: 'isa.geopotential', title: 'geometric 11 019.1 m as geopotential altitude', quantity: 'H (m)', tolerance: digits(0), source: 'U.S. Standard Atmosphere, 1976: H = r₀ Z/(r₀ + Z), r₀ = 6 356 766 m', measure: () => ({ value: geopotentialAltitude(11019.1), reference: 11000 }) },
    );
    return cases;
  },
};
