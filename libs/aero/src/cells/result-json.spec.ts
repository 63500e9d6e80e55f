import { CELL_SCHEMAS, type CellInputs, type CellKind, type ComputedKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { joukowskiLoop } from '../../test/joukowski';
import { computeCell, computeCellOutput } from './compute';
import { RESULT_DIGITS, resultBytes, resultJson, roundedNumber, roundToResultDigits } from './result-json';

/**
 * The reference is the language's own decimal rounding: ECMA-262, Number.prototype.toPrecision (the
 * integer n of RESULT_DIGITS digits nearest the exact value, the larger on a tie), read back with
 * Number. This is the replacer results were stored with before the arithmetic rounding, verbatim.
 */
const byToPrecision = (v: number) => Number(v.toPrecision(RESULT_DIGITS));
function referenceReplacer(_key: string, v: unknown): unknown {
  return typeof v === 'number' && !Number.isInteger(v) && Number.isFinite(v) ? byToPrecision(v) : v;
}

/** A deterministic generator (mulberry32), so a failure can be reproduced. */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The doubles next to v (a few units in the last place either side). */
function neighbours(v: number, count: number): number[] {
  const buffer = new DataView(new ArrayBuffer(8));
  buffer.setFloat64(0, v);
  const bits = buffer.getBigInt64(0);
  const out: number[] = [];
  for (let d = -count; d <= count; d++) {
    buffer.setBigInt64(0, bits + BigInt(d));
    out.push(buffer.getFloat64(0));
  }
  return out;
}

function mismatches(values: Iterable<number>): number[] {
  const bad: number[] = [];
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (!Object.is(roundToResultDigits(v), byToPrecision(v))) bad.push(v);
  }
  return bad;
}

describe('roundToResultDigits: the double toPrecision(7) reads back as', () => {
  it('agrees on a million values spread over every magnitude, both signs', () => {
    const next = random(15);
    const values = function* () {
      for (let i = 0; i < 1_000_000; i++) {
        const exponent = Math.floor(next() * 640) - 330;
        yield (next() < 0.5 ? -1 : 1) * (1 + 9 * next()) * 10 ** exponent;
      }
    };
    expect(mismatches(values())).toEqual([]);
  });

  it('agrees next to powers of ten and next to the decimal ties between two 7-digit neighbours', () => {
    const next = random(13);
    const values: number[] = [];
    for (let e = -320; e <= 308; e++) values.push(...neighbours(Number(`1e${e}`), 4), ...neighbours(Number(`9.9999995e${e}`), 4), ...neighbours(Number(`9.999999e${e}`), 4));
    for (let i = 0; i < 20_000; i++) {
      // (n + ½) · 10^(e − 6): the decimal halfway between two 7-digit values, as near as a double gets.
      const n = 1_000_000 + Math.floor(next() * 9_000_000);
      const e = Math.floor(next() * 60) - 30;
      values.push(...neighbours(Number(`${n}5e${e - 7}`), 3));
    }
    expect(mismatches(values)).toEqual([]);
  });

  it('agrees along runs of values of one scale (as in a result array) and where the scale changes', () => {
    const next = random(7);
    const values: number[] = [];
    for (let run = 0; run < 2000; run++) {
      const scale = 10 ** (Math.floor(next() * 40) - 20);
      for (let i = 0; i < 50; i++) values.push(scale * (0.9 + 0.2 * next()));
    }
    expect(mismatches(values)).toEqual([]);
  });

  it('rounds exact binary ties to the larger magnitude, as toPrecision does', () => {
    // 1234567.5 and 0.25-steps are exact in binary: a true tie at 7 digits.
    const ties = [1234567.5, -1234567.5, 9999999.5, 123456.75, 12345.625, 1000000.5, 0.5, 2.5e-7];
    expect(mismatches(ties)).toEqual([]);
    expect(roundToResultDigits(1234567.5)).toBe(1234568);
    expect(roundToResultDigits(-1234567.5)).toBe(-1234568);
  });

  it('agrees on subnormals, the largest doubles and values that round up to the next power of ten', () => {
    expect(mismatches([5e-324, -5e-324, 2.2250738585072014e-308, 1.7976931348623157e308, 9.99999951, 0.0999999951, 99999995000.1, 1e21 - 65536, 1e-15, 9.999999999999999e-16])).toEqual([]);
  });
});

