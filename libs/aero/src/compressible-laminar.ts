import { GAMMA_AIR, sutherlandViscosity } from './atmosphere';
import { THWAITES_CONSTANT, thwaitesShapeFactor, thwaitesShear, type LaminarStations } from './thwaites';

/**
 * The compressible laminar layer on an adiabatic wall: Thwaites' method carried through the
 * Stewartson–Illingworth transformation, with the Chapman–Rubesin factor taken at Eckert's reference
 * temperature and Sutherland's viscosity.
 *
 * Sources: K. Stewartson, "Correlated incompressible and compressible boundary layers", Proc. Roy. Soc.
 * A 200 (1949) 84–100; C. R. Illingworth, "Steady flow in the laminar boundary layer of a gas", Proc.
 * Roy. Soc. A 199 (1949) 533–558 (transformation for Pr = 1, ρμ = C ρ0μ0 p/p0); the integral form
 * after N. Rott & L. F. Crabtree, J. Aeronaut. Sci. 19 (1952) 553–565. With t = Te/T0 (T0 the total
 * temperature of the flow normal to the leading edge), Ue the edge velocity and ν0 the kinematic
 * viscosity at T0, the transformed layer is incompressible, and back in the physical plane:
 *   θ² = 0.45 ν0 / (t³ Ue⁶) ∫ C t^{3/2} Ue⁵ ds,
 *   λ = θ² (dUe/ds) t^{1/2} / (C ν0),  H_k = H(λ),  l = l(λ)   (Thwaites' correlations, thwaites.ts),
 *   τw = C μ0 t l Ue / θ,   H = δ* / θ = H_k + (1/t − 1)(H_k + 1).
 * As M → 0 (t = C = 1) these are Thwaites' incompressible formulas. The kinematic shape factor H_k
 * (the transformed one) is what the transition correlations take, as they were fitted to
 * incompressible profiles.
 * Chapman–Rubesin factor at the reference temperature: C = μ(T*) T0 / (μ0 T*), with E. R. G. Eckert,
 * "Engineering relations for friction and heat transfer to surfaces in high velocity flow", J.
 * Aeronaut. Sci. 22 (1955) 585–587:  T* = Te + 0.5 (Tw − Te) + 0.22 (Taw − Te)  (coefficients from
 * memory), adiabatic wall Tw = Taw = Te (1 + r (γ−1)/2 Me²) with the laminar recovery factor r = √Pr
 * (E. Pohlhausen, ZAMM 1 (1921) 115; common practice) and Pr = 0.72 (common practice for air).
 * On a flat plate this gives cf √Re_x = 2 l(0) √(C* / 0.45) = 0.656 √C*, Eckert's 0.664 √C* within the
 * 1.2 % by which Thwaites' method misses Blasius.
 */

export const PRANDTL_AIR = 0.72;
export const LAMINAR_RECOVERY_FACTOR = Math.sqrt(PRANDTL_AIR);

const G = GAMMA_AIR;

/** Adiabatic-wall (recovery) temperature over the edge temperature: 1 + r (γ−1)/2 Me². */
export function recoveryTemperatureRatio(localMach: number, recoveryFactor = LAMINAR_RECOVERY_FACTOR): number {
  return 1 + recoveryFactor * 0.5 * (G - 1) * localMach * localMach;
}

/** Eckert's reference temperature over the edge temperature, for wall temperature ratio Tw/Te. */
export function eckertReferenceTemperatureRatio(localMach: number, wallTemperatureRatio = recoveryTemperatureRatio(localMach)): number {
  return 1 + 0.5 * (wallTemperatureRatio - 1) + 0.22 * (recoveryTemperatureRatio(localMach) - 1);
}

/**
 * Eckert's flat-plate laminar skin friction on an adiabatic wall: cf = 0.664 √(C* / Re_x), with
 * C* = ρ* μ* / (ρe μe) = (Te / T*) μ(T*) / μ(Te), Sutherland's μ, edge temperature `edgeTemperature_K`.
 */
export function eckertFlatPlateSkinFriction(reynoldsX: number, localMach: number, edgeTemperature_K: number): number {
  const ratio = eckertReferenceTemperatureRatio(localMach);
  const c = (sutherlandViscosity(ratio * edgeTemperature_K) / sutherlandViscosity(edgeTemperature_K)) / ratio;
  return 0.664 * Math.sqrt(c / reynoldsX);
}

/** The flow the compressible march needs besides the stations. */
export interface CompressibleFlow {
  /** Free-stream Mach number M∞. */
  mach: number;
  /** Leading-edge sweep Λ in radians (0 for a two-dimensional section). */
  sweep: number;
  /** Free-stream static temperature, for Sutherland's law. */
  temperature_K: number;
}

