import { CELL_SCHEMAS, type CellInputs, type CellKind, type ComputedKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { joukowskiLoop } from '../../test/joukowski';
import { computeCell, computeCellOutput } from './compute';
import { RESULT_DIGITS, resultJson, roundedNumber, roundToResultDigits } from './result-json';

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
      // The value given is not touched (its numbers keep every digit).
      expect(JSON.stringify(result)).toBe(before);
      const output = computeCellOutput({ kind: 'analysis', inputs: analysis, upstream: { flowCellId: flow, pressureCellId: pressure } });
      expect(output.resultJson).toBe(JSON.stringify(result, referenceReplacer));
      for (const kind of ['flow', 'pressure'] as ComputedKind[]) {
        const source = kind === 'flow' ? flow : pressure;
        expect(resultJson(computeCell(kind, source.inputs, {}))).toBe(JSON.stringify(computeCell(kind, source.inputs, {}), referenceReplacer));
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
