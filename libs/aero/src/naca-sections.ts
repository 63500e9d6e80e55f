/**
 * NACA four- and five-digit sections from their published defining formulas, as a closed loop of unit
 * chord from the trailing edge over the upper surface round the nose and back along the lower surface.
 *
 * Thickness (both families), E. N. Jacobs, K. E. Ward and R. M. Pinkerton, "The characteristics of 78
 * related airfoil sections from tests in the variable-density wind tunnel", NACA Report 460 (1933):
 *   ±yt = (t/0.20)(0.29690 √x − 0.12600 x − 0.35160 x² + 0.28430 x³ − 0.10150 x⁴),
 * laid off perpendicular to the mean line: xU = x − yt sin θ, yU = yc + yt cos θ, tan θ = dyc/dx
 * (lower surface with −yt). The trailing edge keeps its published finite thickness (0.0021 t·… at x = 1).
 *
 * Four-digit mean line (Report 460), designation m p tt: camber m/100 at p/10 of the chord,
 *   yc = (m/p²)(2 p x − x²)            for x ≤ p,
 *   yc = (m/(1−p)²)((1 − 2p) + 2 p x − x²)  for x > p.
 *
 * Five-digit mean line, E. N. Jacobs and R. M. Pinkerton, "Tests in the variable-density wind tunnel of
 * related airfoils having the maximum camber unusually far forward", NACA Report 537 (1935), and the
 * designation of NACA Report 610 (Jacobs, Pinkerton and Greenberg, 1937): L P Q tt with design lift
 * coefficient 3L/20, maximum camber at P/20 of the chord, Q = 0 (no reflex):
 *   yc = (k1/6)(x³ − 3 r x² + r²(3 − r) x)  for x < r,   yc = (k1 r³/6)(1 − x)  for x ≥ r,
 * scaled by (3L/20)/0.3 from the tabulated design cl of 0.3. The constants r and k1 per P are the
 * published table (also in I. H. Abbott and A. E. von Doenhoff, "Theory of Wing Sections", 1959, §6.6).
 */

export interface SectionLoop {
  /** Unit chord: leading edge of the mean line at (0, 0), trailing edge at x = 1. */
  x: number[];
  y: number[];
}

export class NacaDesignationError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'NacaDesignationError';
  }
}

/** Report 537/610 five-digit mean lines (design cl 0.3): second digit P → r, k1. */
export const NACA_FIVE_DIGIT_MEAN_LINES: Readonly<Record<number, { r: number; k1: number }>> = {
  1: { r: 0.058, k1: 361.4 },
  2: { r: 0.126, k1: 51.64 },
  3: { r: 0.2025, k1: 15.957 },
  4: { r: 0.29, k1: 6.643 },
  5: { r: 0.391, k1: 3.23 },
};

export interface NacaShape {
  designation: string;
  /** Maximum thickness as a fraction of the chord. */
  thickness: number;
  meanLine: (x: number) => { yc: number; slope: number };
}

/** Report 460 half-thickness at x for thickness ratio t. */
export function nacaHalfThickness(x: number, thickness: number): number {
  return (thickness / 0.2) * (0.2969 * Math.sqrt(x) + x * (-0.126 + x * (-0.3516 + x * (0.2843 - 0.1015 * x))));
}

/** Parse a four- or five-digit designation (`2412`, `NACA 23015`); throws NacaDesignationError. */
export function nacaShape(designation: string): NacaShape {
  const digits = designation.trim().replace(/^naca[\s-]*/i, '');
  if (!/^\d{4,5}$/.test(digits)) {
    throw new NacaDesignationError(`"${designation.trim()}" is not a NACA four- or five-digit designation (e.g. 2412 or 23012)`);
  }
  const thickness = Number(digits.slice(-2)) / 100;
  if (thickness < 0.01 || thickness > 0.4) {
    throw new NacaDesignationError(`NACA ${digits}: thickness ${digits.slice(-2)} % must lie between 01 and 40`);
  }
  if (digits.length === 4) {
    const m = Number(digits[0]) / 100;
    const p = Number(digits[1]) / 10;
    if ((m === 0) !== (p === 0)) {
      throw new NacaDesignationError(`NACA ${digits}: camber and its position must both be zero or both be given`);
    }
    const meanLine = (x: number) => {
      if (m === 0) return { yc: 0, slope: 0 };
      if (x <= p) return { yc: (m / (p * p)) * (2 * p * x - x * x), slope: ((2 * m) / (p * p)) * (p - x) };
      const q = (1 - p) * (1 - p);
      return { yc: (m / q) * (1 - 2 * p + 2 * p * x - x * x), slope: ((2 * m) / q) * (p - x) };
    };
    return { designation: `NACA ${digits}`, thickness, meanLine };
  }
  const lift = Number(digits[0]);
  const position = Number(digits[1]);
  const reflex = Number(digits[2]);
  if (reflex !== 0) throw new NacaDesignationError(`NACA ${digits}: reflexed five-digit mean lines (third digit 1) are not offered; use coordinates`);
  const line = NACA_FIVE_DIGIT_MEAN_LINES[position];
  if (line === undefined || lift === 0) {
    throw new NacaDesignationError(`NACA ${digits}: five-digit mean lines need a first digit of 1 or more and a second digit from 1 to 5`);
  }
  const scale = (0.15 * lift) / 0.3;
  const { r, k1 } = line;
  const meanLine = (x: number) => {
    if (x < r) return { yc: scale * (k1 / 6) * (x * x * x - 3 * r * x * x + r * r * (3 - r) * x), slope: scale * (k1 / 6) * (3 * x * x - 6 * r * x + r * r * (3 - r)) };
    return { yc: scale * ((k1 * r * r * r) / 6) * (1 - x), slope: -scale * ((k1 * r * r * r) / 6) };
  };
  return { designation: `NACA ${digits}`, thickness, meanLine };
}

/**
 * The section as a closed loop with `pointsPerSide` intervals on each surface, spaced by a cosine
 * distribution in x (fine at the nose and the trailing edge); the nose point is shared.
 */
export function nacaSection(designation: string, pointsPerSide = 100): SectionLoop & { designation: string } {
  const shape = nacaShape(designation);
  const n = Math.max(8, Math.floor(pointsPerSide));
  const x: number[] = [];
  const y: number[] = [];
  const surfacePoint = (xc: number, side: 1 | -1) => {
    const { yc, slope } = shape.meanLine(xc);
    const yt = nacaHalfThickness(xc, shape.thickness);
    const theta = Math.atan(slope);
    return { x: xc - side * yt * Math.sin(theta), y: yc + side * yt * Math.cos(theta) };
  };
  for (let i = n; i >= 0; i--) {
    const p = surfacePoint(0.5 * (1 - Math.cos((Math.PI * i) / n)), 1);
    x.push(p.x);
    y.push(p.y);
  }
  for (let i = 1; i <= n; i++) {
    const p = surfacePoint(0.5 * (1 - Math.cos((Math.PI * i) / n)), -1);
    x.push(p.x);
    y.push(p.y);
  }
  return { designation: shape.designation, x, y };
}
