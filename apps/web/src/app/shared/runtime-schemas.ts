/**
 * The contract schemas the web app checks data with while it runs: a cell's inputs as they are typed,
 * a new cell's defaults, the server's draft in a conflict and the branch's job events. Loaded apart
 * from the first screen (`runtime-checks.ts`), since with zod they are about a third of the notebook's
 * JavaScript. Import this module only through `loadRuntimeChecks()`.
 */
// From their own modules, not the index: the chunk then holds these schemas and what they use only.
export { CELL_INPUT_SCHEMAS, newCellInputs } from '@laminote/contracts/cell-schemas';
export { jobEventSchema } from '@laminote/contracts/jobs';
export { draftSchema } from '@laminote/contracts/notebook';
