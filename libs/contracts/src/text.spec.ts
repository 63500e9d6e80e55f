import { describe, expect, it } from 'vitest';
import { isId, jsonFault, requestFieldLabel, safeText, textFault } from './text';

describe('safe text', () => {
  it('refuses NUL and unpaired UTF-16 surrogates, and keeps every other character (Unicode 15, §3.8 surrogates)', () => {
    expect(textFault('Outboard wing, Cp ≈ −0.8 at x/c 0.4 ✈ 𝛿*')).toBeNull();
    expect(textFault('a\u0000b')).toMatch(/NUL/);
    expect(textFault('\ud800')).toMatch(/unpaired/);
    expect(textFault('x\udc00')).toMatch(/unpaired/);
    expect(textFault('\udc00\ud800')).toMatch(/unpaired/);
    // A pair in the right order is one character (U+1D6FF here).
    expect(textFault('\ud835\udeff')).toBeNull();
  });

  it('names the field by its label in the zod message', () => {
    const result = safeText('title').safeParse('Cruise\u0000');
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.message).toBe('title must not contain the NUL character (U+0000)');
  });
});

describe('jsonFault', () => {
  it('finds the first value PostgreSQL cannot store, with its path', () => {
    expect(jsonFault({ cells: [{ inputs: { markdown: 'ok' } }] })).toBeNull();
    expect(jsonFault({ cells: [{ inputs: { markdown: 'ok' } }, { title: 'x\u0000' }] })).toEqual({ path: ['cells', 1, 'title'], message: expect.stringMatching(/NUL/) });
    expect(jsonFault({ reynolds: Infinity })).toEqual({ path: ['reynolds'], message: 'must be a finite number' });
    expect(jsonFault({ ['k\ud800']: 1 })?.message).toMatch(/field name/);
  });

  it('stops hostile nesting without recursing (a million levels)', () => {
    let deep: unknown = 1;
    for (let i = 0; i < 1_000_000; i++) deep = [deep];
    const fault = jsonFault({ inputs: deep });
    expect(fault?.message).toMatch(/nested too deeply/);
    expect(fault?.path.length).toBe(32);
  });
});

describe('labels and ids', () => {
  it('says a request path in screen words', () => {
    expect(requestFieldLabel(['cells', 2, 'inputs', 'leadingEdgeRadius'])).toBe('Cell 3 · leading edge radius');
    expect(requestFieldLabel(['cells', 0, 'inputs', 'reynolds'], () => 'Reynolds number')).toBe('Cell 1 · Reynolds number');
    expect(requestFieldLabel(['body'])).toBe('Comment');
    expect(requestFieldLabel([])).toBe('The request');
  });

  it('knows an id from anything else', () => {
    expect(isId('3f2b6f7e-8a4c-4d2e-9b1a-0c5d6e7f8a9b')).toBe(true);
    expect(isId('not-a-uuid')).toBe(false);
    expect(isId('3f2b6f7e-8a4c-4d2e-9b1a-0c5d6e7f8a9b\u0000')).toBe(false);
  });
});
