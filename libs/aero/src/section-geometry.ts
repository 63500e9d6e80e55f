import { Matrix, solve } from 'ml-matrix';
import { naturalCubicSpline } from './cubic-spline';

/**
 * Geometry of a section given as a unit-chord loop (trailing edge → upper surface → nose → lower
 * surface → trailing edge, leading edge at the origin): maximum thickness and camber with their
 * positions, the leading-edge radius, the trailing-edge gap, and a re-panelled loop for the panel method.
 *
 * The loop is interpolated by natural cubic splines x(s), y(s) in arc length (cubic-spline.ts).
 * Thickness and camber are taken vertically, yU(x) − yL(x) and ½(yU + yL), common practice for stating
 * them (the NACA definitions lay thickness off normal to the mean line; the difference in the maximum is
 * of order t·(dyc/dx)², under 0.1 % of t for usual cambers).
 *
 * Leading-edge radius: the radius of curvature at the nose, R = (1 + x'²)^{3/2} / |x''|, of a
 * least-squares fit x(y) to the seven points round the foremost one (see below). For a cambered NACA
 * section the geometric radius there differs from the published 1.1019 t² by up to about 3 % (the
 * thickness is laid off along the tilted mean-line normal). Checked against the NACA four-digit value
 * R = 1.1019 t² (NACA Report 460, 1933).
 */
export interface SectionGeometry {
  thickness: number;
  thicknessAt: number;
  camber: number;
  camberAt: number;
  leadingEdgeRadius: number;
  trailingEdgeGap: number;
  /** Sampled mean line and thickness for plots, at `x`. */
  x: number[];
  camberLine: number[];
  thicknessLine: number[];
}

export function leadingEdgeIndex(x: ArrayLike<number>): number {
  let best = 0;
  for (let i = 1; i < x.length; i++) if (x[i] < x[best]) best = i;
  return best;
}

function arcLength(x: ArrayLike<number>, y: ArrayLike<number>): Float64Array {
  const s = new Float64Array(x.length);
  for (let i = 1; i < x.length; i++) s[i] = s[i - 1] + Math.hypot(x[i] - x[i - 1], y[i] - y[i - 1]);
  return s;
}

export function sectionGeometry(x: readonly number[], y: readonly number[], samples = 201): SectionGeometry {
  const n = x.length;
  const le = leadingEdgeIndex(x);
  const s = arcLength(x, y);
  const sx = naturalCubicSpline(s, x);
  const sy = naturalCubicSpline(s, y);
  // Dense samples of each surface, ordered nose → trailing edge.
  const dense = 2000;
  const upper: { x: number[]; y: number[] } = { x: [], y: [] };
  const lower: { x: number[]; y: number[] } = { x: [], y: [] };
  for (let k = 0; k <= dense; k++) {
    const f = 0.5 * (1 - Math.cos((Math.PI * k) / dense));
    const su = s[le] * (1 - f);
    const sl = s[le] + (s[n - 1] - s[le]) * f;
    upper.x.push(sx.at(su));
    upper.y.push(sy.at(su));
    lower.x.push(sx.at(sl));
    lower.y.push(sy.at(sl));
  }
  const xs: number[] = [];
  const camberLine: number[] = [];
  const thicknessLine: number[] = [];
  let thickness = 0, thicknessAt = 0, camber = 0, camberAt = 0;
  const x0 = x[le];
  const x1 = Math.min(x[0], x[n - 1]);
  for (let k = 0; k < samples; k++) {
    const xc = x0 + (x1 - x0) * 0.5 * (1 - Math.cos((Math.PI * k) / (samples - 1)));
    const yu = interpolate(upper.x, upper.y, xc);
    const yl = interpolate(lower.x, lower.y, xc);
    xs.push(xc);
    camberLine.push(0.5 * (yu + yl));
    thicknessLine.push(yu - yl);
  }
  // Maxima on a fine grid so the reported position does not depend on `samples`.
  for (let k = 0; k <= 4000; k++) {
    const xc = x0 + ((x1 - x0) * k) / 4000;
    const yu = interpolate(upper.x, upper.y, xc);
    const yl = interpolate(lower.x, lower.y, xc);
    if (yu - yl > thickness) {
      thickness = yu - yl;
      thicknessAt = xc;
    }
    const c = 0.5 * (yu + yl);
    if (Math.abs(c) > Math.abs(camber)) {
      camber = c;
      camberAt = xc;
    }
  }
  return {
    thickness,
    thicknessAt,
    camber,
    camberAt,
    leadingEdgeRadius: leadingEdgeRadius(x, y, le),
    trailingEdgeGap: Math.hypot(x[0] - x[n - 1], y[0] - y[n - 1]),
    x: xs,
    camberLine,
    thicknessLine,
  };
}

function interpolate(xs: readonly number[], ys: readonly number[], at: number): number {
  // xs increases from the nose (a few leading samples may step back round a cambered nose).
  if (at <= xs[0]) return ys[0];
  let lo = 0;
  let hi = xs.length - 1;
  if (at >= xs[hi]) return ys[hi];
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= at) lo = mid;
    else hi = mid;
  }
  const f = (at - xs[lo]) / (xs[hi] - xs[lo]);
  return ys[lo] + f * (ys[hi] - ys[lo]);
}

function leadingEdgeRadius(x: readonly number[], y: readonly number[], le: number): number {
  const n = x.length;
  // Seven points round the foremost one. The fit is x = c0 + c1 y + c2 y² + c3 y³ + c4 |y|³: the |y|³ term
  // carries the sign change of the cubic term between the surfaces of a √x-type nose (NACA thickness),
  // without which the fitted radius converges only to first order in the point spacing.
  const used: number[] = [];
  for (let d = -3; d <= 3; d++) if (le + d >= 0 && le + d < n) used.push(le + d);
  if (used.length < 6) return NaN;
  const y0 = y[le];
  const scale = Math.max(...used.map((i) => Math.abs(y[i] - y0))) || 1;
  const a = new Matrix(used.map((i) => {
    const t = (y[i] - y0) / scale;
    return [1, t, t * t, t * t * t, Math.abs(t * t * t)];
  }));
  const b = Matrix.columnVector(used.map((i) => x[i]));
  const coefficients = solve(a, b).to1DArray();
  const dx = coefficients[1] / scale;
  const ddx = (2 * coefficients[2]) / (scale * scale);
  return Math.pow(1 + dx * dx, 1.5) / Math.abs(ddx);
}

/**
 * Re-panel a loop into `panels` panels (even): half on each side of the foremost point, spaced by a
 * cosine distribution in arc length so that panels are short at the nose and the trailing edge.
 */
export function repanelSection(x: readonly number[], y: readonly number[], panels: number): { x: number[]; y: number[] } {
  const n = x.length;
  const le = leadingEdgeIndex(x);
  const s = arcLength(x, y);
  const sx = naturalCubicSpline(s, x);
  const sy = naturalCubicSpline(s, y);
  const half = Math.max(4, Math.round(panels / 2));
  const outX: number[] = [];
  const outY: number[] = [];
  for (let i = 0; i <= half; i++) {
    const si = s[le] * 0.5 * (1 - Math.cos((Math.PI * i) / half));
    outX.push(sx.at(si));
    outY.push(sy.at(si));
  }
  for (let i = 1; i <= half; i++) {
    const si = s[le] + (s[n - 1] - s[le]) * 0.5 * (1 - Math.cos((Math.PI * i) / half));
    outX.push(sx.at(si));
    outY.push(sy.at(si));
  }
  return { x: outX, y: outY };
}
