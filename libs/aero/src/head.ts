import { Odex } from './odex';

/**
 * Head's entrainment method for the turbulent boundary layer, integrated with odex (Hairer & Wanner's
 * extrapolation code, Gragg–Bulirsch–Stoer; odex.ts, the npm package's algorithm step for step).
 *
 * Source: M. R. Head, "Entrainment in the turbulent boundary layer", ARC R&M 3152 (1958); correlations
 * as fitted by T. Cebeci & P. Bradshaw, "Momentum Transfer in Boundary Layers" (1977) (quoted from
 * memory; they are also in F. M. White, "Viscous Fluid Flow"):
 *   momentum:     dθ/ds = cf/2 − (H + 2) (θ/Ue) dUe/ds − (θ/r) dr/ds
 *   entrainment:  d(r Ue θ H1)/ds = r Ue F(H1),   F = 0.0306 (H1 − 3)^−0.6169
 *   H1(H) = 0.8234 (H − 1.1)^−1.287 + 3.3 (H ≤ 1.6),  1.5501 (H − 0.6778)^−3.064 + 3.3 (H > 1.6)
 *   skin friction (Ludwieg & Tillmann, Ing.-Arch. 17, 1949): cf = 0.246 · 10^(−0.678 H) Re_θ^−0.268.
 * The r terms are the axisymmetric form (omitted for plane flow). The march starts at transition from
 * the laminar momentum thickness with H = 1.4 (common practice) and stops at turbulent separation,
 * taken at H = 2.4 (Head's method puts it between H = 1.8 and 2.4; the upper value is used, common
 * practice). Between stations Ue, r are linear and their least-squares slopes are interpolated linearly.
 */

export const TURBULENT_START_SHAPE_FACTOR = 1.4;
export const TURBULENT_SEPARATION_SHAPE_FACTOR = 2.4;

/** Entrainment shape factor H1 = (δ − δ*)/θ from H. */
export function entrainmentShapeFactor(shapeFactor: number): number {
  return shapeFactor <= 1.6 ? 0.8234 * Math.pow(shapeFactor - 1.1, -1.287) + 3.3 : 1.5501 * Math.pow(shapeFactor - 0.6778, -3.064) + 3.3;
}

const H1_AT_H_1_6 = entrainmentShapeFactor(1.6);

/** Inverse of `entrainmentShapeFactor`: H from H1 (> 3.3). */
export function shapeFactorFromEntrainment(entrainment: number): number {
  // x^a as exp(a ln x) here and in entrainmentRate: these run in every derivative evaluation, and V8's
  // Math.pow costs about an exp and a log and a half. The two agree to a few units in the last place.
  const excess = entrainment - 3.3;
  return entrainment >= H1_AT_H_1_6 ? 1.1 + Math.exp((-1 / 1.287) * Math.log(excess / 0.8234)) : 0.6778 + Math.exp((-1 / 3.064) * Math.log(excess / 1.5501));
}

/** Dimensionless entrainment rate F(H1) = (1/Ue) d(Ue θ H1)/ds. */
export function entrainmentRate(entrainment: number): number {
  return 0.0306 * Math.exp(-0.6169 * Math.log(entrainment - 3));
}

/** Ludwieg–Tillmann skin friction τw / (½ ρ Ue²). */
export function ludwiegTillmannCf(shapeFactor: number, reTheta: number): number {
  // 10^(−0.678 H) Re_θ^−0.268 as one exponential: this runs in every derivative evaluation.
  return 0.246 * Math.exp(-0.678 * Math.LN10 * shapeFactor - 0.268 * Math.log(reTheta));
}

export interface TurbulentMarchInput {
  s: ArrayLike<number>;
  ue: ArrayLike<number>;
  dUeds: ArrayLike<number>;
  /** Body radius and its slope for axisymmetric flow, or null. */
  radius: ArrayLike<number> | null;
  dRds: ArrayLike<number> | null;
  reynolds: number;
  /** Arc length where the turbulent layer starts (transition). */
  startS: number;
  /** θ / L at the start. */
  startTheta: number;
}

export interface TurbulentStations {
  theta: Float64Array;
  shapeFactor: Float64Array;
  skinFriction: Float64Array;
}

export interface TurbulentMarchResult {
  /** Arc length of turbulent separation, or null when the layer stays attached to the last station. */
  separationS: number | null;
  /** θ / L, H and Ue / V∞ where the march ended (separation or the last station). */
  endTheta: number;
  endShapeFactor: number;
  endUe: number;
  /** Index of the last station that was filled. */
  lastIndex: number;
}

const H1_SEPARATION = entrainmentShapeFactor(TURBULENT_SEPARATION_SHAPE_FACTOR);
/** One integrator for every march (headMarch is synchronous and does not call itself). */
let integrator: Odex | undefined;
// Trial steps of the integrator may overshoot separation; keep H1 where the correlations are defined.
const H1_FLOOR = 3.35;

