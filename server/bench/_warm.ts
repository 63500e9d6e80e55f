import { computeSweepCase } from '@laminote/aero';
import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
const parsed = <K extends CellKind>(kind: K, inputs: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(inputs) as CellInputs[K];
const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, 601);
const table = ['# x', 'x y cp', ...loop.x.map((x, i) => `${x.toFixed(6)} ${loop.y[i]!.toFixed(6)} ${loop.cp[i]!.toFixed(6)}`)].join('\n');
const flow = { mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 };
const upstream = { analysisCellId: { kind: 'analysis' as const, inputs: parsed('analysis', { flowCellId: crypto.randomUUID(), pressureCellId: crypto.randomUUID(), criteria: ['eN', 'michel'] }), upstream: { flowCellId: { kind: 'flow' as const, inputs: parsed('flow', flow), upstream: {} }, pressureCellId: { kind: 'pressure' as const, inputs: parsed('pressure', { text: table }), upstream: {} } } } };
const sweep = parsed('sweep', { analysisCellId: crypto.randomUUID(), parameter: 'reynolds', from: 1e6, to: 3e7, steps: 1000 });
const rounds = Number(process.argv[2] ?? 6), n = Number(process.argv[3] ?? 200);
const res = [];
for (let r = 0; r < rounds; r++) {
  const c = process.cpuUsage();
  for (let i = 0; i < n; i++) computeSweepCase(sweep, upstream, (r * n + i) % 1000);
  const u = process.cpuUsage(c);
  res.push(((u.user + u.system) / 1000 / n).toFixed(2));
}
console.log(res.join(' '));
import { readdirSync, readFileSync } from 'node:fs';
const thr = () => new Map(readdirSync(`/proc/${process.pid}/task`).map((t) => { const f = readFileSync(`/proc/${process.pid}/task/${t}/stat`, 'utf8').split(') ')[1]!.split(' '); return [Number(t) - process.pid, (Number(f[11]) + Number(f[12])) * 10] as const; }));
const b = thr();
for (let i = 0; i < 1000; i++) computeSweepCase(sweep, upstream, i);
const a = thr();
console.log('per thread over 1000 more cases (ms):', [...a].map(([k, v]) => `${k}:${v - (b.get(k) ?? 0)}`).join(' '));