/** Station factors of the compressible layer, all 1 in incompressible flow. */
export interface CompressibleStations {
  /** ρe μ∞ / (ρ∞ μe): the local unit Reynolds number over the free-stream one (at equal Ue). */
  reynoldsRatio: Float64Array;
  /** ρe / ρ∞. */
  densityRatio: Float64Array;
  /** H = δ* / θ of the compressible profile (the march's shapeFactor is the kinematic H_k). */
  shapeFactor: Float64Array;
}

/**
 * March the compressible layer along `s` with chordwise edge velocity `ue` = Ue/V∞ (normal to the
 * leading edge), its slope, Reynolds number V∞ L/ν∞ and optional body radius. Fills `out` like
 * thwaitesMarch (θ, λ, H_k, cf on the local ρe Ue², τw on ½ ρ∞ V∞²) and `stations`.
 */
export function compressibleThwaitesMarch(
  s: ArrayLike<number>,
  ue: ArrayLike<number>,
  dUeds: ArrayLike<number>,
  reynolds: number,
  radius: ArrayLike<number> | null,
  flow: CompressibleFlow,
  out: LaminarStations,
  stations: CompressibleStations,
): void {
  const n = s.length;
  const { theta, lambda, shapeFactor, skinFriction, wallShear } = out;
  const m2 = flow.mach * flow.mach;
  const sin2 = Math.sin(flow.sweep) ** 2;
  const half = 0.5 * (G - 1) * m2;
  // Total temperature of the normal flow, and its viscosity and density (isentropic) on the free stream's.
  const total = 1 + half * (1 - sin2);
  const tInf = flow.temperature_K;
  const mu0 = sutherlandViscosity(total * tInf) / sutherlandViscosity(tInf);
  const nu0 = mu0 / Math.pow(total, 1 / (G - 1));
  const t = new Float64Array(n);
  const c = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    // Te/T∞ from the energy equation with the total edge speed² = Ue² + sin²Λ.
    const edge = 1 + half * (1 - sin2 - ue[i] * ue[i]);
    const localMach2 = (m2 * (ue[i] * ue[i] + sin2)) / edge;
    const reference = eckertReferenceTemperatureRatio(Math.sqrt(localMach2)) * edge;
    t[i] = edge / total;
    c[i] = (sutherlandViscosity(reference * tInf) / (mu0 * sutherlandViscosity(tInf))) * (total / reference);
    const muEdge = sutherlandViscosity(edge * tInf) / sutherlandViscosity(tInf);
    const density = Math.pow(edge, 1 / (G - 1));
    stations.densityRatio[i] = density;
    stations.reynoldsRatio[i] = density / muEdge;
  }
  let integral = 0;
  for (let i = 0; i < n; i++) {
    const u = ue[i];
    if (i > 0) {
      const ds = s[i] - s[i - 1];
      let sum = 0;
      for (let q = 0; q < 4; q++) {
        const f = GL_T[q];
        const uq = ue[i - 1] + f * (u - ue[i - 1]);
        const tq = t[i - 1] + f * (t[i] - t[i - 1]);
        const cq = c[i - 1] + f * (c[i] - c[i - 1]);
        const rq = radius === null ? 1 : radius[i - 1] + f * (radius[i] - radius[i - 1]);
        const u2 = uq * uq;
        sum += GL_W[q] * rq * rq * cq * tq * Math.sqrt(tq) * u2 * u2 * uq;
      }
      integral += ds * sum;
    }
    const ti = t[i];
    let th2: number;
    if (u > 0) {
      const u2 = u * u;
      const r2 = radius === null ? 1 : radius[i] * radius[i];
      th2 = (THWAITES_CONSTANT * nu0 * integral) / (reynolds * r2 * ti * ti * ti * u2 * u2 * u2);
    } else {
      const start = radius !== null && radius[i] === 0 ? THWAITES_CONSTANT / 8 : THWAITES_CONSTANT / 6;
      th2 = dUeds[i] > 0 ? (start * nu0 * c[i] * Math.sqrt(ti)) / (reynolds * dUeds[i] * ti * ti) : NaN;
    }
    const th = Math.sqrt(th2);
    const lam = (th2 * reynolds * dUeds[i] * Math.sqrt(ti)) / (nu0 * c[i]);
    const l = thwaitesShear(lam);
    const hk = thwaitesShapeFactor(lam);
    theta[i] = th;
    lambda[i] = lam;
    shapeFactor[i] = hk;
    stations.shapeFactor[i] = hk + (1 / ti - 1) * (hk + 1);
    const shear = th > 0 ? (2 * c[i] * mu0 * ti * l * u) / (reynolds * th) : NaN;
    wallShear[i] = shear;
    skinFriction[i] = u > 0 && th > 0 ? shear / (stations.densityRatio[i] * u * u) : NaN;
  }
}

// Gauss–Legendre nodes and weights on [0, 1].
const GL_T = [0.0694318442029737, 0.3300094782075719, 0.6699905217924281, 0.9305681557970263];
const GL_W = [0.1739274225687269, 0.3260725774312731, 0.3260725774312731, 0.1739274225687269];
