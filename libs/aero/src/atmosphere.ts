/**
 * International Standard Atmosphere and Sutherland's viscosity law.
 *
 * Source: U.S. Standard Atmosphere, 1976 (NOAA/NASA/USAF), identical to the ICAO Standard Atmosphere
 * below 32 km. Temperature is linear in geopotential altitude H within each layer,
 * T = Tb + Lb (H − Hb); pressure follows hydrostatics for a perfect gas:
 *   p = pb (Tb / T)^(g0 / (R Lb))            when Lb ≠ 0,
 *   p = pb exp(−g0 (H − Hb) / (R Tb))        when Lb = 0.
 * Layers are defined up to 84 852 m geopotential (86 km geometric).
 *
 * `altitude_m` is geopotential (pressure) altitude, as ICAO tables and flight levels use it; use
 * `geopotentialAltitude` to convert a geometric height. An ISA temperature offset keeps the standard
 * pressure at that altitude and raises the temperature (the usual "ISA + ΔT" convention), so density
 * and viscosity follow from the warmer air.
 */

/** Standard gravity, m/s² (U.S. Standard Atmosphere 1976). */
export const STANDARD_GRAVITY = 9.80665;
/** Specific gas constant of air R* / M0 = 8314.32 / 28.9644 J/(kg K) (U.S. Standard Atmosphere 1976). */
export const GAS_CONSTANT_AIR = 8314.32 / 28.9644;
/** Ratio of specific heats of air. */
export const GAMMA_AIR = 1.4;
/** Effective Earth radius for geopotential altitude, m (U.S. Standard Atmosphere 1976). */
export const EARTH_RADIUS_M = 6_356_766;

const LAYER_BASE_M = [0, 11_000, 20_000, 32_000, 47_000, 51_000, 71_000, 84_852];
const LAYER_LAPSE_K_PER_M = [-0.0065, 0, 0.001, 0.0028, 0, -0.0028, -0.002];
const SEA_LEVEL_TEMPERATURE_K = 288.15;
const SEA_LEVEL_PRESSURE_PA = 101_325;

export const ISA_MIN_ALTITUDE_M = -5000;
export const ISA_MAX_ALTITUDE_M = LAYER_BASE_M[LAYER_BASE_M.length - 1];

const layerTemperature: number[] = [SEA_LEVEL_TEMPERATURE_K];
const layerPressure: number[] = [SEA_LEVEL_PRESSURE_PA];
for (let i = 0; i < LAYER_LAPSE_K_PER_M.length - 1; i++) {
  const [t, p] = layerState(i, LAYER_BASE_M[i + 1]);
  layerTemperature.push(t);
  layerPressure.push(p);
}

function layerState(layer: number, altitude_m: number): [number, number] {
  const tb = layerTemperature[layer];
  const pb = layerPressure[layer];
  const lapse = LAYER_LAPSE_K_PER_M[layer];
  const dh = altitude_m - LAYER_BASE_M[layer];
  if (lapse === 0) return [tb, pb * Math.exp((-STANDARD_GRAVITY * dh) / (GAS_CONSTANT_AIR * tb))];
  const t = tb + lapse * dh;
  return [t, pb * Math.pow(tb / t, STANDARD_GRAVITY / (GAS_CONSTANT_AIR * lapse))];
}

export interface AtmosphereState {
  temperature_K: number;
  pressure_Pa: number;
  density_kgm3: number;
  speedOfSound_ms: number;
  viscosity_Pas: number;
  kinematicViscosity_m2s: number;
}

/**
 * ISA state at a geopotential altitude (m), optionally ISA + ΔT (K).
 * Throws RangeError outside −5 000 m … 84 852 m.
 */
export function isaAtmosphere(altitude_m: number, temperatureOffset_K = 0): AtmosphereState {
  if (!(altitude_m >= ISA_MIN_ALTITUDE_M && altitude_m <= ISA_MAX_ALTITUDE_M)) {
    throw new RangeError(`altitude ${altitude_m} m is outside the standard atmosphere (${ISA_MIN_ALTITUDE_M} to ${ISA_MAX_ALTITUDE_M} m)`);
  }
  let layer = 0;
  while (layer < LAYER_LAPSE_K_PER_M.length - 1 && altitude_m >= LAYER_BASE_M[layer + 1]) layer++;
  const [standardTemperature, pressure_Pa] = layerState(layer, altitude_m);
  const temperature_K = standardTemperature + temperatureOffset_K;
  if (!(temperature_K > 0)) throw new RangeError(`temperature offset ${temperatureOffset_K} K gives a non-positive temperature`);
  const density_kgm3 = pressure_Pa / (GAS_CONSTANT_AIR * temperature_K);
  const viscosity_Pas = sutherlandViscosity(temperature_K);
  return {
    temperature_K,
    pressure_Pa,
    density_kgm3,
    speedOfSound_ms: Math.sqrt(GAMMA_AIR * GAS_CONSTANT_AIR * temperature_K),
    viscosity_Pas,
    kinematicViscosity_m2s: viscosity_Pas / density_kgm3,
  };
}

/**
 * Sutherland's law μ = β T^1.5 / (T + S), β = 1.458e-6 kg/(m s K^0.5), S = 110.4 K, in Pa s
 * (U.S. Standard Atmosphere 1976, eq. 51; Sutherland, Phil. Mag. 1893).
 */
export function sutherlandViscosity(temperature_K: number): number {
  return (1.458e-6 * temperature_K * Math.sqrt(temperature_K)) / (temperature_K + 110.4);
}

/** Geopotential altitude H = r0 Z / (r0 + Z) of a geometric height Z, m (U.S. Standard Atmosphere 1976, eq. 18). */
export function geopotentialAltitude(geometricAltitude_m: number): number {
  return (EARTH_RADIUS_M * geometricAltitude_m) / (EARTH_RADIUS_M + geometricAltitude_m);
}
