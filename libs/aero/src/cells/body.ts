import type { BodyInputs, BodyResult } from '@laminote/contracts';
import { bodyAt } from '../section-case';
import { readBodyMeridian, ShapeInputError } from '../shape-input';
import { fail } from './errors';
import { warningNotes, type ResultTable } from './result-table';

/**
 * Body of revolution: a prolate spheroid of a given fineness ratio or a pasted meridian, its geometry,
 * and the axisymmetric source-ring panel solution at zero incidence (section-case.ts `bodyAt`,
 * axisymmetric-panel.ts). Lengths are divided by the body length, nose at x = 0.
 */

/** Points of the spheroid's meridian, closer together at the nose and the tail (cosine spacing). */
const SPHEROID_POINTS = 201;

/**
 * The meridian of a prolate spheroid of fineness ratio `fineness` (length over diameter) and unit
 * length, as `x r` rows from the nose to the tail: x = (1 − cos φ)/2, r = sin φ / (2 · fineness).
 */
export function spheroidMeridian(fineness: number, points = SPHEROID_POINTS): string {
  const rows = [`# prolate spheroid, fineness ratio ${fineness}`];
  for (let i = 0; i < points; i++) {
    const phi = (Math.PI * i) / (points - 1);
    const x = i === points - 1 ? 1 : (1 - Math.cos(phi)) / 2;
    const r = i === 0 || i === points - 1 ? 0 : Math.sin(phi) / (2 * fineness);
    rows.push(`${x.toPrecision(12)} ${r.toPrecision(12)}`);
  }
  return rows.join('\n');
}

/** The meridian a body cell stands for, as `x r` text (what the engine case's `body.coordinates` takes). */
export function bodyMeridianText(b: BodyInputs): string {
  return b.source === 'spheroid' ? spheroidMeridian(b.fineness) : b.coordinates;
}

function shaped<T>(run: () => T): T {
  try {
    return run();
  } catch (error) {
    if (error instanceof ShapeInputError) return fail(error.field, error.message, error.line);
    throw error;
  }
}

export function computeBody(b: BodyInputs): BodyResult {
  const text = bodyMeridianText(b);
  const meridian = shaped(() => readBodyMeridian(text));
  const inviscid = shaped(() => bodyAt({ coordinates: text, panels: b.panels }));
  const x0 = meridian.x[0]!;
  const length = meridian.x[meridian.x.length - 1]! - x0;
  const x = meridian.x.map((v) => (v - x0) / length);
  const r = meridian.r.map((v) => v / length);
  let top = 0;
  for (let i = 1; i < r.length; i++) if (r[i]! > r[top]!) top = i;
  const { s: _s, speed: _speed, ...solution } = inviscid;
  const warnings: string[] = [];
  // Stations packed in a few places leave long panels elsewhere; the re-panelling fixes their number, not their content.
  if (meridian.x.length < 21) warnings.push(`coordinates: only ${meridian.x.length} points describe the meridian; the panels follow straight lines between them`);
  return {
    title: b.source === 'spheroid' ? `Prolate spheroid, fineness ratio ${b.fineness}` : null,
    outline: { x, r },
    geometry: { fineness: 1 / (2 * r[top]!), maxRadius: r[top]!, maxRadiusAt: x[top]! },
    inviscid: solution,
    warnings,
  };
}

/** A body as a table: Cp along the meridian at the panel midpoints, with its proportions above. */
export function bodyTable(r: BodyResult): ResultTable {
  const v = r.inviscid;
  const g = r.geometry;
  const rows = v.x.map((x, i) => [x, v.r[i]!, v.cp[i]!]);
  const notes = [`fineness ${g.fineness}, maximum radius ${g.maxRadius} at x ${g.maxRadiusAt} (on unit length), ${v.panels} panels, incompressible`];
  return { fields: ['x', 'r', 'cp'], rows, notes: [...notes, ...warningNotes(r.warnings)] };
}
