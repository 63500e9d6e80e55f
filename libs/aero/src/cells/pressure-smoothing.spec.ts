import { CELL_SCHEMAS, type CellInputs, type CellKind, type EngineResult, type PressureResult } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { computeCell } from './compute';

const inputs = <K extends CellKind>(kind: K, given: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];
const ID = '00000000-0000-4000-8000-000000000001';
const ID2 = '00000000-0000-4000-8000-000000000002';

/** Deterministic pseudo-random numbers (Park–Miller), so the scatter is the same on every run. */
function random(seed: number) {
  let state = seed;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
}

/**
 * Tap data on one surface: Ue = 1 + 0.2 sin 3x (exact slope 0.6 cos 3x) at 60 taps, Cp = 1 − Ue² with
 * uniform scatter of ±0.004 in Ue (standard deviation 0.004/√3, the uniform distribution).
 */
function taps(amplitude: number) {
  const next = random(11);
  const x = Array.from({ length: 60 }, (_, i) => 0.02 + (i / 59) * 0.96);
  const rows = x.map((xi) => {
    const ue = 1 + 0.2 * Math.sin(3 * xi) + amplitude * (2 * next() - 1);
    return `${xi.toFixed(6)} ${(1 - ue * ue).toFixed(6)}`;
  });
  return { x, text: ['x cp', ...rows].join('\n') };
}

describe('smoothing you can see on the pressure cell', () => {
  it('shows the automatic width from the scatter, the fit’s Cp, and dUe/ds smoothed beside unsmoothed', () => {
    const { x, text } = taps(0.004);
    const result = computeCell('pressure', inputs('pressure', { text, layout: 'surface' }), {}) as PressureResult;
    const view = result.surfaces[0]!.smoothing!;
    expect(view.halfWidth).toBeGreaterThan(2);
    expect(view.scatter / (0.004 / Math.sqrt(3))).toBeGreaterThan(0.75);
    expect(view.scatter / (0.004 / Math.sqrt(3))).toBeLessThan(1.25);
    const rms = (slope: number[]) => Math.sqrt(slope.reduce((a, v, i) => a + (v - 0.6 * Math.cos(3 * x[i]!)) ** 2, 0) / slope.length);
    // The smoothed slope is the closer one to the exact slope (Savitzky & Golay 1964).
    expect(rms(view.dUeds)).toBeLessThan(0.5 * rms(view.dUedsRaw));
    expect(view.cp).toHaveLength(60);
    expect(CELL_SCHEMAS.pressure.result.safeParse(result).success).toBe(true);
  });

  it('honours off and a chosen width, and the analysis differentiates with the same choice', () => {
    const { text } = taps(0.004);
    const off = computeCell('pressure', inputs('pressure', { text, layout: 'surface', smoothing: 'off' }), {}) as PressureResult;
    expect(off.surfaces[0]!.smoothing!.halfWidth).toBe(1);
    expect(off.surfaces[0]!.smoothing!.dUeds).toEqual(off.surfaces[0]!.smoothing!.dUedsRaw);
    const chosen = inputs('pressure', { text, layout: 'surface', smoothing: 'width', smoothingHalfWidth: 6 });
    expect((computeCell('pressure', chosen, {}) as PressureResult).surfaces[0]!.smoothing!.halfWidth).toBe(6);
    const flow = { kind: 'flow' as const, inputs: inputs('flow', { mode: 'reynolds', reynolds: 3e6, mach: 0 }), upstream: {} };
    const analysis = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2 }), { flowCellId: flow, pressureCellId: { kind: 'pressure', inputs: chosen, upstream: {} } }) as EngineResult;
    expect(analysis.surfaces[0]!.smoothing!.halfWidth).toBe(6);
  });
});
