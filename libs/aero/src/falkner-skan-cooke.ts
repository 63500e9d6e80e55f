import { FSC_TABLE } from './falkner-skan-cooke-table';
import { Solver } from './odex-solver';

/**
 * Falkner–Skan–Cooke similarity profiles of the infinite swept wing, solved by shooting with odex and
 * tabulated once (on first use) over the Hartree parameter β.
 *
 * Source: V. M. Falkner & S. W. Skan, Phil. Mag. 12 (1931) 865–896 and D. R. Hartree, Proc. Camb. Phil.
 * Soc. 33 (1937) 223–239 for the chordwise profile; J. C. Cooke, "The boundary layer of a class of
 * infinite yawed cylinders", Proc. Camb. Phil. Soc. 46 (1950) 645–648 for the spanwise one. With the
 * chordwise edge velocity Ue = C x^m, β = 2m/(m + 1), η = y √((m + 1) Ue / (2 ν x)),
 * u = Ue f'(η), w = We g(η), We constant (no spanwise pressure gradient):
 *   f''' + f f'' + β (1 − f'²) = 0,   f(0) = f'(0) = 0, f'(∞) = 1,
 *   g'' + f g' = 0,                   g(0) = 0,          g(∞) = 1.
 * f''(0) is found by Newton's method on f'(η_max) = 1 with the variational equations; the spanwise
 * equation is linear, so g is integrated once with g'(0) = 1 and scaled by 1/g(η_max).
 *
 * Crossflow in external-streamline axes: with ψ the angle of the external streamline to the chordwise
 * direction (tan ψ = We/Ue), the velocity across it is w_n / Qe = sin ψ cos ψ (g − f'), so its profile
 * shape f' − g depends on β alone and the sweep only scales it. Each table row keeps the maximum of
 * f' − g, the height where it has fallen to a tenth of that above the maximum (the Owen–Randall
 * thickness), and the integrals needed for the streamwise shape factor and the crossflow displacement
 * thickness. At β = 0, g = f' exactly (no crossflow); β > 0 (favourable gradient) gives f' > g.
 */

export interface FalknerSkanCookeProfile {
  beta: number;
  /** f''(0). */
  wallShear: number;
  /** g'(0). */
  spanwiseWallShear: number;
  /** ∫ (1 − f') dη. */
  displacement: number;
  /** ∫ f' (1 − f') dη. */
  momentum: number;
  /** ∫ (1 − g) dη. */
  spanwiseDisplacement: number;
  /** ∫ g (1 − g) dη. */
  spanwiseMomentum: number;
  /** ∫ [f' (1 − g) + g (1 − f')] dη. */
  mixedMomentum: number;
  /** f' − g at its largest magnitude (signed). */
  crossflowMax: number;
  /** η of that maximum. */
  crossflowMaxEta: number;
  /** η above the maximum where |f' − g| has fallen to a tenth of it. */
  crossflowEdgeEta: number;
  /** ∫ (f' − g) dη. */
  crossflowIntegral: number;
  /** λ = θ² (dUe/dx)/ν of the profile, = β (∫ f'(1 − f') dη)². */
  lambda: number;
}

const ETA_MAX = 12;
const SAMPLE_STEP = 0.01;

