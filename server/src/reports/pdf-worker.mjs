// Entry of the report PDF worker thread. Plain JavaScript on purpose, as the engine's worker: a worker
// thread does not inherit the process's TypeScript loader, so it registers tsx itself.
import { register } from 'tsx/esm/api';

register();
const { renderPdf } = await import('./pdf.ts');

/** A version report or a comparison ({ kind, model }) as PDF bytes. */
export default async function render(job) {
  return renderPdf(job);
}
