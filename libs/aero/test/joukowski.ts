/**
 * Exact potential flow about a Joukowski aerofoil (N. Joukowski, 1910; e.g. L. M. Milne-Thomson,
 * "Theoretical Aerodynamics", ch. 7): the circle |ζ − μ| = a through ζ = 1 mapped by z = ζ + 1/ζ, with
 * the Kutta condition at the cusp. On the circle ζ = μ + a e^{iθ} the speed is
 *   q = 2 V |sin(θ − α) + sin(α + β)| / |1 − 1/ζ²|,  sin β = Im μ / a,
 * and the front stagnation point is at θ = π + 2α + β. Used by the tests as an analytic closed loop,
 * scaled to unit chord.
 */
export interface JoukowskiLoop {
  x: number[];
  y: number[];
  speed: number[];
  cp: number[];
  stagnation: { x: number; y: number; velocityGradient: number };
}

export function joukowskiLoop(center: { re: number; im: number }, alphaDeg: number, count: number): JoukowskiLoop {
  const alpha = (alphaDeg * Math.PI) / 180;
  const a = Math.hypot(1 - center.re, center.im);
  const beta = Math.asin(center.im / a);
  const thetaTe = -beta;
  const map = (theta: number) => {
    const zr = center.re + a * Math.cos(theta);
    const zi = center.im + a * Math.sin(theta);
    const r2 = zr * zr + zi * zi;
    // z = ζ + 1/ζ, dz/dζ = 1 − 1/ζ²
    const x = zr + zr / r2;
    const y = zi - zi / r2;
    const inv2r = (zr * zr - zi * zi) / (r2 * r2);
    const inv2i = (-2 * zr * zi) / (r2 * r2);
    const jacobian = Math.hypot(1 - inv2r, -inv2i);
    return { x, y, jacobian };
  };
  const x: number[] = [];
  const y: number[] = [];
  const speed: number[] = [];
  // Points cluster toward the trailing edge (t = 0, 1) and the leading edge (t = ½).
  for (let i = 0; i < count; i++) {
    const t = i / (count - 1);
    const theta = thetaTe + 2 * Math.PI * (t - (0.8 * Math.sin(4 * Math.PI * t)) / (4 * Math.PI));
    const p = map(theta);
    x.push(p.x);
    y.push(p.y);
    const end = i === 0 || i === count - 1;
    speed.push(end ? trailingEdgeSpeed(center, a, alpha, beta) : (2 * Math.abs(Math.sin(theta - alpha) + Math.sin(alpha + beta))) / p.jacobian);
  }
  const thetaS = Math.PI + 2 * alpha + beta;
  const s = map(thetaS);
  // Lengths are divided by the chord, with the leading edge at x = 0.
  const xMin = Math.min(...x);
  const chord = Math.max(...x) - xMin;
  return {
    x: x.map((v) => (v - xMin) / chord),
    y: y.map((v) => v / chord),
    speed,
    cp: speed.map((q) => 1 - q * q),
    stagnation: {
      x: (s.x - xMin) / chord,
      y: s.y / chord,
      velocityGradient: (chord * 2 * Math.abs(Math.cos(thetaS - alpha))) / (a * s.jacobian * s.jacobian),
    },
  };
}

// At the cusp both q_ζ and dz/dζ vanish; the limit is taken numerically just off the trailing edge.
function trailingEdgeSpeed(center: { re: number; im: number }, a: number, alpha: number, beta: number): number {
  const theta = -beta + 1e-6;
  const zr = center.re + a * Math.cos(theta);
  const zi = center.im + a * Math.sin(theta);
  const r2 = zr * zr + zi * zi;
  const inv2r = (zr * zr - zi * zi) / (r2 * r2);
  const inv2i = (-2 * zr * zi) / (r2 * r2);
  return (2 * Math.abs(Math.sin(theta - alpha) + Math.sin(alpha + beta))) / Math.hypot(1 - inv2r, -inv2i);
}
