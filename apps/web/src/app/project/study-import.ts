import { STUDY_DOCUMENT_FORMAT, type StudyDocument, studyDocumentSchema } from '@laminote/contracts';

/** The largest export the import button reads (the API's JSON body limit is larger; 500 cells fit). */
export const STUDY_IMPORT_MAX_BYTES = 20 * 1024 * 1024;

export type StudyFileReading = { ok: true; document: StudyDocument } | { ok: false; message: string };

/** Where in the document a problem is, in words: `cells[2].kind` becomes “cell 3, kind”. */
function placeOf(path: readonly PropertyKey[]): string {
  const words: string[] = [];
  for (let i = 0; i < path.length; i++) {
    const part = path[i];
    if (part === 'cells' && typeof path[i + 1] === 'number') {
      words.push(`cell ${(path[i + 1] as number) + 1}`);
      i++;
    } else {
      words.push(String(part));
    }
  }
  return words.join(', ');
}

/**
 * Reads a chosen file as a study export (`laminote.study/1`, as "Export study" writes it). Answers the
 * document, or one sentence naming the file and what is wrong with it — not JSON, not a study export,
 * or the field at fault — before anything is sent.
 */
export function readStudyFile(name: string, text: string): StudyFileReading {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    return { ok: false, message: `“${name}” is not a study export: it is not JSON text.` };
  }
  if (data === null || typeof data !== 'object' || Array.isArray(data) || (data as Record<string, unknown>)['format'] !== STUDY_DOCUMENT_FORMAT) {
    return { ok: false, message: `“${name}” is not a study export: a Laminote study export says "format": "${STUDY_DOCUMENT_FORMAT}" at its top.` };
  }
  const parsed = studyDocumentSchema.safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    return { ok: false, message: `“${name}” is a study export that cannot be read: ${placeOf(issue.path)}: ${issue.message}.` };
  }
  return { ok: true, document: parsed.data };
}