/** Solve one Falkner–Skan–Cooke profile; `guess` is a starting value for f''(0). */
export function falknerSkanCooke(beta: number, guess = 0.4696 + 0.8 * beta): FalknerSkanCookeProfile {
  const solver = new Solver(8);
  solver.relativeTolerance = 1e-10;
  solver.absoluteTolerance = 1e-10;
  solver.maxSteps = 20_000;
  // f, f', f'', and ∂/∂f''(0) of them: p''' = −(p f'' + f p'') + 2β f' p'.
  const variational = (_eta: number, y: number[]) => [
    y[1],
    y[2],
    -y[0] * y[2] - beta * (1 - y[1] * y[1]),
    y[4],
    y[5],
    -(y[3] * y[2] + y[0] * y[5]) + 2 * beta * y[1] * y[4],
    0,
    0,
  ];
  // Newton's method first to a short outer edge, where a poor guess cannot run away, then to η_max.
  let w = guess;
  let converged = false;
  for (const etaEnd of [5, ETA_MAX]) {
    converged = false;
    for (let iteration = 0; iteration < 40 && !converged; iteration++) {
      let runaway = false;
      const end = solver.solve(variational, 0, [0, 0, w, 0, 0, 1, 0, 0], etaEnd, (_n, _x0, _x1, y) => {
        runaway = !(Math.abs(y[1]) < 3);
        return !runaway;
      });
      const slope = end.y[4];
      if (runaway || !(slope > 0)) {
        w = runaway && end.y[1] > 0 ? 0.8 * w : w + 0.05;
        continue;
      }
      const step = (end.y[1] - 1) / slope;
      w -= Math.max(-0.2, Math.min(0.2, step));
      converged = Math.abs(step) < 1e-9;
    }
  }
  if (!converged || !(w >= 0)) throw new Error(`Falkner–Skan–Cooke shooting did not converge for beta ${beta}`);

  // The converged profile with the spanwise equation, sampled on a uniform grid from the dense output.
  const profile = new Solver(5);
  profile.relativeTolerance = 1e-10;
  profile.absoluteTolerance = 1e-10;
  profile.maxSteps = 20_000;
  profile.denseOutput = true;
  const samples = Math.round(ETA_MAX / SAMPLE_STEP) + 1;
  const fp = new Float64Array(samples);
  const g = new Float64Array(samples);
  let next = 0;
  profile.solve(
    (_eta, y) => [y[1], y[2], -y[0] * y[2] - beta * (1 - y[1] * y[1]), y[4], -y[0] * y[4]],
    0,
    [0, 0, w, 0, 1],
    ETA_MAX,
    (_n, _x0, x, y, dense) => {
      while (next < samples && next * SAMPLE_STEP <= x + 1e-12) {
        const eta = next * SAMPLE_STEP;
        fp[next] = dense && eta < x ? dense(1, eta) : y[1];
        g[next] = dense && eta < x ? dense(3, eta) : y[3];
        next++;
      }
      return true;
    },
  );
  const gEdge = g[samples - 1];
  for (let i = 0; i < samples; i++) g[i] /= gEdge;

  // Simpson's rule over the samples (an even number of intervals).
  const simpson = (value: (i: number) => number) => {
    let sum = value(0) + value(samples - 1);
    for (let i = 1; i < samples - 1; i++) sum += (i % 2 === 1 ? 4 : 2) * value(i);
    return (sum * SAMPLE_STEP) / 3;
  };
  const displacement = simpson((i) => 1 - fp[i]);
  const momentum = simpson((i) => fp[i] * (1 - fp[i]));
  let maxIndex = 0;
  for (let i = 1; i < samples; i++) if (Math.abs(fp[i] - g[i]) > Math.abs(fp[maxIndex] - g[maxIndex])) maxIndex = i;
  const crossflowMax = refineExtremum(fp, g, maxIndex);
  let edge = ETA_MAX;
  for (let i = maxIndex + 1; i < samples; i++) {
    const c = Math.abs(fp[i] - g[i]);
    if (c <= 0.1 * Math.abs(crossflowMax.value)) {
      const c0 = Math.abs(fp[i - 1] - g[i - 1]);
      const target = 0.1 * Math.abs(crossflowMax.value);
      edge = (i - 1 + (c0 - target) / (c0 - c)) * SAMPLE_STEP;
      break;
    }
  }
  return {
    beta,
    wallShear: w,
    spanwiseWallShear: 1 / gEdge,
    displacement,
    momentum,
    spanwiseDisplacement: simpson((i) => 1 - g[i]),
    spanwiseMomentum: simpson((i) => g[i] * (1 - g[i])),
    mixedMomentum: simpson((i) => fp[i] * (1 - g[i]) + g[i] * (1 - fp[i])),
    crossflowMax: crossflowMax.value,
    crossflowMaxEta: crossflowMax.eta,
    crossflowEdgeEta: beta === 0 ? 0 : edge,
    crossflowIntegral: simpson((i) => fp[i] - g[i]),
    lambda: beta * momentum * momentum,
  };
}

/** The extremum of f' − g near sample k, from the parabola through its neighbours. */
function refineExtremum(fp: Float64Array, g: Float64Array, k: number): { value: number; eta: number } {
  if (k <= 0 || k >= fp.length - 1) return { value: fp[k] - g[k], eta: k * SAMPLE_STEP };
  const a = fp[k - 1] - g[k - 1];
  const b = fp[k] - g[k];
  const c = fp[k + 1] - g[k + 1];
  const curvature = a - 2 * b + c;
  if (curvature === 0) return { value: b, eta: k * SAMPLE_STEP };
  const offset = (0.5 * (a - c)) / curvature;
  return { value: b - 0.25 * (a - c) * offset, eta: (k + offset) * SAMPLE_STEP };
}

/**
 * The β of the table: close steps near laminar separation (β = −0.1988), then 0.025 up to strong
 * acceleration. The table itself (falkner-skan-cooke-table.ts) is written by
 * `npx tsx libs/aero/scripts/make-fsc-table.ts` with `falknerSkanCooke` above, so no analysis solves an
 * ODE; falkner-skan-cooke.spec.ts solves every row again and compares.
 */
