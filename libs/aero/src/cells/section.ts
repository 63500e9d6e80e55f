import { pressureInputsSchema, type FlowInputs, type PressureInputs, type SectionInputs, type SectionResult } from '@laminote/contracts';
import { inviscidTable, prepareSection, sectionAt, type PreparedSection } from '../section-case';
import { ShapeInputError } from '../shape-input';
import { fail } from './errors';
import { computeFlow } from './flow';
import { optionalUpstreamOf, type Upstream } from './types';
import { warningNotes, type ResultTable } from './result-table';

/**
 * Section: the shape from a NACA designation (Reports 460, 537/610) or pasted coordinates, its geometry,
 * and the linear-strength vortex panel solution at an incidence or a lift coefficient, with the
 * Kármán–Tsien rule at the Mach number of the flow cell it names (section-case.ts).
 */
export function prepareSectionCell(s: SectionInputs): PreparedSection {
  try {
    return prepareSection(s.source === 'naca' ? { naca: s.naca, panels: s.panels } : { coordinates: s.coordinates, panels: s.panels });
  } catch (error) {
    if (error instanceof ShapeInputError) return fail(error.field, error.message, error.line);
    throw error;
  }
}

export function solveSectionCell(prepared: PreparedSection, s: SectionInputs, mach: number) {
  try {
    return sectionAt(prepared, s.at === 'cl' ? { cl: s.cl } : { alphaDeg: s.alphaDeg }, mach);
  } catch (error) {
    if (error instanceof ShapeInputError) return fail(error.field, error.message, error.line);
    throw error;
  }
}

export function computeSection(s: SectionInputs, upstream: Upstream): SectionResult {
  const flow = optionalUpstreamOf(upstream, 'flowCellId', 'flow');
  const mach = flow ? computeFlow(flow.inputs).mach : 0;
  const prepared = prepareSectionCell(s);
  const inviscid = solveSectionCell(prepared, s, mach);
  const g = prepared.geometry;
  return {
    title: prepared.title,
    outline: prepared.outline,
    geometry: {
      thickness: g.thickness,
      thicknessAt: g.thicknessAt,
      camber: g.camber,
      camberAt: g.camberAt,
      leadingEdgeRadius: Number.isFinite(g.leadingEdgeRadius) ? g.leadingEdgeRadius : null,
      trailingEdgeGap: g.trailingEdgeGap,
    },
    inviscid,
    warnings: prepared.warnings,
  };
}

/**
 * A section cell read as a closed-loop pressure cell, at the analysing flow's Mach number: what an
 * analysis uses when it names a section cell instead of a pressure cell. The panel solution comes with
 * it so the analysis can carry the outline (x, y) its transition marks are drawn on.
 */
export function sectionAsPressure(s: SectionInputs, flow: FlowInputs): { pressure: PressureInputs; inviscid: SectionResult['inviscid'] } {
  const inviscid = solveSectionCell(prepareSectionCell(s), s, flow.mach);
  return { pressure: pressureInputsSchema.parse({ text: inviscidTable(inviscid), layout: 'closedLoop' }), inviscid };
}

/** A section as a table: Cp at the panel midpoints from the trailing edge over the upper surface, with lift and shape above. */
export function sectionTable(r: SectionResult): ResultTable {
  const v = r.inviscid;
  const g = r.geometry;
  const rows = v.x.map((x, i) => [x, v.y[i]!, v.cp[i]!, v.cpPrandtlGlauert?.[i] ?? null]);
  const notes = [
    `alpha ${v.alphaDeg} deg, cl ${v.cl}, cm ${v.cm} (quarter chord), Mach ${v.mach}, ${v.panels} panels`,
    `critical Cp ${v.criticalCp ?? 'not given (Mach 0)'}, critical Mach ${v.criticalMach ?? 'not given'}`,
    `t/c ${g.thickness} at x ${g.thicknessAt}, f/c ${g.camber} at x ${g.camberAt}, nose radius ${g.leadingEdgeRadius ?? 'not found'}, trailing-edge gap ${g.trailingEdgeGap}`,
  ];
  return { fields: ['x', 'y', 'cp', 'cpPrandtlGlauert'], rows, notes: [...notes, ...warningNotes(r.warnings)] };
}
