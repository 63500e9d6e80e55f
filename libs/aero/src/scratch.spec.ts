import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { Scratch } from './scratch';
import { joukowskiLoop } from '../test/joukowski';

describe('scratch storage for the engine’s work arrays', () => {
  it('hands out zeroed, separate views, zeroed again after a reset', () => {
    const scratch = new Scratch(1 << 12);
    const a = scratch.take(300);
    const b = scratch.take(300);
    a.fill(1);
    b.fill(2);
    expect(a.every((v) => v === 1)).toBe(true);
    expect(b.every((v) => v === 2)).toBe(true);
    scratch.reset();
    const c = scratch.take(600);
    expect(c.every((v) => v === 0)).toBe(true);
  });

  it('keeps earlier views intact when it grows, and gives fresh arrays beyond what it keeps', () => {
    const scratch = new Scratch(1 << 12);
    const a = scratch.take(1000);
    a.fill(3);
    const b = scratch.take(2000);
    expect(b.buffer).not.toBe(a.buffer);
    expect(a.every((v) => v === 3)).toBe(true);
    const big = scratch.take(1 << 13);
    expect(big.length).toBe(1 << 13);
    expect(big.buffer.byteLength).toBe(8 << 13);
  });

  it('leaves no trace of one analysis in the next', () => {
    // Two different cases, one after the other and back: the first gives the same result each time.
    const stations = (n: number) => Array.from({ length: n }, (_, i) => i / (n - 1));
    const roof = (s: number[], peak: number) => s.map((x) => peak * Math.tanh(40 * x) * (1 - 0.3 * Math.max(0, x - 0.5)));
    const s = stations(300);
    const first = { flow: { reynolds: 8e6 }, surfaces: [{ name: 'upper', s, ue: roof(s, 1.2) }] };
    const t = stations(700);
    const second = { flow: { reynolds: 3e7, mach: 0.5 }, sweepDeg: 25, surfaces: [{ name: 'a', s: t, ue: roof(t, 1.1) }, { name: 'b', s: t, ue: roof(t, 1.05) }] };
    const before = analyzeCase(first);
    analyzeCase(second);
    expect(analyzeCase(first)).toEqual(before);
  });

  it('gives the same result whether a table was prepared for this case or kept from the one before', () => {
    // Exact potential flow about a Joukowski section (the engine's analytic test loop), with and
    // without its y column (which adds a warning, given once).
    const loop = joukowskiLoop({ re: -0.1, im: 0.02 }, 1, 241);
    const withY = ['x y cp', ...loop.x.map((x, i) => `${x} ${loop.y[i]} ${loop.cp[i]}`)].join('\n');
    const withoutY = ['x cp', ...loop.x.map((x, i) => `${x} ${loop.cp[i]}`)].join('\n');
    let unseen = 0;
    for (const pressureTable of [withY, withoutY]) {
      const at = (reynolds: number, mach: number) => ({ flow: { reynolds, mach }, pressureTable, criteria: ['eN', 'michel'] });
      // Each case prepared afresh: a comment line makes each table one the engine has not read.
      const fresh = [at(3e6, 0.5), at(9e6, 0.5), at(9e6, 0.3)].map((c) => analyzeCase({ ...c, pressureTable: `# table ${++unseen}\n${pressureTable}` }));
      // The same cases one after another on one text, so each finds the surfaces the one before prepared
      // when the Mach number is the same, and prepares them again when it is not.
      analyzeCase(at(1e6, 0.5));
      const kept = [at(3e6, 0.5), at(9e6, 0.5), at(9e6, 0.3)].map((c) => analyzeCase(c));
      expect(kept).toEqual(fresh);
      expect(kept[1]!.warnings.filter((w) => w.includes('no y column')).length).toBe(pressureTable === withY ? 0 : 1);
    }
  });
});
