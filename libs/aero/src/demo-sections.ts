import { Matrix, solve } from 'ml-matrix';
import { pressureCoefficientFromVelocity } from './compressible';

/**
 * Invented demonstration data: closed-loop Cp tables of the fictional "Larkspur T-62" wing section
 * (fictional company Tamsk Aerodynamics). Nothing here is measured or taken from any program.
 *
 * Method (written for Laminote): a thickness shape of our own, yt = t (a0 √x + a1 x + … + a4 x⁴),
 * with its leading-edge radius, maximum thickness well aft for a long favourable gradient, and a
 * trailing-edge angle, plus an aft-loaded mean line yc = c x (1 − x)(1 + k x) / max. Surface speeds come
 * from linearised thin-aerofoil theory (H. Glauert, "The Elements of Aerofoil and Airscrew Theory",
 * 1926): with x = (1 − cos θ)/2,
 *   thickness:  u_t = Σ a_n sin nθ / sin θ,   where yt' sin θ = Σ a_n cos nθ (source sheet),
 *   camber and incidence:  u_c = A0 (1 + cos θ)/sin θ + Σ A_n sin nθ (vortex sheet),
 * combined with Riegels' leading-edge factor (F. Riegels, 1948) q = (1 + u_t ± u_c)/√(1 + yt'²), which
 * keeps the speeds finite round the nose and puts the stagnation point just under it. Compressibility
 * by the Kármán–Tsien relation between incompressible and compressible speed (H. S. Tsien, J. Aeronaut.
 * Sci. 6, 1939): q_c = q (1 − λ)/(1 − λ q²), λ = M²/(1 + √(1 − M²))², then Cp from the isentropic
 * relation (compressible.ts). The wing is swept: the shape is the section normal to the leading edge,
 * whose flow is taken at the normal Mach number M∞ cos Λ, and the table gives Cp on the free stream,
 * Cp = Cp_n cos²Λ (simple sweep theory, swept-wing.ts), as CFD of the swept wing would. An
 * approximation good enough for plausible demo data only.
 */

export interface DemoSection {
  id: string;
  title: string;
  /** Flight condition the table belongs to. */
  flow: { altitude_m: number; mach: number; referenceLength_m: number };
  alphaDeg: number;
  /** Leading-edge sweep of the wing the section belongs to; the table's Cp is on the free stream. */
  sweepDeg: number;
  /** `x y cp` text, trailing edge over the upper side round the nose and back along the lower side. */
  pressureTable: string;
}

const THICKNESS = 0.12;
const MAX_THICKNESS_AT = 0.44;
const LEADING_EDGE_RADIUS = 0.0085;
const TRAILING_EDGE_SLOPE = -0.15 * THICKNESS;
const CAMBER = 0.016;
const AFT_LOADING = 0.6;
const FOURIER_TERMS = 48;
const QUADRATURE_POINTS = 512;
const POINTS_PER_SIDE = 70;
/** Leading-edge sweep of the invented wing. */
export const DEMO_SWEEP_DEG = 18;

/** Thickness polynomial coefficients a0 … a4 (of t) from the shape conditions, solved with ml-matrix. */
function thicknessCoefficients(): number[] {
  const a0 = Math.sqrt(2 * LEADING_EDGE_RADIUS) / THICKNESS;
  const xm = MAX_THICKNESS_AT;
  // Rows: yt(xm) = t/2, yt'(xm) = 0, yt(1) = 0, yt'(1) = TE slope; unknowns a1 … a4.
  const rows = [
    [xm, xm ** 2, xm ** 3, xm ** 4],
    [1, 2 * xm, 3 * xm ** 2, 4 * xm ** 3],
    [1, 1, 1, 1],
    [1, 2, 3, 4],
  ];
  const rhs = [0.5 - a0 * Math.sqrt(xm), -a0 / (2 * Math.sqrt(xm)), -a0, TRAILING_EDGE_SLOPE / THICKNESS - a0 / 2];
  const solution = solve(new Matrix(rows), Matrix.columnVector(rhs));
  return [a0, ...solution.to1DArray()];
}

const COEFFICIENTS = thicknessCoefficients();

function thickness(x: number): number {
  const [a0, a1, a2, a3, a4] = COEFFICIENTS;
  return THICKNESS * (a0 * Math.sqrt(x) + x * (a1 + x * (a2 + x * (a3 + x * a4))));
}

function thicknessSlope(x: number): number {
  const [a0, a1, a2, a3, a4] = COEFFICIENTS;
  return THICKNESS * (a0 / (2 * Math.sqrt(x)) + a1 + x * (2 * a2 + x * (3 * a3 + x * 4 * a4)));
}

// Aft-loaded mean line, scaled so that its maximum is CAMBER.
const CAMBER_SCALE = (() => {
  let max = 0;
  for (let i = 1; i < 1000; i++) {
    const x = i / 1000;
    max = Math.max(max, x * (1 - x) * (1 + AFT_LOADING * x));
  }
  return CAMBER / max;
})();

function camber(x: number): number {
  return CAMBER_SCALE * x * (1 - x) * (1 + AFT_LOADING * x);
}

function camberSlope(x: number): number {
  return CAMBER_SCALE * (1 - 2 * x + AFT_LOADING * (2 * x - 3 * x * x));
}

