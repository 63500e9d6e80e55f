import { Piscina } from 'piscina';
import { ProblemError } from '../http/problem';
import type { PdfJob } from './pdf';

/**
 * Reports are made into PDF on a worker thread (piscina): laying out a study with its plots takes the
 * better part of a second or more, which must not hold up the server's event loop and every other
 * request with it. One thread, started on the first PDF and let go after a minute without one.
 */
let pool: Piscina<PdfJob, Uint8Array> | null = null;

export async function renderPdfOffThread(job: PdfJob): Promise<Buffer> {
  pool ??= new Piscina<PdfJob, Uint8Array>({
    filename: new URL('./pdf-worker.mjs', import.meta.url).href,
    execArgv: [],
    minThreads: 0,
    maxThreads: 1,
    idleTimeout: 60_000,
    maxQueue: 32,
  });
  if (pool.queueSize >= 32) {
    throw new ProblemError(503, 'busy', 'Too many reports are being made right now', { detail: 'Try again in a minute.', retryAfter: 60 });
  }
  const bytes = await pool.run(job);
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}
