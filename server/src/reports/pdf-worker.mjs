// Entry of the report PDF worker thread. Plain JavaScript on purpose, as the engine's worker: a worker
// thread does not inherit the process's TypeScript loader, so it registers tsx itself.
import { register } from 'tsx/esm/api';

register();
const { renderReportPdf } = await import('./pdf.ts');

export default async function render(model) {
  return renderReportPdf(model);
}
