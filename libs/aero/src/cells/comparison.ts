import type { ComparisonInputs, ComparisonResult, EngineResult, PressureResult } from '@laminote/contracts';
import { xAtArc } from '../arc-position';
import { pressureCoefficientFromVelocity } from '../compressible';
import { computeAnalysis } from './analysis';
import { fail } from './errors';
import { computePressure } from './pressure';
import type { Upstream } from './types';
import { warningNotes, type ResultTable, type TableValue } from './result-table';

/**
 * Comparison: up to four pressure cells or analyses of one study overlaid, surface by surface: Cp along
 * x/c for all of them, and for analyses the N-factor envelope, the shape factor H, where transition
 * falls and the drag. Each named cell is computed as it stands (the same computation its own cell
 * runs), so the overlay is always of current results.
 */

const FIELDS = ['firstCellId', 'secondCellId', 'thirdCellId', 'fourthCellId'] as const;
/** Points per overlaid curve; longer lists are thinned evenly, ends kept. */
const MAX_POINTS = 400;

function thin<T>(values: readonly T[], keep: readonly number[]): T[] {
  return keep.map((i) => values[i]!);
}

function keepIndices(length: number): number[] {
  if (length <= MAX_POINTS) return Array.from({ length }, (_, i) => i);
  return Array.from({ length: MAX_POINTS }, (_, i) => Math.round((i * (length - 1)) / (MAX_POINTS - 1)));
}

type Entry = ComparisonResult['entries'][number];

function fromPressure(field: string, result: PressureResult): Entry {
  return {
    field,
    kind: 'pressure',
    flow: null,
    cd: null,
    surfaces: result.surfaces.map((s) => {
      const keep = keepIndices(s.x.length);
      return { name: s.name, x: thin(s.x, keep), cp: thin(s.cp, keep), n: null, H: null, transitionX: null, by: null, cd: null };
    }),
  };
}

function fromAnalysis(field: string, result: EngineResult): Entry {
  const mach = result.flow.mach;
  return {
    field,
    kind: 'analysis',
    flow: { reynolds: result.flow.reynolds, mach, nCrit: result.flow.nCrit },
    cd: result.cd,
    surfaces: result.surfaces.map((s) => {
      const st = s.stations;
      const keep = keepIndices(st.s.length);
      const x = st.x && st.x.length === st.s.length ? st.x : st.s;
      return {
        name: s.name,
        x: thin(x, keep),
        cp: thin(st.ue, keep).map((ue) => (ue === null || ue === undefined ? null : pressureCoefficientFromVelocity(ue, mach))),
        n: thin(st.n, keep),
        H: thin(st.H, keep),
        transitionX: s.transition.s === null ? null : (xAtArc(st.s, st.x ?? undefined, s.transition.s) ?? s.transition.s),
        by: s.transition.by ?? null,
        cd: s.cd ?? null,
      };
    }),
  };
}

export function computeComparison(inputs: ComparisonInputs, upstream: Upstream): ComparisonResult {
  const entries: Entry[] = [];
  const warnings: string[] = [];
  for (const field of FIELDS) {
    const named = inputs[field];
    if (!named) continue;
    const source = upstream[field];
    if (!source) fail(field, `${field} names no cell`);
    if (source.kind === 'pressure') entries.push(fromPressure(field, computePressure(source.inputs as Parameters<typeof computePressure>[0])));
    else if (source.kind === 'analysis') entries.push(fromAnalysis(field, computeAnalysis(source.inputs as Parameters<typeof computeAnalysis>[0], source.upstream)));
    else fail(field, `${field} names a ${source.kind} cell; a comparison overlays pressure cells and analyses`);
  }
  if (entries.length < 2) fail('secondCellId', 'a comparison needs at least two cells');
  const machs = new Set(entries.flatMap((e) => (e.flow ? [e.flow.mach] : [])));
  if (machs.size > 1) warnings.push('the analyses ran at different Mach numbers: their Cp are each converted at their own Mach number');
  if (entries.some((e) => e.kind === 'pressure') && entries.some((e) => e.kind === 'analysis')) {
    warnings.push('pressure cells show Cp as given; analyses show the Cp their marched edge velocity implies');
  }
  return { entries, warnings };
}

/** A comparison as a table: each named cell's curves by surface and station, with its transition and drag above. */
export function comparisonTable(r: ComparisonResult): ResultTable {
  const rows: TableValue[][] = [];
  const notes: string[] = [];
  for (const e of r.entries) {
    for (const s of e.surfaces) {
      s.x.forEach((x, i) => rows.push([e.field, e.kind, s.name, x, s.cp[i] ?? null, s.n?.[i] ?? null, s.H?.[i] ?? null]));
      if (e.kind === 'analysis') notes.push(`${e.field} ${s.name}: transition ${s.transitionX ?? 'not reached'}${s.by ? ` (${s.by})` : ''}, cd ${s.cd ?? 'not given'}`);
    }
  }
  return { fields: ['cell', 'kind', 'surface', 'x', 'cp', 'n', 'H'], rows, notes: [...notes, ...warningNotes(r.warnings)] };
}