/** Inputs as a cell holds them after validation: the schema's defaults under the given values. */
function inputs<K extends CellKind>(kind: K, given: Record<string, unknown>): CellInputs[K] {
  return CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];
}

/** resultBytes read back as text: the reference is JSON.stringify with the rounding replacer, UTF-8 encoded (TextEncoder, WHATWG Encoding). */
const bytesText = (value: unknown) => new TextDecoder('utf-8', { fatal: true }).decode(resultBytes(value));

describe('resultJson: the text of JSON.stringify with the rounding replacer, to the character', () => {
  it('gives the same text for analyses of a pressure table at several Reynolds and Mach numbers', () => {
    // Exact potential flow about a Joukowski section (the engine's analytic test loop).
    const loop = joukowskiLoop({ re: -0.08, im: 0.04 }, 2, 241);
    const text = ['x y cp', ...loop.x.map((x, i) => `${x.toFixed(6)} ${loop.y[i]!.toFixed(6)} ${loop.cp[i]!.toFixed(6)}`)].join('\n');
    const pressure = { kind: 'pressure' as const, inputs: inputs('pressure', { text }), upstream: {} };
    for (const [reynolds, mach] of [
      [3e6, 0],
      [8e6, 0.72],
      [2e7, 0.5],
    ] as const) {
      const flow = { kind: 'flow' as const, inputs: inputs('flow', { mode: 'reynolds', reynolds, mach, nCrit: 9 }), upstream: {} };
      const analysis = inputs('analysis', { flowCellId: crypto.randomUUID(), pressureCellId: crypto.randomUUID(), criteria: ['eN', 'michel', 'hRx', 'granville'] });
      const result = computeCell('analysis', analysis, { flowCellId: flow, pressureCellId: pressure });
      const before = JSON.stringify(result);
      expect(resultJson(result)).toBe(JSON.stringify(result, referenceReplacer));
      // The same as the bytes the server's engine threads write (resultBytes).
      expect(bytesText(result)).toBe(JSON.stringify(result, referenceReplacer));
      // The value given is not touched (its numbers keep every digit).
      expect(JSON.stringify(result)).toBe(before);
      const output = computeCellOutput({ kind: 'analysis', inputs: analysis, upstream: { flowCellId: flow, pressureCellId: pressure } });
      expect(output.resultJson).toBe(JSON.stringify(result, referenceReplacer));
      for (const kind of ['flow', 'pressure'] as ComputedKind[]) {
        const source = kind === 'flow' ? flow : pressure;
        expect(resultJson(computeCell(kind, source.inputs, {}))).toBe(JSON.stringify(computeCell(kind, source.inputs, {}), referenceReplacer));
        expect(bytesText(computeCell(kind, source.inputs, {}))).toBe(JSON.stringify(computeCell(kind, source.inputs, {}), referenceReplacer));
      }
    }
  });

  it('walks values as JSON.stringify does: toJSON, key order, holes, undefined, non-finite numbers, boxed primitives', () => {
    class Stamp {
      constructor(readonly at: number) {}
      toJSON(key: string) {
        return { key, at: this.at / 3 };
      }
    }
    const holes: unknown[] = [1.23456789];
    holes[3] = 2 / 3;
    const value = {
      b: 1 / 3,
      a: [Math.PI, -Math.E, 0, -0, 42, 1e300, NaN, Infinity, -Infinity, null, undefined, 'π', true],
      10: 0.1 + 0.2,
      2: { nested: [[1e-9 / 7], { deep: -123456.7891 }] },
      skipped: undefined,
      date: new Date(0),
      stamp: new Stamp(1),
      list: [new Stamp(2)],
      boxed: [new Number(1 / 7), new String('s'), new Boolean(false)],
      holes,
      fn: () => 1,
    };
    expect(resultJson(value)).toBe(JSON.stringify(value, referenceReplacer));
    expect(resultJson(1 / 7)).toBe(JSON.stringify(1 / 7, referenceReplacer));
    expect(resultJson('text')).toBe(JSON.stringify('text', referenceReplacer));
    expect(resultJson(undefined)).toBe(JSON.stringify(undefined, referenceReplacer));
  });

  it('keeps the replacer for callers that stringify themselves, with the same numbers', () => {
    const value = { r: [1 / 3, 2 / 3, 12345678.9, 1e-12 / 7] };
    expect(JSON.stringify(value, roundedNumber)).toBe(JSON.stringify(value, referenceReplacer));
  });
});


