import { LuDecomposition, Matrix } from 'ml-matrix';
import { completeEllipticIntegrals } from './elliptic-integrals';

/**
 * Inviscid incompressible flow along the axis of a body of revolution at zero incidence by surface
 * source rings of constant strength on conical panels (J. L. Hess and A. M. O. Smith, "Calculation of
 * potential flow about arbitrary bodies", Progress in Aerospace Sciences 8, 1967, §4, axisymmetric
 * flow; also Katz & Plotkin, "Low-Speed Aerodynamics", 2nd ed., 2001, §10.4 for the ring kernels).
 *
 * A ring of radius R at axial station ξ carrying source strength q per unit length of its circumference
 * induces at (x, r), with A = (x − ξ)² + r² + R², B = 2 r R, ρ² = A − B, P² = A + B, m = 2B/P²:
 *   I1 = ∫₀^{2π} dθ/√(A − B cos θ) = 4 K(m)/P,   I3 = ∫ dθ/(A − B cos θ)^{3/2} = 4 E(m)/(ρ² P),
 *   Ic = ∫ cos θ dθ/(A − B cos θ)^{3/2} = (A I3 − I1)/B,
 *   u_x = q R (x − ξ) I3 / 4π,   u_r = q R (r I3 − R Ic) / 4π,
 * K, E the complete elliptic integrals (elliptic-integrals.ts). A panel's ring strengths are integrated
 * along its generator by Gauss–Legendre quadrature. On its own panel the two-dimensional line-source part
 * (q/2π · d/|d|², singular) is taken out of the integrand and added exactly: half the strength normal to
 * the panel, nothing along it at its midpoint; what is left is only logarithmically singular.
 * Zero normal velocity at the panel midpoints gives the strengths; the surface speed is the tangential
 * velocity there, Cp = 1 − (q/V∞)².
 *
 * The meridian runs from the nose (on the axis, r = 0) over the body to the tail (on the axis).
 */

export interface AxisymmetricSolution {
  /** Panel midpoints: axial station and body radius. */
  x: Float64Array;
  r: Float64Array;
  /** Arc length along the meridian from the nose, at the midpoints. */
  s: Float64Array;
  /** Surface speed on V∞ (positive from nose to tail) and pressure coefficient. */
  speed: Float64Array;
  cp: Float64Array;
}

export class BodyGeometryError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BodyGeometryError';
  }
}

const FOUR_PI = 4 * Math.PI;
const GAUSS_X = [-0.9602898564975363, -0.7966664774136267, -0.5255324099163290, -0.1834346424956498, 0.1834346424956498, 0.5255324099163290, 0.7966664774136267, 0.9602898564975363];
const GAUSS_W = [0.1012285362903763, 0.2223810344533745, 0.3137066458778873, 0.3626837833783620, 0.3626837833783620, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763];

/** Velocity (u_x, u_r) at (x, r) of a unit-strength ring (q = 1) of radius R at ξ. */
export function ringSourceVelocity(x: number, r: number, xi: number, radius: number): [number, number] {
  if (radius === 0) return [0, 0];
  const dx = x - xi;
  const rho2 = dx * dx + (r - radius) * (r - radius);
  const p2 = dx * dx + (r + radius) * (r + radius);
  const p = Math.sqrt(p2);
  const a = dx * dx + r * r + radius * radius;
  const b = 2 * r * radius;
  const { K, E } = completeEllipticIntegrals(rho2 / p2);
  const i3 = (4 * E) / (rho2 * p);
  let ic: number;
  const z = b / a;
  if (z < 1e-2) {
    // Series in z = B/A of ∫ cos θ (A − B cos θ)^{−3/2} dθ, avoiding the cancellation in (A I3 − I1)/B.
    ic = (Math.PI / (a * Math.sqrt(a))) * z * (1.5 + z * z * ((105 / 64) + z * z * (3465 / 2048)));
  } else {
    ic = (a * i3 - (4 * K) / p) / b;
  }
  const f = radius / FOUR_PI;
  return [f * dx * i3, f * (r * i3 - radius * ic)];
}

