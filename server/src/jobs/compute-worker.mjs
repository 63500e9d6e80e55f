// Entry of a job worker's compute thread: a cell through the engine's one entry point, or a chunk of
// sweep cases. Plain JavaScript and its own tsx registration, for the reasons in ../engine/worker.mjs.
import { register } from 'tsx/esm/api';

register();
const { computeCellOutput } = await import('../../../libs/aero/src/cells/compute.ts');
const cases = await import('./sweep-cases.ts');

export const computeSweepCases = cases.computeSweepCases;
export default computeCellOutput;
