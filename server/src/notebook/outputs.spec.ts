import { describe, expect, it } from 'vitest';
import { OutputStore } from './outputs';
import { runBytes, type RunDoc } from './service';

// A result with characters outside ASCII (a warning's θ and dash, a unit's µ), so a byte that is not a
// character would show.
const result = { x: [0.5, 1e-7, -2.25], warnings: ['Re_θ below 100 – the method’s range ends', 'k = 5 µm'] };
const resultText = JSON.stringify(result);
const computed = { status: 'ok' as const, error: null, durationMs: 1.6 };

describe('outputs held as bytes (a result as an engine thread hands it over)', () => {
  it('give the same output text and API answer as the same result held as text', () => {
    const store = new OutputStore();
    const asText = store.keep('k-text', 'e1', { ...computed, resultJson: resultText }, '2026-12-03T09:00:00.000Z');
    const asBytes = store.keep('k-bytes', 'e1', { ...computed, resultJson: new TextEncoder().encode(resultText) }, '2026-12-03T09:00:00.000Z');
    expect(asBytes.bytes).toBeInstanceOf(Buffer);
    expect(asBytes.size).toBe(Buffer.byteLength(asBytes.json));
    expect(asBytes.json).toBe(asText.json.replace('"k-text"', '"k-bytes"'));
    expect(JSON.parse(asBytes.json)).toEqual({ key: 'k-bytes', status: 'ok', error: null, engineVersion: 'e1', durationMs: 2, computedAt: '2026-12-03T09:00:00.000Z', result });

    const cell = { cellId: 'c1', kind: 'analysis' as const, title: 'Wing – tip', collapsed: false, inputs: {}, runState: 'current' as const, problems: [] };
    const doc = (output: typeof asText): RunDoc => ({
      meta: { branchId: 'b', studyId: 's', revision: 3 },
      cells: [
        { cell, output, lastGoodOutput: null },
        { cell: { ...cell, cellId: 'c2' }, output: asText, lastGoodOutput: output },
      ],
      ran: [],
    });
    const fromBytes = runBytes(doc(asBytes)).toString('utf8');
    const fromText = runBytes(doc({ ...asText, json: asBytes.json, bytes: undefined } as typeof asText)).toString('utf8');
    expect(fromBytes).toBe(fromText);
    expect(JSON.parse(fromBytes).cells[0].output.result).toEqual(result);
    expect(JSON.parse(runBytes({ ...doc(asBytes), cells: [] }).toString('utf8'))).toEqual({ cells: [], branchId: 'b', studyId: 's', revision: 3, ran: [] });
  });
});
