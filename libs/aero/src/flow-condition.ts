import { isaAtmosphere } from './atmosphere';

/**
 * Flight condition from a Reynolds number, or from ISA altitude, Mach number and reference length.
 *
 * Re = V∞ L / ν∞ with V∞ = M∞ a∞, a∞ = √(γ R T∞), ν∞ = μ(T∞)/ρ∞ from the standard atmosphere and
 * Sutherland's law (atmosphere.ts, U.S. Standard Atmosphere 1976); dynamic pressure q∞ = ½ ρ∞ V∞².
 * When only Re is given, the dimensional quantities are unknown and left out.
 */

export interface FlowConditionInput {
  reynolds?: number;
  mach?: number;
  altitude_m?: number;
  referenceLength_m?: number;
  isaTemperatureOffset_K?: number;
}

export interface FlowCondition {
  reynolds: number;
  mach: number;
  /** Present when the condition came from the atmosphere. */
  altitude_m?: number;
  referenceLength_m?: number;
  temperature_K?: number;
  pressure_Pa?: number;
  density_kgm3?: number;
  viscosity_Pas?: number;
  kinematicViscosity_m2s?: number;
  speedOfSound_ms?: number;
  speed_ms?: number;
  dynamicPressure_Pa?: number;
  /** Reynolds number per metre, V∞ / ν∞. */
  reynoldsPerMetre?: number;
}

/** Derive the flow condition; throws RangeError naming the missing or impossible input. */
export function deriveFlowCondition(input: FlowConditionInput): FlowCondition {
  const mach = input.mach ?? 0;
  if (!(mach >= 0 && mach < 1)) throw new RangeError(`mach ${mach} is outside 0 <= mach < 1`);
  if (input.reynolds !== undefined) {
    if (!(input.reynolds > 0)) throw new RangeError('reynolds must be greater than zero');
    return { reynolds: input.reynolds, mach };
  }
  const { altitude_m, referenceLength_m } = input;
  if (altitude_m === undefined || referenceLength_m === undefined) {
    throw new RangeError('give reynolds, or altitude_m with mach and referenceLength_m');
  }
  if (!(referenceLength_m > 0)) throw new RangeError('referenceLength_m must be greater than zero');
  const air = isaAtmosphere(altitude_m, input.isaTemperatureOffset_K ?? 0);
  const speed_ms = mach * air.speedOfSound_ms;
  const reynoldsPerMetre = speed_ms / air.kinematicViscosity_m2s;
  const reynolds = reynoldsPerMetre * referenceLength_m;
  if (!(reynolds > 0)) throw new RangeError('mach must be greater than zero to give a Reynolds number');
  return {
    reynolds,
    mach,
    altitude_m,
    referenceLength_m,
    temperature_K: air.temperature_K,
    pressure_Pa: air.pressure_Pa,
    density_kgm3: air.density_kgm3,
    viscosity_Pas: air.viscosity_Pas,
    kinematicViscosity_m2s: air.kinematicViscosity_m2s,
    speedOfSound_ms: air.speedOfSound_ms,
    speed_ms,
    dynamicPressure_Pa: 0.5 * air.density_kgm3 * speed_ms * speed_ms,
    reynoldsPerMetre,
  };
}
