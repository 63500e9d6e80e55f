import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { Scratch } from './scratch';

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
});
