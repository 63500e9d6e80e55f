import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { computeSweepCase, roundedNumber, type CellTask } from '@laminote/aero';
import { CELL_SCHEMAS, type CellInputs, type CellKind, type SweepInputs } from '@laminote/contracts';
import { joukowskiLoop } from '../../../libs/aero/test/joukowski';
import { computeSweepCases, SweepCasesComputation } from './sweep-cases';

const parsed = <K extends CellKind>(kind: K, inputs: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(inputs) as CellInputs[K];

/** A Reynolds-number sweep of an analysis of exact Joukowski-section pressures (the engine's own fixture), as a job worker gets it. */
function sweepTask(): CellTask {
  const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, 161);
  const text = ['x y cp', ...loop.x.map((x, i) => `${x} ${loop.y[i]} ${loop.cp[i]}`)].join('\n');
  const flow = { kind: 'flow' as const, inputs: parsed('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 }), upstream: {} };
  const pressure = { kind: 'pressure' as const, inputs: parsed('pressure', { text }), upstream: {} };
  const analysis = { kind: 'analysis' as const, inputs: parsed('analysis', { flowCellId: randomUUID(), pressureCellId: randomUUID(), criteria: ['eN', 'michel'] }), upstream: { flowCellId: flow, pressureCellId: pressure } };
  return { kind: 'sweep', inputs: parsed('sweep', { analysisCellId: randomUUID(), parameter: 'reynolds', from: 1e6, to: 2e7, steps: 40 }), upstream: { analysisCellId: analysis } };
}

describe('a chunk of sweep cases', () => {
  const task = sweepTask();
  const indices = [3, 4, 5, 17, 39];
  /** Each case as the engine's one entry point computes it, as JSON.stringify with the result rounding writes it. */
  const reference = indices.map((i) => JSON.parse(JSON.stringify(computeSweepCase(task.inputs as SweepInputs, task.upstream, i), roundedNumber)) as unknown);

  it('is one JSON array of its cases in the order asked for, each as the engine computes it alone', () => {
    const out = computeSweepCases({ task, indices });
    expect(out.indices).toEqual(indices);
    expect(JSON.parse(Buffer.from(out.json).toString('utf8'))).toEqual(reference);
    expect(out.engineCpuMs).toBeGreaterThan(0);
  });

  it('computed a slice at a time (a worker letting its event loop run between them) gives the same cases', () => {
    const computation = new SweepCasesComputation({ task, indices });
    let slices = 0;
    while (!computation.done) {
      // No time at all: one case a slice.
      computation.step(0);
      slices++;
    }
    expect(slices).toBe(indices.length);
    expect(JSON.parse(Buffer.from(computation.output().json).toString('utf8'))).toEqual(reference);
  });
});
