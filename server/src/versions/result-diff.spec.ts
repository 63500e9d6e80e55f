import { describe, expect, it } from 'vitest';
import type { EngineResult, EngineSurfaceResult } from '@laminote/contracts';
import { compareAnalysis, sideOf } from './result-diff';
import { diffPressureTables } from './table-diff';

/**
 * The sign conventions of the compare view (common practice in laminar-flow design): transition
 * moving aft lengthens the laminar run and is favourable; drag going up is adverse; turbulent
 * separation appearing is adverse.
 */

function surface(over: Partial<EngineSurfaceResult> & { transitionS: number | null }): EngineSurfaceResult {
  const s = [0, 0.25, 0.5, 0.75, 1];
  return {
    name: 'upper',
    stations: { s, x: s, ue: s.map(() => 1), theta: s.map(() => 1e-3), deltaStar: s.map(() => 2.6e-3), H: s.map(() => 2.6), cf: s.map(() => 1e-3), n: s.map((_, i) => i * 2) },
    transition: { s: over.transitionS, by: over.transitionS === null ? null : 'eN', criteria: { eN: over.transitionS === null ? null : { s: over.transitionS, reTheta: 900, reS: 2e6 } } },
    laminarSeparation: null,
    turbulentSeparation: null,
    cd: 0.003,
    cdFriction: 0.0025,
    ...over,
  };
}

const result = (surfaces: EngineSurfaceResult[], cd = 0.003): EngineResult => ({
  engineVersion: '1.0.0',
  flow: { reynolds: 6e6, mach: 0, nCrit: 9, nCritFrom: 'given' },
  surfaces,
  cd,
  attachmentLine: null,
  warnings: [],
});
const ok = (r: EngineResult) => sideOf(true, { status: 'ok', result: r, error: null });

describe('compareAnalysis', () => {
  it('overlays Cp from the edge velocity, kept to the digits of a stored result', () => {
    // Incompressible: Cp = 1 − (ue/U∞)² (Bernoulli); at M 0.7 the compressible relation the engine uses, checked here only for being rounded.
    const ue = [0, 0.3, 0.7, 1.1, 1.3];
    const a = surface({ transitionS: 0.5, stations: { ...surface({ transitionS: 0.5 }).stations, ue } });
    const compared = compareAnalysis('c', 'T', ok(result([a])), ok({ ...result([a]), flow: { reynolds: 6e6, mach: 0.7, nCrit: 9, nCritFrom: 'given' } }));
    const overlay = compared.surfaces[0]!.overlay;
    expect(overlay.a!.cp).toEqual(ue.map((u) => Number((1 - u * u).toPrecision(7))));
    for (const cp of overlay.b!.cp) expect(cp === null || cp === Number(cp.toPrecision(7))).toBe(true);
  });

  it('calls transition moving aft with less drag favourable, and the reverse adverse', () => {
    const aft = compareAnalysis('c', 'T', ok(result([surface({ transitionS: 0.3 })], 0.004)), ok(result([surface({ transitionS: 0.5, cd: 0.0025 })], 0.0035)));
    const upper = aft.surfaces[0]!;
    expect(upper.transition).toMatchObject({ a: 0.3, b: 0.5, shift: 'aft', effect: 'favourable' });
    expect(upper.transition.delta).toBeCloseTo(0.2, 12);
    expect(upper.laminarExtent).toMatchObject({ a: 0.3, b: 0.5, effect: 'favourable' });
    expect(upper.cd).toMatchObject({ effect: 'favourable' });
    expect(aft.cd.effect).toBe('favourable');

    const forward = compareAnalysis('c', 'T', ok(result([surface({ transitionS: 0.5 })])), ok(result([surface({ transitionS: 0.3, cd: 0.0035 })])));
    expect(forward.surfaces[0]!.transition).toMatchObject({ shift: 'forward', effect: 'adverse' });
    expect(forward.surfaces[0]!.cd.effect).toBe('adverse');
  });

  it('reads a transition that appears as adverse, one that goes away as favourable, and new turbulent separation as adverse', () => {
    const appears = compareAnalysis('c', 'T', ok(result([surface({ transitionS: null })])), ok(result([surface({ transitionS: 0.6, turbulentSeparation: { s: 0.95 } })])));
    expect(appears.surfaces[0]!.transition).toMatchObject({ a: null, b: 0.6, shift: 'appeared', effect: 'adverse' });
    expect(appears.surfaces[0]!.turbulentSeparation).toMatchObject({ a: null, b: 0.95, effect: 'adverse' });
    const vanishes = compareAnalysis('c', 'T', ok(result([surface({ transitionS: 0.6 })])), ok(result([surface({ transitionS: null })])));
    expect(vanishes.surfaces[0]!.transition).toMatchObject({ shift: 'vanished', effect: 'favourable' });
  });

  it('says what a version lacks instead of comparing: no cell, no stored result, a failed run', () => {
    const r = compareAnalysis('c', 'T', sideOf(false, null), sideOf(true, { status: 'error', result: null, error: { message: 'pressureTable line 7: not a number' } }));
    expect(r).toMatchObject({ statusA: 'absent', statusB: 'error', errorB: 'pressureTable line 7: not a number', surfaces: [] });
    expect(sideOf(true, null)).toEqual({ state: 'notRun' });
  });
});

describe('diffPressureTables', () => {
  it('matches rows by x on each side of a loop without y (the first side is the upper one, as the engine names them)', () => {
    const a = 'x cp\n1 0.1\n0.5 -0.4\n0 1\n0.5 -0.2\n1 0.1';
    const b = 'x cp\n1 0.1\n0.5 -0.45\n0 1\n0.5 -0.2\n1 0.1\n';
    const diff = diffPressureTables({ text: a, layout: 'closedLoop', surfaceName: 'upper' }, { text: b, layout: 'closedLoop', surfaceName: 'upper' });
    const upper = diff.surfaces.find((s) => s.name === 'upper')!;
    expect(upper.maxAbsDeltaCp).toBeCloseTo(0.05, 12);
    expect(upper.maxAt).toBe(0.5);
    expect(diff.surfaces.find((s) => s.name === 'lower')!.maxAbsDeltaCp).toBe(0);
  });

  it('names the line of a table that does not read and makes no numeric difference', () => {
    const diff = diffPressureTables({ text: 'x cp\n0 0\n1 0', layout: 'surface', surfaceName: 'upper' }, { text: 'x cp\n0 0\n1 zero', layout: 'surface', surfaceName: 'upper' });
    expect(diff.surfaces).toEqual([]);
    expect(diff.problems).toEqual([{ side: 'b', line: 3, message: expect.stringContaining('zero') }]);
  });
});
