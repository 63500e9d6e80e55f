import { LuDecomposition, Matrix, QrDecomposition } from 'ml-matrix';

/**
 * Two-dimensional inviscid incompressible flow about a section by linear-strength vortex panels with
 * the Kutta condition (J. Katz and A. Plotkin, "Low-Speed Aerodynamics", 2nd ed., Cambridge University
 * Press, 2001, §11.4.2, "Linear-strength vortex method").
 *
 * The surface is N straight panels between N + 1 nodes running trailing edge → upper surface → nose →
 * lower surface → trailing edge (counter-clockwise). The vortex strength varies linearly on each panel
 * and is continuous at the nodes, γ_0 … γ_N (clockwise positive). Zero normal velocity at the panel
 * midpoints gives N equations; the Kutta condition γ_0 + γ_N = 0 closes the system. On a panel of length
 * l, in its own frame (x′ along it from its first node, y′ to the left), with r1, r2 the distances to
 * its ends and Δθ the angle it subtends, the velocity induced by a unit constant strength is
 *   u′ = Δθ/2π,  v′ = −ln(r1/r2)/2π      (Katz & Plotkin eq. 10.39–10.40),
 * and by the linear part γ = ξ/l
 *   u′ = [x′ Δθ − y′ ln(r1/r2)]/(2π l),  v′ = −[x′ ln(r1/r2) − l + y′ Δθ]/(2π l)   (their eq. 10.72).
 * The system depends on the shape alone, so it is factorised once (LU, ml-matrix) and solved for the
 * free stream along x and along y; any incidence is their combination cos α · (…) + sin α · (…).
 *
 * The flow inside the closed sheet is at rest, so the surface speed equals the local sheet strength,
 * Q_t = γ (Katz & Plotkin §11.4.2); it is taken at the panel midpoints, ½(γ_j + γ_{j+1}). (The tangential
 * velocity summed over the flat panels at a midpoint converges only to first order in the panel size,
 * the sheet strength to second order: see vortex-panel.spec.ts.) Forces
 * come from integrating Cp round the surface; lift also by Kutta–Joukowski, cl = 2Γ/(V∞ c).
 * Lengths are divided by the chord (unit chord expected, moment about x = 0.25, y = 0).
 */

export interface VortexPanelSolver {
  panels: number;
  /** Panel midpoints. */
  xm: Float64Array;
  ym: Float64Array;
  /** Panel lengths and outward normals. */
  length: Float64Array;
  nx: Float64Array;
  ny: Float64Array;
  /** Tangential surface speed (along the loop direction) for a free stream along x and along y. */
  speedX: Float64Array;
  speedY: Float64Array;
  /** Node vortex strengths (clockwise positive) for a free stream along x and along y. */
  gammaX: Float64Array;
  gammaY: Float64Array;
  /** Clockwise circulation for a free stream along x and along y. */
  circulationX: number;
  circulationY: number;
}

export interface VortexPanelSolution {
  alphaRad: number;
  /** Signed tangential speed at the midpoints, along the loop direction, on V∞. */
  speed: Float64Array;
  cp: Float64Array;
  /** Lift, pressure drag (≈ 0 in potential flow: a check) and moment about the quarter chord, by Cp integration. */
  cl: number;
  cd: number;
  cm: number;
  /** Lift by Kutta–Joukowski from the circulation. */
  clCirculation: number;
}

export class PanelGeometryError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PanelGeometryError';
  }
}

const TWO_PI = 2 * Math.PI;

