import type { AnalysisInputs, BodyInputs, EngineCaseInput, EngineResult, FlowInputs, PressureInputs, SectionInputs } from '@laminote/contracts';
import { analyzeCase } from '../analyze';
import { arcAtX, xAtArc } from '../arc-position';
import type { PressureTableRow } from '../pressure-table';
import { loopArcLength, splitAtStagnation } from '../stagnation';
import { attachmentLinePressureCoefficient, chordwiseVelocityRatio } from '../swept-wing';
import { fail, stagnationFailure } from './errors';
import { bodyMeridianText } from './body';
import { sectionAsPressure } from './section';
import { engineFlow } from './flow';
import { readCellTable } from './table';
import { upstreamOf, type Upstream } from './types';
import { warningNotes, type ResultTable, type TableValue } from './result-table';

interface PreparedCase {
  engineCase: EngineCaseInput;
  /** x per surface to put back on the stations when the case is given as surfaces. */
  xBySurface: Map<string, number[]> | null;
}

/**
 * The engine case of an analysis: flow from the flow cell, the table (or surfaces) from the pressure
 * cell, criteria, trips and the turbulent march from the analysis. Trips are given at x/c; the case
 * takes them at s on surfaces, so a table with trips is split here (with the engine's own reader and
 * stagnation finder, at the flow's Mach number) and handed over as surfaces.
 */
export function analysisCase(a: AnalysisInputs, flow: FlowInputs, p: PressureInputs): PreparedCase {
  const common = {
    flow: engineFlow(flow),
    criteria: a.criteria,
    ...(a.governing === 'auto' ? {} : { governing: a.governing }),
    turbulent: a.turbulent,
    sweepDeg: flow.sweepDeg,
    smoothing: p.smoothing === 'off' ? ('off' as const) : p.smoothing === 'width' ? (p.smoothingHalfWidth ?? 2) : ('auto' as const),
  };
  const trips = Object.entries(a.trips);
  if (p.layout === 'closedLoop' && trips.length === 0 && !p.hasRadius) return { engineCase: { ...common, pressureTable: p.text }, xBySurface: null };

  const table = readCellTable(p);
  const mach = flow.mach;
  // The chordwise edge velocity of the infinite swept wing (the engine's own conversion, swept-wing.ts).
  const sweep = (flow.sweepDeg * Math.PI) / 180;
  const cp0 = attachmentLinePressureCoefficient(mach, sweep);
  const speedOf = (row: PressureTableRow) => {
    if (row.cp > cp0 + 1e-6) {
      fail('text', `line ${row.line}: Cp ${row.cp} is above the ${sweep === 0 ? 'stagnation' : 'attachment-line'} value ${cp0.toFixed(4)} at mach ${mach}${sweep === 0 ? '' : ` and ${flow.sweepDeg}° sweep (Cp is taken on the free stream of a wing at this sweep)`}`, row.line);
    }
    return row.cp >= cp0 ? 0 : chordwiseVelocityRatio(row.cp, mach, sweep);
  };
  const x = table.rows.map((r) => r.x);
  const y = table.hasY ? table.rows.map((r) => r.y!) : null;
  let surfaces: { name: string; s: number[]; x: number[]; ue?: number[]; cp?: number[]; r?: number[] }[];
  if (p.layout === 'closedLoop') {
    let split;
    try {
      split = splitAtStagnation(x, y, table.rows.map(speedOf));
    } catch (error) {
      stagnationFailure(error, table.rows);
    }
    surfaces = (['upper', 'lower'] as const).map((name) => ({ name, s: Array.from(split[name].s), x: Array.from(split[name].x), ue: Array.from(split[name].ue) }));
  } else {
    let s: Float64Array;
    try {
      s = loopArcLength(x, y);
    } catch (error) {
      stagnationFailure(error, table.rows);
    }
    surfaces = [{ name: p.surfaceName, s: Array.from(s), x, cp: table.rows.map((r) => r.cp), ...(table.radius ? { r: table.radius } : {}) }];
  }
  const names = surfaces.map((surface) => surface.name);
  for (const [name] of trips) {
    if (!names.includes(name)) fail(`trips.${name}`, `there is no surface named "${name}" (the table gives ${names.join(' and ')})`);
  }
  const xBySurface = new Map(surfaces.map((surface) => [surface.name, surface.x]));
  return {
    engineCase: {
      ...common,
      surfaces: surfaces.map(({ x: xs, ...surface }) => {
        const trip = a.trips[surface.name];
        if (trip === undefined) return surface;
        const s = arcAtX(surface.s, xs, trip);
        if (s === null) fail(`trips.${surface.name}`, `x/c ${trip} is not on the ${surface.name} surface (x from ${Math.min(...xs)} to ${Math.max(...xs)})`);
        return { ...surface, trip: s };
      }),
    },
    xBySurface,
  };
}

