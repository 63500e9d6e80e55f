import { describe, expect, it } from 'vitest';
import { OutputStore } from './outputs';
import { draftBytes, runBytes, type DraftDoc, type RunDoc } from './service';

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

  it('give the same draft answer as the same result held as text', () => {
    const store = new OutputStore();
    const asText = store.keep('k-1', 'e1', { ...computed, resultJson: resultText }, '2026-12-03T09:00:00.000Z');
    const asBytes = store.keep('k-2', 'e1', { ...computed, resultJson: new TextEncoder().encode(resultText) }, '2026-12-03T09:00:00.000Z');
    const cell = { cellId: 'c1', kind: 'analysis' as const, title: 'Nacelle – crest', collapsed: false, inputs: {}, runState: 'current' as const, problems: [] };
    const meta = { branchId: 'b', studyId: 's', revision: 4, savedAt: '2026-12-03T09:01:00.000Z' } as unknown as DraftDoc['meta'];
    const doc = (output: typeof asText): DraftDoc => ({ meta, cells: [{ cell, output, lastGoodOutput: output }, { cell: { ...cell, cellId: 'c2' }, output: null, lastGoodOutput: asText }] });
    const fromBytes = draftBytes(doc(asBytes)).toString('utf8');
    const fromText = draftBytes(doc({ ...asText, json: asBytes.json, bytes: undefined } as typeof asText)).toString('utf8');
    expect(fromBytes).toBe(fromText);
    const parsed = JSON.parse(fromBytes);
    expect(parsed.cells[0].output.result).toEqual(result);
    expect(parsed.cells[0].lastGoodOutput.key).toBe('k-2');
    expect(parsed.cells[1]).toMatchObject({ cellId: 'c2', title: 'Nacelle – crest', output: null, lastGoodOutput: { key: 'k-1' } });
    expect(parsed).toMatchObject({ branchId: 'b', revision: 4 });
    expect(JSON.parse(draftBytes({ meta, cells: [] }).toString('utf8'))).toEqual({ cells: [], branchId: 'b', studyId: 's', revision: 4, savedAt: '2026-12-03T09:01:00.000Z' });
  });
});
