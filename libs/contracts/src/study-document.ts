import { z } from 'zod';
import { cellErrorSchema } from './cell-schemas';
import { cellProblemSchema } from './notebook';

/**
 * A study as one JSON document: its cells (kind, title, inputs) and each cell's stored output.
 * `GET /api/branches/{branchId}/export` and `GET /api/versions/{versionId}/export` answer it, and
 * `npm run --silent aero -- study FILE` computes every cell of it again from its inputs and prints it
 * with fresh outputs, so a study can be archived and re-checked without the server.
 */

export const STUDY_DOCUMENT_FORMAT = 'laminote.study/1';

export const studyDocumentOutputSchema = z.object({
  status: z.enum(['ok', 'error']),
  /** The kind's result (numbers to 7 significant digits) when status is ok. */
  result: z.unknown().nullable(),
  error: cellErrorSchema.nullable(),
  engineVersion: z.string(),
});
export type StudyDocumentOutput = z.infer<typeof studyDocumentOutputSchema>;

export const studyDocumentCellSchema = z.object({
  cellId: z.string().min(1, 'cellId must name the cell'),
  /** A kind of the registry; checked when the cell is computed, so one unknown kind does not hide the rest. */
  kind: z.string(),
  title: z.string().default(''),
  inputs: z.record(z.string(), z.unknown()),
  /** The stored output; null when the cell has none (never run, a note, or inputs with problems). */
  output: studyDocumentOutputSchema.nullable().default(null),
  /** Why a cell could not be computed (its inputs, or a cell it uses). */
  problems: z.array(cellProblemSchema).optional(),
});
export type StudyDocumentCell = z.infer<typeof studyDocumentCellSchema>;

export const studyDocumentSchema = z.object({
  format: z.literal(STUDY_DOCUMENT_FORMAT, { error: `format must be "${STUDY_DOCUMENT_FORMAT}"` }),
  study: z.object({ id: z.string(), title: z.string() }),
  /** Where the cells come from: a branch's working draft, or a saved version. */
  source: z.object({
    kind: z.enum(['draft', 'version']),
    branchId: z.string().nullable(),
    branchName: z.string().nullable(),
    versionId: z.string().nullable(),
    versionNumber: z.number().int().nullable(),
  }),
  exportedAt: z.string(),
  /** The engine version of the program that wrote the outputs (the export, or the command line). */
  engineVersion: z.string(),
  caution: z.string(),
  cells: z.array(studyDocumentCellSchema).max(500, 'a study document holds at most 500 cells'),
});
export type StudyDocument = z.infer<typeof studyDocumentSchema>;

/** POST /api/projects/:projectId/studies/import: a study document, as exported, made a new study here. */
export const importStudySchema = z.object({
  document: studyDocumentSchema,
  /** The new study's title; the document's own title when left out. */
  title: z.string().trim().min(1, 'title must not be empty').max(200, 'title must be at most 200 characters').optional(),
});
export type ImportStudy = z.input<typeof importStudySchema>;

/** What an import answers: the new study, and what was kept. */
export const importStudyResultSchema = z.object({
  studyId: z.string().uuid(),
  branchId: z.string().uuid(),
  title: z.string(),
  cellCount: z.number().int(),
  /** Cells whose stored output came along (same engine version and inputs as here). */
  outputsKept: z.number().int(),
  /** Cells whose output was left behind (another engine version, or inputs that no longer read); run them to compute it again. */
  outputsLeft: z.number().int(),
});
export type ImportStudyResult = z.infer<typeof importStudyResultSchema>;
