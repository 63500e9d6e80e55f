/**
 * The least server that could answer the notebook bench's run: a bare `node:http` handler in front of
 * the same engine entry (EnginePool.runAll, the worker's computeCellOutputs) on the same thread pool,
 * with no sign-in, no database, no Express, no logging. It keeps the study's cells in memory as the
 * tasks a run of the analysis hands to the engine (built by the server's own planCells and taskOf); a
 * request names a new Reynolds number, and the answer is the two computed outputs (flow and analysis)
 * as the engine wrote them. The notebook bench times it at the same concurrency as the real run and
 * sets it against the same floor: what it costs is what this machine's cores cannot avoid for the job.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { CellTask, EngineOutput, EnginePool } from '../src/engine/pool';
import { planCells, taskOf, type StoredCell } from '../src/notebook/plan';

/** A run's cells for the least server: the study's three cells, the flow condition first. */
export interface LeastServerStudy {
  flow: StoredCell;
  pressure: StoredCell;
  analysis: StoredCell;
}

/** The tasks a run of the analysis hands the engine (flow condition first, riding with the analysis, as NotebookService batches them). */
function runTasks(study: LeastServerStudy): { flow: CellTask; analysis: CellTask } {
  const cells = [study.flow, study.pressure, study.analysis];
  const plans = planCells(cells);
  const flow = taskOf(plans.get(study.flow.cellId)!, plans);
  const analysis = taskOf(plans.get(study.analysis.cellId)!, plans);
  if (!flow || !analysis) throw new Error('the least server was given a study that cannot run');
  return { flow, analysis };
}

/** The same task with the flow condition's Reynolds number replaced, wherever the flow's inputs stand (the task itself or an upstream source). */
function withReynolds(task: CellTask, reynolds: number): CellTask {
  const inputs = task.kind === 'flow' ? { ...(task.inputs as object), reynolds } : task.inputs;
  const upstream = Object.fromEntries(Object.entries(task.upstream).map(([field, source]) => [field, withReynolds(source as CellTask, reynolds)]));
  return { ...task, inputs, upstream } as CellTask;
}

export interface LeastServer {
  base: string;
  /** Runs answered (200). */
  readonly answered: number;
  close(): Promise<void>;
}

export async function startLeastServer(engine: EnginePool, study: LeastServerStudy): Promise<LeastServer> {
  const template = runTasks(study);
  let answered = 0;
  const fail = (res: http.ServerResponse, status: number, message: string) => {
    res.writeHead(status, { 'content-type': 'text/plain' });
    res.end(message);
  };
  const server = http.createServer((req, res) => {
    if (req.method !== 'POST' || req.url !== '/run') return fail(res, 404, 'POST /run only');
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      let reynolds: unknown;
      try {
        reynolds = (JSON.parse(Buffer.concat(chunks).toString('utf8')) as { reynolds?: unknown }).reynolds;
      } catch {
        return fail(res, 400, 'the body is not JSON');
      }
      if (typeof reynolds !== 'number' || !Number.isFinite(reynolds) || reynolds <= 0) return fail(res, 400, 'reynolds: a positive number');
      const [flow, analysis] = engine.runAll([withReynolds(template.flow, reynolds), withReynolds(template.analysis, reynolds)]);
      Promise.all([flow!, analysis!]).then(
        ([f, a]) => {
          // Each result goes in as the UTF-8 bytes the engine thread made, as the real server sends it.
          const output = (o: EngineOutput): (string | Uint8Array)[] => [`{"status":${JSON.stringify(o.status)},"error":${JSON.stringify(o.error)},"durationMs":${o.durationMs},"result":`, o.resultJson ?? 'null', '}'];
          const body = Buffer.concat(['{"flow":', ...output(f), ',"analysis":', ...output(a), '}'].map((p) => (typeof p === 'string' ? Buffer.from(p) : p)));
          res.writeHead(200, { 'content-type': 'application/json', 'content-length': body.length });
          res.end(body);
          answered++;
        },
        (error: unknown) => fail(res, 500, error instanceof Error ? error.message : String(error)),
      );
    });
  });
  server.keepAliveTimeout = 60_000;
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    base: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    get answered() {
      return answered;
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