/**
 * March Head's method from `startS` to the last station and write θ, H and cf into `out` for every
 * station with s > startS (stations before are left untouched; stations after separation get NaN).
 */
export function headMarch(input: TurbulentMarchInput, out: TurbulentStations): TurbulentMarchResult {
  const { s, ue, dUeds, radius, dRds, reynolds, startS, startTheta } = input;
  const n = s.length;
  let first = 0;
  while (first < n && s[first] <= startS) first++;
  const h1Start = entrainmentShapeFactor(TURBULENT_START_SHAPE_FACTOR);
  if (first >= n) {
    return { separationS: null, endTheta: startTheta, endShapeFactor: TURBULENT_START_SHAPE_FACTOR, endUe: interpolate(s, ue, startS, 0), lastIndex: n - 1 };
  }

  // Interval index cache: the integrator moves forward almost always, so the search is O(1).
  let k = Math.max(0, first - 1);
  const locate = (x: number): number => {
    while (k < n - 2 && x > s[k + 1]) k++;
    while (k > 0 && x < s[k]) k--;
    return k;
  };
  const derivative = (x: number, y: Float64Array, dy: Float64Array): void => {
    const j = locate(x);
    const w = (x - s[j]) / (s[j + 1] - s[j]);
    const u = ue[j] + w * (ue[j + 1] - ue[j]);
    const du = dUeds[j] + w * (dUeds[j + 1] - dUeds[j]);
    let logR = 0;
    if (radius !== null && dRds !== null) {
      const r = radius[j] + w * (radius[j + 1] - radius[j]);
      logR = (dRds[j] + w * (dRds[j + 1] - dRds[j])) / r;
    }
    const theta = y[0] > 1e-12 ? y[0] : 1e-12;
    const h1 = y[1] > H1_FLOOR ? y[1] : H1_FLOOR;
    const h = shapeFactorFromEntrainment(h1);
    const cf = ludwiegTillmannCf(h, Math.max(reynolds * u * theta, 10));
    const logU = du / u;
    const dTheta = 0.5 * cf - (h + 2) * theta * logU - theta * logR;
    dy[0] = dTheta;
    dy[1] = (entrainmentRate(h1) - h1 * (dTheta + theta * (logU + logR))) / theta;
  };

  const odex = (integrator ??= new Odex(2));
  const options = {
    relativeTolerance: 1e-6,
    absoluteTolerance: [1e-6 * startTheta, 1e-6],
    maxSteps: 1_000_000,
    initialStepSize: Math.min(s[first] - startS > 0 ? s[first] - startS : s[n - 1] - startS, (s[n - 1] - startS) / 8),
  };

  let next = first;
  let separationS: number | null = null;
  let endTheta = startTheta;
  let endH1 = h1Start;
  const fill = (j: number, theta: number, h1: number) => {
    const h = shapeFactorFromEntrainment(h1);
    out.theta[j] = theta;
    out.shapeFactor[j] = h;
    out.skinFriction[j] = ludwiegTillmannCf(h, reynolds * ue[j] * theta);
  };

  odex.solve(derivative, startS, [startTheta, h1Start], s[n - 1], options, (xOld, x, y) => {
    if (x === xOld) return true;
    const separated = y[1] <= H1_SEPARATION;
    let end = x;
    if (separated) {
      // Bisection on the dense output for the crossing of H = 2.4 inside this step.
      let a = xOld;
      let b = x;
      for (let it = 0; it < 50; it++) {
        const mid = 0.5 * (a + b);
        if (odex.dense(1, mid) <= H1_SEPARATION) b = mid;
        else a = mid;
      }
      end = 0.5 * (a + b);
    }
    while (next < n && s[next] <= end) {
      fill(next, odex.dense(0, s[next]), odex.dense(1, s[next]));
      next++;
    }
    if (separated) {
      separationS = end;
      endTheta = odex.dense(0, end);
      endH1 = H1_SEPARATION;
      return false;
    }
    endTheta = y[0];
    endH1 = y[1];
    return true;
  });

  for (let j = next; j < n; j++) {
    out.theta[j] = NaN;
    out.shapeFactor[j] = NaN;
    out.skinFriction[j] = NaN;
  }
  const lastIndex = next - 1;
  return {
    separationS,
    endTheta,
    endShapeFactor: shapeFactorFromEntrainment(endH1),
    endUe: separationS === null ? ue[n - 1] : interpolate(s, ue, separationS, lastIndex),
    lastIndex,
  };
}

function interpolate(s: ArrayLike<number>, f: ArrayLike<number>, x: number, hint: number): number {
  let j = Math.max(0, Math.min(hint, s.length - 2));
  while (j < s.length - 2 && x > s[j + 1]) j++;
  while (j > 0 && x < s[j]) j--;
  const w = (x - s[j]) / (s[j + 1] - s[j]);
  return f[j] + w * (f[j + 1] - f[j]);
}
