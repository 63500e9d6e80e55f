import type { SweepResult } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { compareSweep } from './sweep-diff';

/** An N_crit sweep as the engine stores it (invented numbers), transition x/c per step on the upper surface. */
function sweep(transition: number[], cd: number[]): SweepResult {
  const values = [7, 9, 11];
  return {
    parameter: 'nCrit',
    values,
    steps: values.map((value, i) => ({
      value,
      status: 'ok' as const,
      error: null,
      reynolds: 2e7,
      cd: cd[i]!,
      surfaces: [{ name: 'upper', transitionS: transition[i]! + 0.01, transitionX: transition[i]!, by: 'eN', laminarSeparationS: null, cd: cd[i]! / 2 }],
      attachmentLine: null,
    })),
    warnings: [],
  };
}

describe('compareSweep', () => {
  it('shows what an upstream change did to a sweep whose own inputs are unchanged', () => {
    // Same N_crit range in A and B; B's analysis ran at a higher Reynolds number, so every step moved forward.
    const c = compareSweep('c', 'N_crit sweep', { state: 'ok', result: sweep([0.42, 0.48, 0.53], [0.0051, 0.0048, 0.0046]) }, { state: 'ok', result: sweep([0.35, 0.4, 0.44], [0.0056, 0.0053, 0.0051]) });
    expect(c.resultsDiffer).toBe(true);
    expect(c.steps.map((s) => s.value)).toEqual([7, 9, 11]);
    expect(c.steps[1]!.surfaces[0]!.transition).toMatchObject({ a: 0.48, b: 0.4, shift: 'forward', effect: 'adverse', coordinate: 'x' });
    expect(c.steps[1]!.cd.delta).toBeCloseTo(0.0005, 12);
    expect(c.steps[1]!.cd.effect).toBe('adverse');
  });

  it('says the results are the same when they are', () => {
    const same = sweep([0.42, 0.48, 0.53], [0.0051, 0.0048, 0.0046]);
    expect(compareSweep('c', 'N_crit sweep', { state: 'ok', result: same }, { state: 'ok', result: same }).resultsDiffer).toBe(false);
  });

  it('keeps a step only one side has, and a side that was not run', () => {
    const b = sweep([0.42, 0.48, 0.53], [0.0051, 0.0048, 0.0046]);
    const c = compareSweep('c', 'N_crit sweep', { state: 'notRun' }, { state: 'ok', result: b });
    expect(c.statusA).toBe('notRun');
    expect(c.steps[0]!.surfaces[0]!.transition).toMatchObject({ a: null, b: 0.42 });
  });
});
