import { describe, expect, it } from 'vitest';
import { judge, runCase, VALIDATION_SUITES } from './index';

/**
 * The engine against every shared reference case: the same list the validation page runs on the server.
 * Each case names its source; the list itself is in ./index.ts.
 */
for (const suite of VALIDATION_SUITES) {
  describe(suite.title, () => {
    for (const c of suite.cases()) {
      it(`${c.title} — ${c.source}`, () => {
        const result = runCase(c);
        expect(Number.isFinite(result.value), `${c.id}: value`).toBe(true);
        expect(Math.abs(result.error), `${c.id}: ${result.value} against ${result.reference}`).toBeLessThan(c.tolerance.value);
      });
    }
  });
}

describe('the shared list', () => {
  it('has unique ids, a source and a positive tolerance for every case', () => {
    const ids = new Set<string>();
    for (const suite of VALIDATION_SUITES) {
      expect(ids.has(suite.id)).toBe(false);
      ids.add(suite.id);
      for (const c of suite.cases()) {
        expect(ids.has(c.id), c.id).toBe(false);
        ids.add(c.id);
        expect(c.source.length).toBeGreaterThan(5);
        expect(c.tolerance.value).toBeGreaterThan(0);
      }
    }
  });

  it('judges a value outside its tolerance as failing, in both kinds', () => {
    expect(judge(1.02, 1, { kind: 'relative', value: 0.015 }).pass).toBe(false);
    expect(judge(1.01, 1, { kind: 'relative', value: 0.015 }).pass).toBe(true);
    expect(judge(0.2206, 0.22, { kind: 'absolute', value: 5e-4 }).pass).toBe(false);
    expect(judge(Number.NaN, 1, { kind: 'absolute', value: 1 }).pass).toBe(false);
  });
});

describe('the methods catalogue', () => {
  it('names a method for every suite, and every method names its engine module and a source', async () => {
    const { METHODS } = await import('../methods');
    const { existsSync } = await import('node:fs');
    const ids = new Set(METHODS.map((m) => m.id));
    expect(ids.size).toBe(METHODS.length);
    for (const suite of VALIDATION_SUITES) for (const m of suite.methods) expect(ids.has(m), `${suite.id} → ${m}`).toBe(true);
    for (const m of METHODS) {
      expect(existsSync(new URL(`../${m.module}`, import.meta.url)), m.module).toBe(true);
      expect(m.sources.length).toBeGreaterThan(0);
      expect(m.formulas.length).toBeGreaterThan(0);
    }
  });

  it('has formulas and symbols that KaTeX typesets without error', async () => {
    const { METHODS } = await import('../methods');
    const katex = (await import('katex')).default;
    for (const m of METHODS) {
      for (const tex of [...m.formulas, ...m.symbols.map((s) => s.tex)]) {
        expect(() => katex.renderToString(tex, { throwOnError: true, displayMode: true }), `${m.id}: ${tex}`).not.toThrow();
      }
    }
  });
});
