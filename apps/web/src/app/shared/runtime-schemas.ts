/**
 * The contract schemas the web app checks data with while it runs: a cell's inputs as they are typed,
 * a new cell's defaults, the server's draft in a conflict and the branch's job events. Loaded apart
 * from the first screen (`runtime-checks.ts`), since with zod they are about a third of the notebook's
 * JavaScript. Import this module only through `loadRuntimeChecks()`.
 */
export { CELL_INPUT_SCHEMAS, draftSchema, jobEventSchema, newCellInputs } from '@laminote/contracts';
