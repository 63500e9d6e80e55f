import { GAMMA_AIR } from './atmosphere';

/**
 * Isentropic relations between the pressure coefficient, the local Mach number and the edge velocity
 * ratio Ue/V∞ for a subsonic free stream of a perfect gas (γ = 1.4).
 *
 * Source: Ames Research Staff, "Equations, Tables, and Charts for Compressible Flow", NACA Report 1135
 * (1953), eqs. 44 (p/p0), 43 (T/T0) and the definition Cp = (p − p∞)/(½ γ p∞ M∞²). Eliminating the
 * stagnation state gives, with p/p∞ = 1 + ½ γ M∞² Cp,
 *   (Ue/V∞)² = 1 + 2/((γ − 1) M∞²) · [1 − (p/p∞)^((γ−1)/γ)],
 * which tends to the incompressible Bernoulli result Ue/V∞ = √(1 − Cp) as M∞ → 0.
 */

const G = GAMMA_AIR;
const EXPONENT = (G - 1) / G;

/** Below this free-stream Mach number the incompressible form is used (differences are < 1e-12). */
const INCOMPRESSIBLE_MACH = 1e-7;

/** Pressure coefficient at a stagnation point, Cp0 = 2/(γ M²) [(1 + (γ−1)/2 M²)^(γ/(γ−1)) − 1]; 1 when M = 0. */
export function stagnationPressureCoefficient(mach: number): number {
  if (mach < INCOMPRESSIBLE_MACH) return 1;
  const m2 = mach * mach;
  return (2 / (G * m2)) * Math.expm1((1 / EXPONENT) * Math.log1p(0.5 * (G - 1) * m2));
}

/** Pressure coefficient where the local flow is sonic, Cp* (NACA Report 1135, eq. 44 with M = 1). */
export function criticalPressureCoefficient(mach: number): number {
  if (mach < INCOMPRESSIBLE_MACH) return -Infinity;
  const m2 = mach * mach;
  return (2 / (G * m2)) * (Math.pow((2 + (G - 1) * m2) / (G + 1), 1 / EXPONENT) - 1);
}

/**
 * Edge velocity ratio |Ue|/V∞ from the pressure coefficient at free-stream Mach `mach`.
 * Returns NaN when Cp lies above the stagnation value or below vacuum (p < 0).
 */
export function edgeVelocityRatio(cp: number, mach: number): number {
  if (mach < INCOMPRESSIBLE_MACH) return cp <= 1 ? Math.sqrt(1 - cp) : NaN;
  const m2 = mach * mach;
  const x = 0.5 * G * m2 * cp;
  if (!(x > -1)) return NaN;
  // (p/p∞)^((γ−1)/γ) − 1 without cancellation at small M∞.
  const q2 = 1 - (2 / ((G - 1) * m2)) * Math.expm1(EXPONENT * Math.log1p(x));
  return q2 >= 0 ? Math.sqrt(q2) : NaN;
}

/** Inverse of `edgeVelocityRatio`: Cp at edge velocity ratio Ue/V∞ (NaN past the vacuum limit). */
export function pressureCoefficientFromVelocity(velocityRatio: number, mach: number): number {
  const q2 = velocityRatio * velocityRatio;
  if (mach < INCOMPRESSIBLE_MACH) return 1 - q2;
  const m2 = mach * mach;
  const t = 1 + 0.5 * (G - 1) * m2 * (1 - q2);
  if (!(t > 0)) return NaN;
  return (2 / (G * m2)) * Math.expm1(Math.log(t) / EXPONENT);
}

/**
 * Local Mach number from Cp: M² = 2/(γ−1) [(p0/p)^((γ−1)/γ) − 1] with
 * p0/p∞ = (1 + (γ−1)/2 M∞²)^(γ/(γ−1)) (NACA Report 1135, eq. 44). NaN where Cp is not reachable.
 */
export function localMach(cp: number, mach: number): number {
  if (mach < INCOMPRESSIBLE_MACH) return cp <= 1 ? 0 : NaN;
  const m2 = mach * mach;
  const x = 0.5 * G * m2 * cp;
  if (!(x > -1)) return NaN;
  // (p0/p)^((γ−1)/γ) = (1 + (γ−1)/2 M∞²) / (p/p∞)^((γ−1)/γ)
  const ratio = (1 + 0.5 * (G - 1) * m2) / Math.exp(EXPONENT * Math.log1p(x));
  const local2 = (2 / (G - 1)) * (ratio - 1);
  return local2 >= -1e-12 ? Math.sqrt(Math.max(0, local2)) : NaN;
}

/** Isentropic static-to-total pressure ratio p/p0 = (1 + (γ−1)/2 M²)^(−γ/(γ−1)) (NACA Report 1135, eq. 44). */
export function isentropicPressureRatio(mach: number): number {
  return Math.pow(1 + 0.5 * (G - 1) * mach * mach, -1 / EXPONENT);
}

/**
 * Local Mach number from the edge velocity ratio: M² = M∞² (Ue/V∞)² / (T/T∞), with the adiabatic
 * energy equation T/T∞ = 1 + (γ−1)/2 M∞² (1 − (Ue/V∞)²) (NACA Report 1135, eq. 43).
 */
export function localMachFromVelocity(velocityRatio: number, mach: number): number {
  const temperatureRatio = 1 + 0.5 * (G - 1) * mach * mach * (1 - velocityRatio * velocityRatio);
  return temperatureRatio > 0 ? (mach * velocityRatio) / Math.sqrt(temperatureRatio) : NaN;
}
