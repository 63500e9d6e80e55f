import { afterAll, describe, expect, it } from 'vitest';
import { createEnginePool } from './pool';

const text = (bytes: Uint8Array | null) => new TextDecoder().decode(bytes!);

const pool = createEnginePool({ threads: 1 });
afterAll(() => pool.close());

describe('engine worker pool', () => {
  it('loads the engine cell computations in a worker thread and computes there', async () => {
    const out = await pool.run({
      kind: 'flatPlate',
      inputs: { mode: 'reynolds', reynolds: 1e6, length_m: 1, speed_mps: 1, kinematicViscosity_m2s: 1e-6, transitionMode: 'location', transitionLocation: 1, transitionReynolds: 1e6 },
      upstream: {},
    });
    expect(out.status).toBe('ok');
    // Blasius: mean CF = 1.328/√Re_L for a plate laminar to its end (H. Blasius 1908).
    expect(JSON.parse(text(out.resultJson)).cfMixed).toBeCloseTo(1.328 / Math.sqrt(1e6), 9);
    expect(pool.completed).toBe(1);
  });

  it("hands back the engine's message and field for bad input, not an exception", async () => {
    const out = await pool.run({
      kind: 'analysis',
      inputs: { flowCellId: crypto.randomUUID(), pressureCellId: crypto.randomUUID(), criteria: ['eN'], trips: {}, turbulent: true, governing: 'auto' },
      upstream: {
        flowCellId: { kind: 'flow', inputs: { mode: 'reynolds', reynolds: 1e6, mach: 0, altitude_m: 0, isaTemperatureOffset_K: 0, referenceLength_m: 1, turbulenceMode: 'nCrit', nCrit: 9, sweepDeg: 0 }, upstream: {} },
        pressureCellId: { kind: 'pressure', inputs: { text: 'x cp\n1 0\n0.5 zero\n0 1', uploadId: null, filename: null, layout: 'closedLoop', surfaceName: 'upper', hasRadius: false }, upstream: {} },
      },
    });
    expect(out).toMatchObject({ status: 'error', resultJson: null, error: { field: 'pressureTable line 3', line: 3 } });
  });

  it('computes several cells in one task, each settled on its own, in the order given', async () => {
    const before = pool.completed;
    const [plate, bad] = pool.runAll([
      {
        kind: 'flatPlate',
        inputs: { mode: 'reynolds', reynolds: 4e6, length_m: 1, speed_mps: 1, kinematicViscosity_m2s: 1e-6, transitionMode: 'location', transitionLocation: 1, transitionReynolds: 4e6 },
        upstream: {},
      },
      {
        kind: 'analysis',
        inputs: { flowCellId: crypto.randomUUID(), pressureCellId: crypto.randomUUID(), criteria: ['eN'], trips: {}, turbulent: true, governing: 'auto' },
        upstream: {
          flowCellId: { kind: 'flow', inputs: { mode: 'reynolds', reynolds: 1e6, mach: 0, altitude_m: 0, isaTemperatureOffset_K: 0, referenceLength_m: 1, turbulenceMode: 'nCrit', nCrit: 9, sweepDeg: 0 }, upstream: {} },
          pressureCellId: { kind: 'pressure', inputs: { text: 'x cp\n1 0\n0.5 zero\n0 1', uploadId: null, filename: null, layout: 'closedLoop', surfaceName: 'upper', hasRadius: false }, upstream: {} },
        },
      },
    ]);
    // Blasius: mean CF = 1.328/√Re_L for a plate laminar to its end (H. Blasius 1908).
    expect(JSON.parse(text((await plate!).resultJson)).cfMixed).toBeCloseTo(1.328 / Math.sqrt(4e6), 9);
    expect(await bad!).toMatchObject({ status: 'error', resultJson: null, error: { field: 'pressureTable line 3', line: 3 } });
    expect(pool.completed).toBe(before + 2);
  });
});