/** Fourier cosine coefficients c_n = (2/π) ∫₀^π g(φ) cos nφ dφ (c_0 with 1/π), by the midpoint rule. */
function cosineCoefficients(g: (phi: number) => number): number[] {
  const c = new Array<number>(FOURIER_TERMS + 1).fill(0);
  const dphi = Math.PI / QUADRATURE_POINTS;
  for (let k = 0; k < QUADRATURE_POINTS; k++) {
    const phi = (k + 0.5) * dphi;
    const value = g(phi);
    for (let n = 0; n <= FOURIER_TERMS; n++) c[n] += value * Math.cos(n * phi) * dphi;
  }
  return c.map((v, n) => (n === 0 ? v / Math.PI : (2 * v) / Math.PI));
}

const xOf = (phi: number) => 0.5 * (1 - Math.cos(phi));
const SOURCE = cosineCoefficients((phi) => thicknessSlope(xOf(phi)) * Math.sin(phi));
const CAMBER_TERMS = cosineCoefficients((phi) => camberSlope(xOf(phi)));

/** Upper and lower surface speeds q/V∞ (incompressible) at θ, x = (1 − cos θ)/2, incidence α. */
function surfaceSpeeds(theta: number, alpha: number): { upper: number; lower: number } {
  const sinT = Math.sin(theta);
  let ut = 0;
  let uc = (alpha - CAMBER_TERMS[0]) * ((1 + Math.cos(theta)) / sinT);
  for (let n = 1; n <= FOURIER_TERMS; n++) {
    const sn = Math.sin(n * theta);
    ut += (SOURCE[n] * sn) / sinT;
    uc += CAMBER_TERMS[n] * sn;
  }
  const riegels = 1 / Math.sqrt(1 + thicknessSlope(xOf(theta)) ** 2);
  return { upper: (Math.cos(alpha) * (1 + ut) + uc) * riegels, lower: (Math.cos(alpha) * (1 + ut) - uc) * riegels };
}

/** Compressible speed from the incompressible one (Kármán–Tsien). */
function karmanTsien(speed: number, mach: number): number {
  const lambda = (mach * mach) / (1 + Math.sqrt(1 - mach * mach)) ** 2;
  return (speed * (1 - lambda)) / (1 - lambda * speed * speed);
}

function table(alphaDeg: number, mach: number, sweepDeg: number, heading: string[]): string {
  const alpha = (alphaDeg * Math.PI) / 180;
  const cosSweep = Math.cos((sweepDeg * Math.PI) / 180);
  const normalMach = mach * cosSweep;
  const lines = [...heading.map((h) => `# ${h}`), 'x y cp'];
  const row = (x: number, y: number, speed: number) => {
    const cp = pressureCoefficientFromVelocity(karmanTsien(Math.abs(speed), normalMach), normalMach) * cosSweep * cosSweep;
    lines.push(`${fixed(x, 6)} ${fixed(y, 6)} ${fixed(cp, 5)}`);
  };
  // Cosine spacing in x: stations crowd the nose and the trailing edge.
  const theta = (k: number) => (Math.PI * k) / POINTS_PER_SIDE;
  for (let k = POINTS_PER_SIDE; k >= 1; k--) {
    const t = k === POINTS_PER_SIDE ? Math.PI - 1e-6 : theta(k);
    const x = xOf(theta(k));
    row(x, camber(x) + thickness(x), surfaceSpeeds(t, alpha).upper);
  }
  for (let k = 1; k <= POINTS_PER_SIDE; k++) {
    const t = k === POINTS_PER_SIDE ? Math.PI - 1e-6 : theta(k);
    const x = xOf(theta(k));
    row(x, camber(x) - thickness(x), surfaceSpeeds(t, alpha).lower);
  }
  return `${lines.join('\n')}\n`;
}

/** Fixed-point text without a negative zero. */
function fixed(value: number, digits: number): string {
  const text = value.toFixed(digits);
  return /^-0\.0*$/.test(text) ? text.slice(1) : text;
}

/**
 * The invented Larkspur T-62 section at a cruise and a climb condition, as closed-loop `x y cp`
 * tables labelled as invented in their first comment line.
 */
export function inventedDemoSections(): DemoSection[] {
  const conditions = [
    { id: 'larkspur-t62-cruise', title: 'Larkspur T-62 wing section, cruise', flow: { altitude_m: 12500, mach: 0.68, referenceLength_m: 2.1 }, alphaDeg: 0, sweepDeg: DEMO_SWEEP_DEG },
    { id: 'larkspur-t62-climb', title: 'Larkspur T-62 wing section, climb', flow: { altitude_m: 4000, mach: 0.45, referenceLength_m: 2.1 }, alphaDeg: 2, sweepDeg: DEMO_SWEEP_DEG },
  ];
  return conditions.map((c) => ({
    ...c,
    pressureTable: table(c.alphaDeg, c.flow.mach, c.sweepDeg, [
      'INVENTED DATA for demonstration: fictional Tamsk Aerodynamics Larkspur T-62 NLF wing section, not a real aircraft or measurement.',
      `Generated by Laminote from an analytic 12 % thick shape (thin-aerofoil theory with Riegels' nose factor, Kármán–Tsien); alpha ${c.alphaDeg} deg, Mach ${c.flow.mach}, leading-edge sweep ${c.sweepDeg} deg (Cp on the free stream).`,
      'Closed loop: trailing edge over the upper surface, round the nose, back along the lower surface. x and y per chord.',
    ]),
  }));
}
