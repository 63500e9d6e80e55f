/**
 * The engine's part of a notebook run: `npm run bench -- engine-run`.
 *
 * The cells of the run round-trip bench (server/bench/notebook.bench.ts): a flow condition at M 0.72
 * with a new Reynolds number each run, a 601-row closed-loop table of a symmetric Joukowski section
 * (2 × 300 stations), and a transition analysis with its defaults. They are planned as the server plans
 * them (planCells, sourceOf) and computed through computeCellOutput(task, 'bytes'), as the server's engine
 * worker threads call, each run on a structured copy of the tasks, as a worker thread receives them.
 *
 * Printed: the median per run and its parts, and beside it, in the same minutes, the same run the way
 * every run went before issue 15's third engine round: the table read afresh (here a table that
 * differs by a comment line each run, which the engine cannot have kept; it is then kept, so this
 * side also pays for keeping it, about 0.05 ms) and the result written with the toPrecision replacer.
 * The table reader itself is faster than it was, so this side understates the old cost a little.
 *
 *   npx tsx libs/aero/bench/engine-run.bench.ts
 */
import { randomUUID } from 'node:crypto';
import { computeCell, computeCellOutput, resultBytes, resultJson, type CellTask } from '../src/cells/compute';
import { planCells, sourceOf } from '../src/cells/plan';
import { parsePressureTable } from '../src/pressure-table';
import { joukowskiLoop } from '../test/joukowski';

const out = (line: string) => process.stdout.write(`${line}\n`);

/** The run bench's table: exact potential flow about a symmetric Joukowski section, 601 points. */
function benchTable(): string {
  const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, 601);
  return ['x y cp', ...loop.x.map((x, i) => `${x.toFixed(6)} ${loop.y[i]!.toFixed(6)} ${loop.cp[i]!.toFixed(6)}`)].join('\n');
}

/** The [flow, analysis] tasks one run hands to a worker (the flow rides with the analysis), copied as a worker receives them. */
function runTasks(reynolds: number, table: string): CellTask[] {
  const ids = { flow: randomUUID(), pressure: randomUUID(), analysis: randomUUID() };
  const plans = planCells([
    { cellId: ids.flow, kind: 'flow', inputs: { mode: 'reynolds', reynolds, mach: 0.72, nCrit: 9 } },
    { cellId: ids.pressure, kind: 'pressure', inputs: { text: table } },
    { cellId: ids.analysis, kind: 'analysis', inputs: { flowCellId: ids.flow, pressureCellId: ids.pressure } },
  ]);
  const task = (id: string): CellTask => {
    const { kind, inputs, upstream } = sourceOf(plans.get(id)!, plans);
    return { kind, inputs, upstream } as CellTask;
  };
  return structuredClone([task(ids.flow), task(ids.analysis)]);
}

/** The replacer results were written with before resultJson (engine ≤ 1.2.6 as first landed). */
function toPrecisionReplacer(_key: string, v: unknown): unknown {
  return typeof v === 'number' && !Number.isInteger(v) && Number.isFinite(v) ? Number(v.toPrecision(7)) : v;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : 0.5 * (sorted[mid - 1]! + sorted[mid]!);
}

const table = benchTable();
const rows = table.split('\n').length - 1;
const times = { run: [] as number[], analysis: [] as number[], json: [] as number[], text: [] as number[], parse: [] as number[], before: [] as number[], beforeJson: [] as number[] };
const ROUNDS = 60;
const PER_ROUND = 20;
let run = 0;
for (let round = 0; round < ROUNDS; round++) {
  // Now: the tasks as the pool receives them, through computeCellOutput; then its parts apart.
  for (let i = 0; i < PER_ROUND; i++) {
    const tasks = runTasks(6e6 + ++run * 1000, table);
    const t0 = performance.now();
    for (const task of tasks) if (computeCellOutput(task, 'bytes').status !== 'ok') throw new Error('the run bench case should compute');
    const t1 = performance.now();
    const analysis = tasks[1]!;
    const result = computeCell(analysis.kind, analysis.inputs, analysis.upstream);
    const t2 = performance.now();
    resultBytes(result);
    const t3 = performance.now();
    parsePressureTable(table);
    const t4 = performance.now();
    new TextEncoder().encode(resultJson(result));
    const t5 = performance.now();
    if (round >= ROUNDS / 4) {
      times.run.push(t1 - t0);
      times.analysis.push(t2 - t1);
      times.json.push(t3 - t2);
      times.parse.push(t4 - t3);
      times.text.push(t5 - t4);
    }
  }
  // Before: a table the engine has not read (a comment line tells each run's apart), the replacer.
  for (let i = 0; i < PER_ROUND; i++) {
    const tasks = runTasks(6e6 + ++run * 1000, `# run ${run}\n${table}`);
    const t0 = performance.now();
    let json = '';
    for (const task of tasks) json += JSON.stringify(computeCell(task.kind, task.inputs, task.upstream), toPrecisionReplacer);
    const t1 = performance.now();
    if (json.length === 0) throw new Error('no result');
    const analysis = tasks[1]!;
    const result = computeCell(analysis.kind, analysis.inputs, analysis.upstream);
    const t2 = performance.now();
    JSON.stringify(result, toPrecisionReplacer);
    const t3 = performance.now();
    if (round >= ROUNDS / 4) {
      times.before.push(t1 - t0);
      times.beforeJson.push(t3 - t2);
    }
  }
}

const ms = (values: number[]) => `${median(values).toFixed(3)} ms`;
out(`engine's part of a notebook run (the run bench's cells: ${rows}-row Joukowski table, M 0.72, analysis defaults), through computeCellOutput, median of ${times.run.length} runs`);
out(`  now:    ${ms(times.run)} a run [flow, analysis]; parts: analysis computed ${ms(times.analysis)}, result JSON written as bytes (resultBytes, as the server's engine threads write it) ${ms(times.json)} (as text then encoded: ${ms(times.text)}); the table is read once and kept`);
out(`  before: ${ms(times.before)} a run, as every run was before: a table the engine has not read (parsed and kept; the plain parse alone ${ms(times.parse)}), the result written with the toPrecision replacer (${ms(times.beforeJson)}) (a study's first run of a new table still pays the reading, not the replacer)`);
out(`  ratio now / before: ${(median(times.run) / median(times.before)).toFixed(2)}×`);
