import type { PolarInputs, PolarResult } from '@laminote/contracts';
import { CaseError } from '../analyze';
import { polarPoint, polarValues } from '../polar';
import { ShapeInputError } from '../shape-input';
import { computeFlow } from './flow';
import { prepareSectionCell } from './section';
import { upstreamOf, type Upstream } from './types';
import { warningNotes, type ResultTable, type TableValue } from './result-table';

/**
 * Polar: the section cell's shape over a range of incidence or lift coefficient at the flow cell's
 * Reynolds and Mach numbers; at each point the panel solution and the boundary-layer analysis (lift,
 * moment, Squire–Young drag, transition per surface and criterion; polar.ts). A point the engine
 * refuses (a lift the section cannot reach, a layer that cannot start) keeps its reason and the rest
 * of the polar stands.
 */
export function computePolar(p: PolarInputs, upstream: Upstream): PolarResult {
  const flowInputs = upstreamOf(upstream, 'flowCellId', 'flow').inputs;
  const section = upstreamOf(upstream, 'sectionCellId', 'section').inputs;
  const flow = computeFlow(flowInputs);
  const prepared = prepareSectionCell(section);
  const warnings = [...prepared.warnings];
  if (flowInputs.sweepDeg !== 0) warnings.push(`the polar is of the two-dimensional section; the flow cell's sweep (${flowInputs.sweepDeg}°) is not applied`);
  const engineFlow = flowInputs.turbulenceMode === 'intensity' ? { reynolds: flow.reynolds, mach: flow.mach, turbulenceIntensity: flowInputs.turbulenceIntensity } : { reynolds: flow.reynolds, mach: flow.mach, nCrit: flow.nCrit };
  const options = { criteria: p.criteria, ...(p.governing === 'auto' ? {} : { governing: p.governing }) };
  const points = polarValues({ by: p.by, from: p.from, to: p.to, points: p.points }).map((value) => {
    try {
      const point = polarPoint(prepared, p.by === 'alpha' ? { alphaDeg: value } : { cl: value }, engineFlow, options);
      const at = p.by === 'alpha' ? `α = ${value.toFixed(2)}°` : `cl = ${value.toFixed(3)}`;
      // Said once for the whole polar when every point says it (the closed trailing edge), else per point.
      for (const w of point.warnings) {
        const line = w.startsWith('section: ') ? w.slice('section: '.length) : `${at}: ${w}`;
        if (!warnings.includes(line)) warnings.push(line);
      }
      return { alphaDeg: point.alphaDeg, cl: point.cl, cm: point.cm, cd: point.cd, surfaces: point.surfaces, problem: null };
    } catch (error) {
      if (!(error instanceof CaseError || error instanceof ShapeInputError)) throw error;
      const at = p.by === 'alpha' ? `α = ${value.toFixed(2)}°` : `cl = ${value.toFixed(3)}`;
      return { alphaDeg: p.by === 'alpha' ? value : null, cl: p.by === 'cl' ? value : null, cm: null, cd: null, surfaces: [], problem: `${at}: ${error.message}` };
    }
  });
  return { reynolds: flow.reynolds, mach: flow.mach, nCrit: flow.nCrit, outline: prepared.outline, points, warnings };
}

/** A polar as a table: a row per point and surface, the point's lift, moment and drag repeated on each. */
export function polarTable(r: PolarResult): ResultTable {
  const rows: TableValue[][] = [];
  for (const p of r.points) {
    if (p.surfaces.length === 0) rows.push([p.alphaDeg, p.cl, p.cm, p.cd, null, null, null, null, null, null, p.problem]);
    for (const s of p.surfaces) rows.push([p.alphaDeg, p.cl, p.cm, p.cd, s.name, s.transitionX, s.transitionBy, s.laminarSeparationX, s.turbulentSeparationX, s.cd, p.problem]);
  }
  const notes = [`Reynolds number ${r.reynolds}, Mach ${r.mach}, N_crit ${r.nCrit}`];
  return {
    fields: ['alphaDeg', 'cl', 'cm', 'cd', 'surface', 'transitionX', 'transitionBy', 'laminarSeparationX', 'turbulentSeparationX', 'cdSurface', 'problem'],
    rows,
    notes: [...notes, ...warningNotes(r.warnings)],
  };
}
