import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Request, Response } from 'express';
import multer from 'multer';
import { binaryTableFault } from '@laminote/aero';
import { isUuid, textFault, UPLOAD_LIMIT_BYTES, type UploadResponse } from '@laminote/contracts';
import type { SessionUser } from '../auth/types';
import { audit } from '../audit/audit';
import type { Db } from '../db/client';
import { uploads } from '../db/schema';
import { badRequest, notFound, ProblemError } from '../http/problem';

/**
 * Uploaded pressure files: kept byte for byte in PostgreSQL with their SHA-256, and read into text for
 * the pressure cell (UTF-8, or Latin-1 when the bytes are not UTF-8, as older tools write).
 */

const receive = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: UPLOAD_LIMIT_BYTES, files: 1, fields: 5, parts: 6 },
  // Browsers send file names as UTF-8.
  defParamCharset: 'utf8',
}).single('file');

const limitMb = UPLOAD_LIMIT_BYTES / (1024 * 1024);

/** Reads the multipart body (field `file`), answering size and shape problems as problem+json. */
export function receiveFile(req: Request, res: Response): Promise<Express.Multer.File> {
  return new Promise((resolve, reject) => {
    receive(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return reject(new ProblemError(413, 'too-large', 'The file is too large', { detail: `The file is larger than ${limitMb} MB, the limit for an uploaded table.`, field: 'file' }));
        }
        if (err.code === 'LIMIT_UNEXPECTED_FILE') return reject(badRequest(`Send the file in the form field "file" (got "${err.field ?? ''}").`, 'file'));
        return reject(badRequest(`The upload was refused: ${err.message}.`, 'file'));
      }
      if (err) return reject(badRequest(`The upload could not be read: ${err instanceof Error ? err.message : String(err)}.`, 'file'));
      if (!req.file) return reject(badRequest('Send the table as multipart/form-data with the file in the field "file".', 'file'));
      resolve(req.file);
    });
  });
}

const CONTENT_TYPES = new Set(['text/plain', 'text/csv', 'text/tab-separated-values', 'application/vnd.ms-excel', 'application/octet-stream']);

function decode(bytes: Buffer): { text: string; encoding: UploadResponse['encoding'] } {
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes), encoding: 'utf-8' };
  } catch {
    return { text: bytes.toString('latin1'), encoding: 'latin1' };
  }
}

export async function storeUpload(db: Db, actor: SessionUser, ids: { projectId: string; studyId: string }, file: Express.Multer.File): Promise<UploadResponse> {
  const bytes = file.buffer;
  const fault = binaryTableFault(bytes);
  if (fault) throw badRequest(`The file is not a text table: it ${fault}. Save the sheet as CSV or text (x [y] Cp rows) and upload that.`, 'file');
  const { text, encoding } = decode(bytes);
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const contentType = CONTENT_TYPES.has(file.mimetype) ? file.mimetype : 'application/octet-stream';
  const nameFault = textFault(file.originalname);
  if (nameFault) throw badRequest(`The file name ${nameFault}; rename the file and upload it again.`, 'file');
  const filename = file.originalname.replace(/[\\/]/g, '_').slice(0, 255) || 'table.txt';
  const row = await db.transaction(async (tx) => {
    const [inserted] = await tx
      .insert(uploads)
      .values({ projectId: ids.projectId, studyId: ids.studyId, filename, contentType, size: bytes.length, sha256, content: bytes, uploadedBy: actor.id })
      .returning({ id: uploads.id });
    await audit(tx, { actorId: actor.id, projectId: ids.projectId, action: 'upload.create', targetType: 'upload', targetId: inserted!.id, detail: { studyId: ids.studyId, filename, size: bytes.length, sha256 } });
    return inserted!;
  });
  return { uploadId: row.id, filename, size: bytes.length, sha256, contentType, encoding, text };
}

export async function findUpload(db: Db, uploadId: string) {
  if (!isUuid(uploadId)) throw notFound('upload');
  const [row] = await db.select().from(uploads).where(eq(uploads.id, uploadId));
  if (!row) throw notFound('upload');
  return row;
}