/** Build and factorise the influence system of the loop (nodes x, y). */
export function vortexPanelSolver(x: ArrayLike<number>, y: ArrayLike<number>): VortexPanelSolver {
  const nodes = x.length;
  const n = nodes - 1;
  if (n < 4) throw new PanelGeometryError('needs at least 4 panels');
  const xm = new Float64Array(n), ym = new Float64Array(n), length = new Float64Array(n);
  const cosP = new Float64Array(n), sinP = new Float64Array(n), nx = new Float64Array(n), ny = new Float64Array(n);
  let area = 0;
  for (let j = 0; j < n; j++) {
    const dx = x[j + 1] - x[j];
    const dy = y[j + 1] - y[j];
    const l = Math.hypot(dx, dy);
    if (!(l > 0)) throw new PanelGeometryError(`points ${j + 1} and ${j + 2} coincide`);
    length[j] = l;
    cosP[j] = dx / l;
    sinP[j] = dy / l;
    xm[j] = 0.5 * (x[j] + x[j + 1]);
    ym[j] = 0.5 * (y[j] + y[j + 1]);
    area += x[j] * y[j + 1] - x[j + 1] * y[j];
  }
  if (!(area > 0)) throw new PanelGeometryError('the loop must run from the trailing edge over the upper surface to the nose and back along the lower surface');
  // Outward normal: right of the direction of travel on a counter-clockwise loop.
  for (let j = 0; j < n; j++) {
    nx[j] = sinP[j];
    ny[j] = -cosP[j];
  }

  const normal = new Matrix(n + 1, n + 1);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const l = length[j];
      const px = xm[i] - x[j];
      const py = ym[i] - y[j];
      const xl = px * cosP[j] + py * sinP[j];
      const yl = -px * sinP[j] + py * cosP[j];
      let dTheta: number;
      let logRatio: number;
      if (i === j) {
        // Own midpoint (only the normal velocity is used, which is continuous through the sheet).
        dTheta = -Math.PI;
        logRatio = 0;
      } else {
        dTheta = Math.atan2(yl, xl - l) - Math.atan2(yl, xl);
        if (dTheta > Math.PI) dTheta -= TWO_PI;
        else if (dTheta < -Math.PI) dTheta += TWO_PI;
        const r1 = Math.hypot(xl, yl);
        const r2 = Math.hypot(xl - l, yl);
        logRatio = Math.log(r1 / r2);
      }
      const uc = dTheta / TWO_PI;
      const vc = -logRatio / TWO_PI;
      const ul = (xl * dTheta - yl * logRatio) / (TWO_PI * l);
      const vl = -(xl * logRatio - l + yl * dTheta) / (TWO_PI * l);
      // Start-node and end-node parts in the panel frame, then in the global frame.
      const ua = uc - ul, va = vc - vl;
      const gxa = ua * cosP[j] - va * sinP[j], gya = ua * sinP[j] + va * cosP[j];
      const gxb = ul * cosP[j] - vl * sinP[j], gyb = ul * sinP[j] + vl * cosP[j];
      normal.set(i, j, normal.get(i, j) + gxa * nx[i] + gya * ny[i]);
      normal.set(i, j + 1, normal.get(i, j + 1) + gxb * nx[i] + gyb * ny[i]);
    }
  }
  // Kutta condition at the trailing edge.
  normal.set(n, 0, 1);
  normal.set(n, n, 1);
  // At a closed trailing edge the two end nodes coincide, and there equal and opposite strengths (which the
  // Kutta condition allows) induce almost nothing elsewhere — exactly nothing at a cusp — so the square
  // system is nearly singular and the strengths near the trailing edge are left undetermined. One more
  // equation fixes that mode: the trailing-edge strength equals its linear extrapolation (in arc length)
  // from the two nodes before it on each side. The N + 2 equations are solved by least squares (QR);
  // with an open trailing edge the square system is solved as it stands.
  const gap = Math.hypot(x[0] - x[n], y[0] - y[n]);
  const closedTrailingEdge = gap < 0.1 * Math.min(length[0], length[n - 1]);
  const rows = closedTrailingEdge ? n + 2 : n + 1;
  const system = closedTrailingEdge ? new Matrix(rows, n + 1) : normal;
  if (closedTrailingEdge) {
    for (let i = 0; i <= n; i++) for (let j = 0; j <= n; j++) system.set(i, j, normal.get(i, j));
    const ru = length[0] / length[1];
    const rl = length[n - 1] / length[n - 2];
    // γ_0 − [γ_1 + (γ_1 − γ_2) ru] − γ_N + [γ_{N−1} + (γ_{N−1} − γ_{N−2}) rl] = 0
    system.set(n + 1, 0, 1);
    system.set(n + 1, 1, -(1 + ru));
    system.set(n + 1, 2, ru);
    system.set(n + 1, n, -1);
    system.set(n + 1, n - 1, 1 + rl);
    system.set(n + 1, n - 2, -rl);
  }
  const rhsX = new Matrix(rows, 2);
  for (let i = 0; i < n; i++) {
    rhsX.set(i, 0, -nx[i]);
    rhsX.set(i, 1, -ny[i]);
  }
  let gamma: Matrix;
  if (closedTrailingEdge) {
    gamma = new QrDecomposition(system).solve(rhsX);
  } else {
    const lu = new LuDecomposition(system);
    if (lu.isSingular()) throw new PanelGeometryError('the panel system is singular: check for crossing or folded surfaces');
    gamma = lu.solve(rhsX);
  }
  const gammaX = Float64Array.from({ length: n + 1 }, (_, j) => gamma.get(j, 0));
  const gammaY = Float64Array.from({ length: n + 1 }, (_, j) => gamma.get(j, 1));
  let circulationX = 0;
  let circulationY = 0;
  for (let i = 0; i < n; i++) {
    circulationX += 0.5 * (gammaX[i] + gammaX[i + 1]) * length[i];
    circulationY += 0.5 * (gammaY[i] + gammaY[i + 1]) * length[i];
  }
  if (!closedTrailingEdge) {
    // A thin open trailing edge (the NACA formulas leave 0.2 % of t) keeps the square system, whose
    // circulation is right, but its two end strengths still carry a spike of the nearly singular mode
    // above; the surface speed on the two end panels takes each end strength by linear extrapolation
    // from its own side instead (the circulation keeps the solved values).
    for (const g of [gammaX, gammaY]) {
      g[0] = g[1] + ((g[1] - g[2]) * length[0]) / length[1];
      g[n] = g[n - 1] + ((g[n - 1] - g[n - 2]) * length[n - 1]) / length[n - 2];
    }
  }
  const speedX = new Float64Array(n);
  const speedY = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    speedX[i] = -0.5 * (gammaX[i] + gammaX[i + 1]);
    speedY[i] = -0.5 * (gammaY[i] + gammaY[i + 1]);
  }
  return { panels: n, xm, ym, length, nx, ny, speedX, speedY, gammaX, gammaY, circulationX, circulationY };
}

