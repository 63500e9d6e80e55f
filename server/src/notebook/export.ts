import { ENGINE_CAUTION, xAtArc } from '@laminote/aero';
import {
  CELL_KIND_LABELS,
  type CellResults,
  type Draft,
  type DraftCell,
  type EngineResult,
} from '@laminote/contracts';
import { csvCommentLine, toCsv } from '../http/csv';
import { ProblemError } from '../http/problem';

/**
 * A cell's result as a file: CSV (one table; an analysis gives its stations per surface with a surface
 * column) or JSON (the whole result with a summary). Both say which study and cell they come from,
 * the engine version and state of the result, and the engineering caution.
 */

export type ExportFormat = 'csv' | 'json';

export interface ExportFile {
  filename: string;
  contentType: string;
  body: string;
}

type Cell = string | number | null;

/** A file-name part made from a title: ASCII letters and digits joined by hyphens, at most 60. */
export function slug(text: string, fallback = 'cell'): string {
  return (
    text
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || fallback
  );
}

/** The result a person would export: the newest output when it is good, else the last good one. */
function exportable(cell: DraftCell) {
  if (cell.output?.status === 'ok') return { output: cell.output, state: cell.runState };
  if (cell.lastGoodOutput) return { output: cell.lastGoodOutput, state: 'outdated' as const };
  return null;
}

function analysisSummary(r: EngineResult) {
  return r.surfaces.map((s) => ({
    surface: s.name,
    transitionS: s.transition.s,
    transitionX: xAtArc(s.stations.s, s.stations.x, s.transition.s),
    transitionBy: s.transition.by,
    criteria: s.transition.criteria,
    laminarSeparationS: s.laminarSeparation?.s ?? null,
    turbulentSeparationS: s.turbulentSeparation?.s ?? null,
    cd: s.cd,
    cdFriction: s.cdFriction,
  }));
}

function table(kind: Exclude<DraftCell['kind'], 'note'>, result: unknown): { fields: string[]; rows: Cell[][] } {
  switch (kind) {
    case 'analysis': {
      const r = result as EngineResult;
      const fields = ['surface', 's', 'x', 'ue', 'theta', 'deltaStar', 'H', 'cf', 'n'];
      const rows: Cell[][] = [];
      for (const surface of r.surfaces) {
        const st = surface.stations;
        for (let i = 0; i < st.s.length; i++) {
          rows.push([surface.name, st.s[i]!, st.x?.[i] ?? null, st.ue[i]!, st.theta[i] ?? null, st.deltaStar[i] ?? null, st.H[i] ?? null, st.cf[i] ?? null, st.n[i] ?? null]);
        }
      }
      return { fields, rows };
    }
    case 'pressure': {
      const r = result as CellResults['pressure'];
      const rows: Cell[][] = [];
      for (const surface of r.surfaces) {
        surface.x.forEach((x, i) => rows.push([surface.name, surface.line[i]!, x, surface.y?.[i] ?? null, surface.cp[i]!, surface.s[i]!, surface.r?.[i] ?? null]));
      }
      return { fields: ['surface', 'line', 'x', 'y', 'cp', 's', 'r'], rows };
    }
    case 'sweep': {
      const r = result as CellResults['sweep'];
      const rows: Cell[][] = [];
      for (const step of r.steps) {
        if (step.status === 'error') rows.push([step.value, null, null, null, null, null, null, null, step.error?.message ?? 'failed']);
        for (const s of step.surfaces) rows.push([step.value, s.name, s.transitionS, s.transitionX, s.by, s.laminarSeparationS, s.cd, step.cd, null]);
      }
      return { fields: [r.parameter, 'surface', 'transitionS', 'transitionX', 'transitionBy', 'laminarSeparationS', 'cdSurface', 'cd', 'error'], rows };
    }
    default: {
      // Flow, flat plate, leading edge, and any kind without a table of its own: its scalar results.
      const r = result as Record<string, unknown>;
      const rows: Cell[][] = [];
      for (const [name, value] of Object.entries(r)) {
        if (typeof value === 'number' || typeof value === 'string' || value === null) rows.push([name, value]);
        else if (name === 'thresholds' && value && typeof value === 'object') for (const [k, v] of Object.entries(value)) rows.push([`thresholds.${k}`, v as number]);
      }
      return { fields: ['quantity', 'value'], rows };
    }
  }
}

export function exportCell(draft: Draft, studyTitle: string, cellId: string, format: ExportFormat): ExportFile {
  const cell = draft.cells.find((c) => c.cellId === cellId);
  if (!cell) throw new ProblemError(404, 'not-found', 'Not found', { detail: 'No such cell in this draft.' });
  if (cell.kind === 'note') throw new ProblemError(400, 'invalid-input', 'Nothing to export', { detail: 'A note has no result to export.', field: 'cellId' });
  const picked = exportable(cell);
  if (!picked) {
    throw new ProblemError(409, 'no-result', 'This cell has no result yet', { detail: cell.output ? 'Its runs failed; fix the inputs and run it.' : 'Run the cell first.' });
  }
  const { output, state } = picked;
  const name = `${slug(studyTitle)}-${slug(cell.title || CELL_KIND_LABELS[cell.kind])}`;
  const source = {
    study: studyTitle,
    studyId: draft.studyId,
    branchId: draft.branchId,
    cell: { cellId: cell.cellId, kind: cell.kind, title: cell.title },
    state,
    key: output.key,
    engineVersion: output.engineVersion,
    computedAt: output.computedAt,
    caution: ENGINE_CAUTION,
  };
  if (format === 'json') {
    const summary = cell.kind === 'analysis' ? { surfaces: analysisSummary(output.result as EngineResult), cd: (output.result as EngineResult).cd } : undefined;
    return { filename: `${name}.json`, contentType: 'application/json; charset=utf-8', body: `${JSON.stringify({ ...source, ...(summary ? { summary } : {}), result: output.result }, null, 2)}\n` };
  }
  const { fields, rows } = table(cell.kind, output.result);
  const header = [
    csvCommentLine(`Laminote: ${studyTitle} / ${cell.title || CELL_KIND_LABELS[cell.kind]} (${CELL_KIND_LABELS[cell.kind]})`),
    csvCommentLine(`engine ${output.engineVersion}, computed ${output.computedAt}, ${state === 'current' ? 'current' : 'OUTDATED: the inputs changed since this result'}`),
    csvCommentLine(ENGINE_CAUTION),
  ];
  return { filename: `${name}.csv`, contentType: 'text/csv; charset=utf-8', body: `${header.join('\n')}\n${toCsv(fields, rows)}\n` };
}