export const FSC_TABLE_BETAS: readonly number[] = [-0.19, -0.18, -0.17, -0.16, ...Array.from({ length: 71 }, (_, i) => Number((-0.15 + 0.025 * i).toFixed(3)))];

/** Solve every row of the table, by continuation from Blasius outwards in both directions. */
export function computeFalknerSkanCookeTable(): FalknerSkanCookeProfile[] {
  const betas = FSC_TABLE_BETAS;
  const start = betas.indexOf(0);
  const rows = new Array<FalknerSkanCookeProfile>(betas.length);
  rows[start] = falknerSkanCooke(0, 0.4696);
  for (let i = start + 1; i < betas.length; i++) rows[i] = falknerSkanCooke(betas[i], extrapolate(rows, betas, i, -1));
  for (let i = start - 1; i >= 0; i--) rows[i] = falknerSkanCooke(betas[i], extrapolate(rows, betas, i, 1));
  return rows;
}

function extrapolate(rows: FalknerSkanCookeProfile[], betas: readonly number[], i: number, direction: 1 | -1): number {
  const a = rows[i + direction];
  const b = rows[i + 2 * direction];
  if (b === undefined) return a.wallShear;
  return a.wallShear + ((a.wallShear - b.wallShear) / (a.beta - b.beta)) * (betas[i] - a.beta);
}

/** What the crossflow estimate needs from the similarity profile, interpolated at one λ. */
export interface CrossflowShape {
  beta: number;
  /** Shape factor ∫(1 − f')/∫f'(1 − f') of the chordwise profile. */
  chordwiseShapeFactor: number;
  /** max (f' − g). */
  crossflowMax: number;
  /** Owen–Randall thickness over the chordwise momentum thickness, η₁₀ / ∫f'(1 − f'). */
  crossflowEdgeOverTheta: number;
  /** ∫(f' − g) dη / ∫f'(1 − f') dη. */
  crossflowIntegralOverTheta: number;
  /** ∫(1 − g) dη / ∫f'(1 − f') dη. */
  spanwiseDisplacementOverTheta: number;
  /** ∫ g(1 − g) dη / ∫f'(1 − f') dη. */
  spanwiseMomentumOverTheta: number;
  /** ∫ [f'(1 − g) + g(1 − f')] dη / ∫f'(1 − f') dη. */
  mixedMomentumOverTheta: number;
}

/**
 * The similarity profile with the same pressure-gradient parameter λ = θ² (dUe/ds)/ν as the integral
 * layer (local similarity in λ), linearly interpolated in the table; λ outside the table is clamped.
 */
export function crossflowShapeAtLambda(lambda: number, out: CrossflowShape): CrossflowShape {
  const rows = FSC_TABLE;
  let hi = 1;
  if (lambda <= rows[0].lambda) hi = 1;
  else if (lambda >= rows[rows.length - 1].lambda) hi = rows.length - 1;
  else {
    let lo = 0;
    hi = rows.length - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (rows[mid].lambda <= lambda) lo = mid;
      else hi = mid;
    }
  }
  const a = rows[hi - 1];
  const b = rows[hi];
  const t = Math.max(0, Math.min(1, (lambda - a.lambda) / (b.lambda - a.lambda)));
  const mix = (p: number, q: number) => p + t * (q - p);
  const thetaA = a.momentum;
  const thetaB = b.momentum;
  out.beta = mix(a.beta, b.beta);
  out.chordwiseShapeFactor = mix(a.displacement / thetaA, b.displacement / thetaB);
  out.crossflowMax = mix(a.crossflowMax, b.crossflowMax);
  out.crossflowEdgeOverTheta = mix(a.crossflowEdgeEta / thetaA, b.crossflowEdgeEta / thetaB);
  out.crossflowIntegralOverTheta = mix(a.crossflowIntegral / thetaA, b.crossflowIntegral / thetaB);
  out.spanwiseDisplacementOverTheta = mix(a.spanwiseDisplacement / thetaA, b.spanwiseDisplacement / thetaB);
  out.spanwiseMomentumOverTheta = mix(a.spanwiseMomentum / thetaA, b.spanwiseMomentum / thetaB);
  out.mixedMomentumOverTheta = mix(a.mixedMomentum / thetaA, b.mixedMomentum / thetaB);
  return out;
}

export function emptyCrossflowShape(): CrossflowShape {
  return {
    beta: 0,
    chordwiseShapeFactor: 0,
    crossflowMax: 0,
    crossflowEdgeOverTheta: 0,
    crossflowIntegralOverTheta: 0,
    spanwiseDisplacementOverTheta: 0,
    spanwiseMomentumOverTheta: 0,
    mixedMomentumOverTheta: 0,
  };
}