export function axisymmetricPanels(xNodes: ArrayLike<number>, rNodes: ArrayLike<number>): AxisymmetricSolution {
  const n = xNodes.length - 1;
  if (n < 4) throw new BodyGeometryError('needs at least 5 points');
  if (rNodes[0] !== 0 || rNodes[n] !== 0) throw new BodyGeometryError('the meridian must start and end on the axis (r = 0)');
  const xm = new Float64Array(n), rm = new Float64Array(n), len = new Float64Array(n);
  const tx = new Float64Array(n), tr = new Float64Array(n), nx = new Float64Array(n), nr = new Float64Array(n);
  const s = new Float64Array(n);
  let along = 0;
  for (let j = 0; j < n; j++) {
    const dx = xNodes[j + 1] - xNodes[j];
    const dr = rNodes[j + 1] - rNodes[j];
    const l = Math.hypot(dx, dr);
    if (!(l > 0)) throw new BodyGeometryError(`points ${j + 1} and ${j + 2} coincide`);
    if (rNodes[j + 1] < 0) throw new BodyGeometryError(`point ${j + 2}: body radius must not be negative`);
    len[j] = l;
    tx[j] = dx / l;
    tr[j] = dr / l;
    // Outward normal, left of the direction of travel from nose to tail over the top of the meridian.
    nx[j] = -tr[j];
    nr[j] = tx[j];
    xm[j] = 0.5 * (xNodes[j] + xNodes[j + 1]);
    rm[j] = 0.5 * (rNodes[j] + rNodes[j + 1]);
    s[j] = along + 0.5 * l;
    along += l;
  }
  const normal = new Matrix(n, n);
  const tangent = new Matrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const [ux, ur] = panelInfluence(xm[i], rm[i], xNodes[j], rNodes[j], xNodes[j + 1], rNodes[j + 1], i === j);
      let un = ux * nx[i] + ur * nr[i];
      const ut = ux * tx[i] + ur * tr[i];
      if (i === j) un += 0.5; // the two-dimensional part on its own panel: σ/2 on the outer side
      normal.set(i, j, un);
      tangent.set(i, j, ut);
    }
  }
  const lu = new LuDecomposition(normal);
  if (lu.isSingular()) throw new BodyGeometryError('the panel system is singular: check for crossing or folded surfaces');
  const rhs = Matrix.columnVector(Array.from(nx, (v) => -v));
  const sigma = lu.solve(rhs);
  const ut = tangent.mmul(sigma);
  const speed = new Float64Array(n);
  const cp = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    speed[i] = ut.get(i, 0) + tx[i];
    cp[i] = 1 - speed[i] * speed[i];
  }
  return { x: xm, r: rm, s, speed, cp };
}

/**
 * Velocity at (x, r) of a conical panel from (x1, r1) to (x2, r2) with unit source strength per unit
 * area. On its own panel the two-dimensional source part is left out (it is added by the caller).
 */
function panelInfluence(x: number, r: number, x1: number, r1: number, x2: number, r2: number, own: boolean): [number, number] {
  const l = Math.hypot(x2 - x1, r2 - r1);
  let ux = 0;
  let ur = 0;
  if (own) {
    // Each half from the midpoint outwards, with ξ = t² to weaken the logarithmic singularity at t = 0.
    for (const end of [0, 1]) {
      const ex = end === 0 ? x1 : x2;
      const er = end === 0 ? r1 : r2;
      for (let k = 0; k < 8; k++) {
        const t = 0.5 * (GAUSS_X[k] + 1);
        const f = t * t;
        const px = x + f * (ex - x);
        const pr = r + f * (er - r);
        const weight = 0.5 * GAUSS_W[k] * 2 * t * (0.5 * l);
        const [vx, vr] = ringSourceVelocity(x, r, px, pr);
        const dx = x - px;
        const dr = r - pr;
        const d2 = dx * dx + dr * dr;
        ux += weight * (vx - dx / (2 * Math.PI * d2));
        ur += weight * (vr - dr / (2 * Math.PI * d2));
      }
    }
    return [ux, ur];
  }
  const mx = 0.5 * (x1 + x2);
  const mr = 0.5 * (r1 + r2);
  const distance = Math.hypot(x - mx, r - mr);
  const pieces = Math.min(64, Math.max(1, Math.ceil((2 * l) / distance)));
  for (let p = 0; p < pieces; p++) {
    for (let k = 0; k < 8; k++) {
      const f = (p + 0.5 * (GAUSS_X[k] + 1)) / pieces;
      const px = x1 + f * (x2 - x1);
      const pr = r1 + f * (r2 - r1);
      const weight = (0.5 * GAUSS_W[k] * l) / pieces;
      const [vx, vr] = ringSourceVelocity(x, r, px, pr);
      ux += weight * vx;
      ur += weight * vr;
    }
  }
  return [ux, ur];
}
