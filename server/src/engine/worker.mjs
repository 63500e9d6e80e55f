// Entry of an engine worker thread. Plain JavaScript on purpose: a worker thread does not inherit the
// TypeScript loader of the process that starts it (under `npm start` that is tsx, under vitest it is
// vite), so it registers tsx itself and then loads the engine's cell computations. The pool starts workers with
// an empty execArgv so that this is the only loader in play.
import { register } from 'tsx/esm/api';

register();
const { computeCellOutput } = await import('../../../libs/aero/src/cells/compute.ts');

/**
 * A cell's output with its result's JSON as UTF-8 bytes (EngineOutput in pool.ts), written as bytes
 * by the engine (resultBytes) on this thread: the server's main thread sends them on to PostgreSQL
 * and into the run's answer as they are, never encoding the text.
 */
function computeCellBytes(task) {
  return computeCellOutput(task, 'bytes');
}

/**
 * Several cells in one task, each on its own: a fault that is not the input's (a defect, which
 * computeCellOutput throws) is handed back as that cell's `defect`, and the others stand.
 */
export function computeCellOutputs(tasks) {
  return tasks.map((task) => {
    try {
      return { output: computeCellBytes(task) };
    } catch (error) {
      return { defect: error instanceof Error ? error.message : String(error) };
    }
  });
}

export default computeCellBytes;