/**
 * The solution at incidence α (radians). `correct` maps the incompressible Cp to the reported one
 * (a compressibility rule); forces are integrated from the reported Cp.
 */
export function vortexPanelAt(solver: VortexPanelSolver, alphaRad: number, correct?: (cp0: number) => number): VortexPanelSolution {
  const { panels: n, xm, ym, length, nx, ny, speedX, speedY } = solver;
  const ca = Math.cos(alphaRad);
  const sa = Math.sin(alphaRad);
  const speed = new Float64Array(n);
  const cp = new Float64Array(n);
  let fx = 0, fy = 0, moment = 0;
  for (let i = 0; i < n; i++) {
    const q = ca * speedX[i] + sa * speedY[i];
    speed[i] = q;
    const c0 = 1 - q * q;
    const c = correct === undefined ? c0 : correct(c0);
    cp[i] = c;
    const px = -c * nx[i] * length[i];
    const py = -c * ny[i] * length[i];
    fx += px;
    fy += py;
    moment -= (xm[i] - 0.25) * py - ym[i] * px;
  }
  return {
    alphaRad,
    speed,
    cp,
    cl: fy * ca - fx * sa,
    cd: fx * ca + fy * sa,
    cm: moment,
    clCirculation: 2 * (ca * solver.circulationX + sa * solver.circulationY),
  };
}

/**
 * The incidence at which the integrated lift (with the same `correct`) equals `targetCl`: a start from
 * the circulation, cl = 2(Γx cos α + Γy sin α), refined by the secant method.
 */
export function vortexPanelAtLift(solver: VortexPanelSolver, targetCl: number, correct?: (cp0: number) => number): VortexPanelSolution {
  const gx = solver.circulationX;
  const gy = solver.circulationY;
  const amplitude = 2 * Math.hypot(gx, gy);
  const phase = Math.atan2(gy, gx);
  const ratio = targetCl / amplitude;
  if (Math.abs(ratio) >= 0.9) throw new PanelGeometryError(`lift coefficient ${targetCl} is beyond what this section reaches in potential flow`);
  // 2(Γx cos α + Γy sin α) = A cos(α − phase): the root of smaller magnitude.
  const candidates = [phase - Math.acos(ratio), phase + Math.acos(ratio)].map((a) => Math.atan2(Math.sin(a), Math.cos(a)));
  let a0 = Math.abs(candidates[0]) < Math.abs(candidates[1]) ? candidates[0] : candidates[1];
  let s0 = vortexPanelAt(solver, a0, correct);
  let a1 = a0 + 0.01;
  let s1 = vortexPanelAt(solver, a1, correct);
  for (let k = 0; k < 30 && Math.abs(s1.cl - targetCl) > 1e-10; k++) {
    const slope = (s1.cl - s0.cl) / (a1 - a0);
    if (!(Math.abs(slope) > 1e-12)) break;
    const a2 = a1 + (targetCl - s1.cl) / slope;
    a0 = a1;
    s0 = s1;
    a1 = Math.max(-Math.PI / 2, Math.min(Math.PI / 2, a2));
    s1 = vortexPanelAt(solver, a1, correct);
  }
  if (Math.abs(s1.cl - targetCl) > 1e-6) throw new PanelGeometryError(`no incidence gives lift coefficient ${targetCl}`);
  return s1;
}