/**
 * What analyses of one cell at several flows share (the cases of a sweep chunk): a section's panel
 * solution at each Mach number, solved once. The solution at a Mach number is the same every time.
 */
export class AnalysisShare {
  private section: SectionInputs | null = null;
  private readonly sections = new Map<number, ReturnType<typeof sectionAsPressure>>();

  sectionAsPressure(s: SectionInputs, flow: FlowInputs): ReturnType<typeof sectionAsPressure> {
    if (this.section !== s) {
      this.section = s;
      this.sections.clear();
    }
    let solved = this.sections.get(flow.mach);
    if (!solved) {
      solved = sectionAsPressure(s, flow);
      this.sections.set(flow.mach, solved);
    }
    return solved;
  }
}

/** Transition analysis of the named flow and pressure cells: the engine's analyzeCase (analyze.ts). */
export function computeAnalysis(a: AnalysisInputs, upstream: Upstream, share?: AnalysisShare): EngineResult {
  const flow = upstreamOf(upstream, 'flowCellId', 'flow').inputs;
  // A section cell stands in for a pressure cell: its panel solution at this flow's Mach number.
  // The result then carries the panel solution (inviscid), whose x, y is the outline the screen marks.
  const named = upstream['pressureCellId'];
  if (named?.kind === 'body') return analyzeBody(a, flow, upstreamOf(upstream, 'pressureCellId', 'body').inputs);
  if (named?.kind === 'section') {
    const section = upstreamOf(upstream, 'pressureCellId', 'section').inputs;
    const { pressure, inviscid } = share ? share.sectionAsPressure(section, flow) : sectionAsPressure(section, flow);
    return { ...analyzeWith(a, flow, pressure), inviscid };
  }
  return analyzeWith(a, flow, upstreamOf(upstream, 'pressureCellId', 'pressure').inputs);
}

/**
 * A body of revolution named in place of a pressure cell: one surface from the nose with its radius
 * (Mangler's transformation in the laminar march, the axisymmetric terms in Head's), at zero incidence
 * and without sweep. Its panel solution comes back as the result's `inviscid`.
 */
function analyzeBody(a: AnalysisInputs, flow: FlowInputs, b: BodyInputs): EngineResult {
  if (Object.keys(a.trips).length > 0) fail('trips', 'a body of revolution is analysed in free transition here; leave the forced transition empty');
  const result = analyzeCase({
    flow: engineFlow(flow),
    criteria: a.criteria,
    ...(a.governing === 'auto' ? {} : { governing: a.governing }),
    turbulent: a.turbulent,
    sweepDeg: 0,
    body: { coordinates: bodyMeridianText(b), panels: b.panels },
  });
  if (flow.sweepDeg !== 0) result.warnings.push(`sweep ${flow.sweepDeg}°: a body of revolution is analysed at zero incidence without sweep; the flow cell's sweep is not used`);
  return result;
}

/** The analysis with the flow and pressure inputs given directly (a sweep varies the flow). */
export function analyzeWith(a: AnalysisInputs, flow: FlowInputs, pressure: PressureInputs): EngineResult {
  const prepared = analysisCase(a, flow, pressure);
  const result = analyzeCase(prepared.engineCase);
  if (prepared.xBySurface) {
    for (const surface of result.surfaces) {
      const x = prepared.xBySurface.get(surface.name);
      // A surface that ends at a rear stagnation point is marched to the station before it.
      if (x && x.length >= surface.stations.s.length) surface.stations.x = x.slice(0, surface.stations.s.length);
    }
  }
  return result;
}

/** An analysis as a table: the stations of each surface, with where transition and separation fall above them. */
export function analysisTable(r: EngineResult): ResultTable {
  const rows: TableValue[][] = [];
  const notes: string[] = [];
  for (const surface of r.surfaces) {
    const st = surface.stations;
    for (let i = 0; i < st.s.length; i++) {
      rows.push([surface.name, st.s[i]!, st.x?.[i] ?? null, st.ue[i]!, st.theta[i] ?? null, st.deltaStar[i] ?? null, st.H[i] ?? null, st.cf[i] ?? null, st.n[i] ?? null]);
    }
    const at = surface.transition.s;
    notes.push(`${surface.name}: transition ${at === null ? 'not reached' : `at s ${at}${st.x ? `, x ${xAtArc(st.s, st.x, at)}` : ''} (${surface.transition.by})`}; cd ${surface.cd ?? 'not given'}`);
  }
  notes.push(`cd ${r.cd ?? 'not given'}`, ...warningNotes(r.warnings));
  return { fields: ['surface', 's', 'x', 'ue', 'theta', 'deltaStar', 'H', 'cf', 'n'], rows, notes };
}
