/**
 * Invented demonstration data: the meridian of the fictional Larkspur T-62's nacelle pod (fictional
 * company Tamsk Aerodynamics), as a closed body of revolution for the axisymmetric panel method. Nothing
 * here is measured or taken from any aircraft or program.
 *
 * Shape (written for Laminote), on unit length with the nose at x = 0: an elliptic forebody to the
 * maximum radius r_m at x_m, r = r_m √(1 − ((x_m − x)/x_m)²), for a long run of falling pressure (the
 * laminar part of a laminar nacelle), then a parabolic afterbody closing to a point at the tail,
 * r = r_m (1 − ((x − x_m)/(1 − x_m))²). Points are spaced by cosine so the nose and tail are resolved.
 */

export interface DemoNacelle {
  title: string;
  /** Length of the pod in metres (the flow cell's reference length). */
  length_m: number;
  /** Flight condition it belongs to (the wing section's cruise). */
  flow: { altitude_m: number; mach: number };
  /** `x r` rows on unit length from the nose to the tail, with a comment line saying what they are. */
  meridian: string;
}

const MAX_RADIUS = 0.085;
const MAX_RADIUS_AT = 0.42;
const POINTS = 81;

/** The invented pod's radius at x (on unit length). */
export function demoNacelleRadius(x: number): number {
  if (x <= MAX_RADIUS_AT) return MAX_RADIUS * Math.sqrt(Math.max(0, 1 - ((MAX_RADIUS_AT - x) / MAX_RADIUS_AT) ** 2));
  return MAX_RADIUS * Math.max(0, 1 - ((x - MAX_RADIUS_AT) / (1 - MAX_RADIUS_AT)) ** 2);
}

export function inventedDemoNacelle(): DemoNacelle {
  const rows = ['# Larkspur T-62 nacelle pod, outer lines (invented): x/L r/L from the nose to the tail'];
  for (let i = 0; i < POINTS; i++) {
    const x = i === POINTS - 1 ? 1 : 0.5 * (1 - Math.cos((Math.PI * i) / (POINTS - 1)));
    rows.push(`${x.toFixed(5)} ${demoNacelleRadius(x).toFixed(5)}`);
  }
  return { title: 'Larkspur T-62 nacelle pod, outer lines', length_m: 2.6, flow: { altitude_m: 12500, mach: 0.78 }, meridian: rows.join('\n') };
}