describe('resultBytes: the UTF-8 of JSON.stringify with the rounding replacer, to the byte', () => {
  it('writes a million numbers of every magnitude and sign as JSON.stringify writes them rounded', () => {
    const next = random(21);
    for (let chunk = 0; chunk < 100; chunk++) {
      const values: number[] = [];
      for (let i = 0; i < 10_000; i++) {
        const exponent = Math.floor(next() * 640) - 330;
        values.push((next() < 0.5 ? -1 : 1) * (1 + 9 * next()) * 10 ** exponent);
      }
      expect(bytesText(values)).toBe(JSON.stringify(values, referenceReplacer));
    }
  });

  it('writes the numbers next to powers of ten, decimal ties and notation changes, and integers, as JSON.stringify does', () => {
    const next = random(23);
    const values: number[] = [];
    for (let e = -320; e <= 308; e++) values.push(...neighbours(Number(`1e${e}`), 3), ...neighbours(Number(`9.9999995e${e}`), 3), ...neighbours(Number(`1.5e${e}`), 1));
    for (let i = 0; i < 20_000; i++) {
      const n = 1_000_000 + Math.floor(next() * 9_000_000);
      values.push(...neighbours(Number(`${n}5e${Math.floor(next() * 60) - 37}`), 2));
    }
    // Where Number::toString changes notation (ECMA-262: plain up to 1e21, "0.000…" down to 1e-6) and integers of every size.
    values.push(1e-7, 1.234567e-7, 9.999999e-7, 1e-6, 1.5e-6, 123456.7, 1234567.4, 12345678.9, 1e20 + 0.5e5, 123456789012345680000, 1e21, 1.5e21, 9.9999999e20);
    values.push(0, -0, 1, -1, 7, 10, 999_999_999, 1e9, -1e9, 2 ** 53, -(2 ** 53), 2 ** 31, 1e300, -1e300, 5e-324, -5e-324, 1.7976931348623157e308);
    for (let i = 0; i < 10_000; i++) values.push(Math.round((next() - 0.5) * 10 ** Math.floor(next() * 16)));
    expect(bytesText(values)).toBe(JSON.stringify(values, referenceReplacer));
  });

  it('writes text outside ASCII, escapes, holes, undefined and non-finite numbers as JSON.stringify does, and leaves the rest to it', () => {
    const holes: unknown[] = [1.23456789];
    holes[3] = 2 / 3;
    const plain = {
      'Re_θ – 1 µm': ['𝜃 ≥ 0', 'quote " and \\ and \n and \u0001', 'lone \ud800 surrogate'],
      a: [Math.PI, -Math.E, 0, -0, 42, 1e300, NaN, Infinity, -Infinity, null, undefined, true, false, () => 1],
      10: 0.1 + 0.2,
      2: { nested: [[1e-9 / 7], { deep: -123456.7891 }], empty: {}, none: [] },
      skipped: undefined,
      holes,
      bare: Object.assign(Object.create(null) as object, { z: 1 / 9 }),
    };
    expect(bytesText(plain)).toBe(JSON.stringify(plain, referenceReplacer));
    class Stamp {
      constructor(readonly at: number) {}
      toJSON() {
        return { at: this.at / 3 };
      }
    }
    for (const odd of [{ when: new Date(0) }, [new Stamp(2)], { boxed: new Number(1 / 7) }, { s: new Stamp(1) }, 1 / 7, 'text', [[[[{ deep: 1 / 3 }]]]]]) {
      expect(bytesText(odd)).toBe(JSON.stringify(odd, referenceReplacer));
    }
    let deep: unknown = [0.5];
    for (let i = 0; i < 500; i++) deep = [deep];
    expect(bytesText(deep)).toBe(JSON.stringify(deep, referenceReplacer));
    const cycle: Record<string, unknown> = {};
    cycle['self'] = cycle;
    // A cycle is refused as resultJson refuses it (its rounded copy runs out of stack before JSON.stringify sees the cycle).
    expect(() => resultJson(cycle)).toThrow();
    expect(() => resultBytes(cycle)).toThrow();
  });
});
