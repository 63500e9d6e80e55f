import { ENGINE_CAUTION, resultTable, xAtArc } from '@laminote/aero';
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
 * A cell's result as a file: CSV (its kind's one table from the engine's `resultTable`, with the
 * table's notes as comment lines above it) or JSON (the whole result with a summary). Both say which
 * study and cell they come from, the engine version and state of the result, and the engineering caution.
 */

export type ExportFormat = 'csv' | 'json';

export interface ExportFile {
  filename: string;
  contentType: string;
  body: string;
}

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
  const { fields, rows, notes } = resultTable(cell.kind, output.result as CellResults[typeof cell.kind]);
  const header = [
    csvCommentLine(`Laminote: ${studyTitle} / ${cell.title || CELL_KIND_LABELS[cell.kind]} (${CELL_KIND_LABELS[cell.kind]})`),
    csvCommentLine(`engine ${output.engineVersion}, computed ${output.computedAt}, ${state === 'current' ? 'current' : 'OUTDATED: the inputs changed since this result'}`),
    csvCommentLine(ENGINE_CAUTION),
    ...notes.map(csvCommentLine),
  ];
  return { filename: `${name}.csv`, contentType: 'text/csv; charset=utf-8', body: `${header.join('\n')}\n${toCsv(fields, rows)}\n` };
}
