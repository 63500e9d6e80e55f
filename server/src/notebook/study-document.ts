import { ENGINE_CAUTION, ENGINE_VERSION } from '@laminote/aero';
import { slug } from './export';
import { STUDY_DOCUMENT_FORMAT, type CellOutput, type Draft, type StudyDocument, type VersionDetail } from '@laminote/contracts';

/**
 * A study as one JSON document (libs/contracts/src/study-document.ts): its cells with kind, title and
 * inputs as typed, and the output stored for each. `npm run --silent aero -- study FILE` computes the
 * cells again from the inputs alone and must find the same numbers (to the 7 significant digits kept).
 */

type Source = StudyDocument['source'];

function storedOutput(output: CellOutput | null): StudyDocument['cells'][number]['output'] {
  return output ? { status: output.status, result: output.result ?? null, error: output.error, engineVersion: output.engineVersion } : null;
}

function documentOf(study: { id: string; title: string }, source: Source, cells: StudyDocument['cells'], now: Date): StudyDocument {
  return { format: STUDY_DOCUMENT_FORMAT, study: { id: study.id, title: study.title }, source, exportedAt: now.toISOString(), engineVersion: ENGINE_VERSION, caution: ENGINE_CAUTION, cells };
}

/**
 * A branch's working draft. A cell's output is included only when it is the output of the inputs as
 * they stand (up to date, or the failed run of them); an outdated or never-run cell has none.
 */
export function draftDocument(study: { id: string; title: string }, branch: { id: string; name: string }, draft: Draft, now = new Date()): StudyDocument {
  const cells = draft.cells.map((cell) => ({
    cellId: cell.cellId,
    kind: cell.kind,
    title: cell.title,
    inputs: cell.inputs,
    output: cell.runState === 'current' || cell.runState === 'failed' ? storedOutput(cell.output) : null,
  }));
  return documentOf(study, { kind: 'draft', branchId: branch.id, branchName: branch.name, versionId: null, versionNumber: null }, cells, now);
}

/** A saved version, with the outputs it kept. */
export function versionDocument(study: { id: string; title: string }, version: VersionDetail, now = new Date()): StudyDocument {
  const cells = version.cells.map((cell) => ({ cellId: cell.cellId, kind: cell.kind, title: cell.title, inputs: cell.inputs, output: storedOutput(cell.output) }));
  return documentOf(study, { kind: 'version', branchId: version.branchId, branchName: version.branchName, versionId: version.id, versionNumber: version.number }, cells, now);
}

/** The file name a study document downloads as: study, branch, and version when there is one. */
export function studyDocumentFilename(document: StudyDocument): string {
  const { source } = document;
  const version = source.versionNumber === null ? 'draft' : `v${source.versionNumber}`;
  return `${slug(document.study.title, 'study')}-${slug(source.branchName ?? 'branch', 'branch')}-${version}.laminote.json`;
}
