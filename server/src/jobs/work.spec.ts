import { describe, expect, it } from 'vitest';
import { CELL_KIND_REGISTRY, CELL_KINDS, type CellKind } from '@laminote/contracts';
import { isQuickRun, QUICK_RUN_CELLS, type JobWork } from './work';

/** One cell of a run left to compute (not stored yet), of the given kind. */
const todo = (kind: CellKind, cases = 0, position = 0): JobWork => ({
  cellId: `00000000-0000-4000-8000-${String(position).padStart(12, '0')}`,
  kind,
  key: `key-${position}`,
  problem: null,
  task: null,
  refs: [],
  cases,
  cached: false,
  position,
});

describe('which runs the server computes at once', () => {
  it('takes "quick" from the cell-kind registry, so a new kind declares it there', () => {
    for (const kind of CELL_KINDS) {
      const spec = CELL_KIND_REGISTRY[kind];
      // A kind that does not run has nothing to compute, quick or not.
      if (!spec.runs) expect(spec.quick, kind).toBe(false);
      expect(isQuickRun([todo(kind)]), kind).toBe(spec.quick);
    }
  });

  it('computes a section at once, and queues sweeps and polars', () => {
    expect(isQuickRun([todo('section'), todo('analysis', 0, 1)])).toBe(true);
    expect(isQuickRun([todo('sweep', 30)])).toBe(false);
    expect(isQuickRun([todo('polar')])).toBe(false);
  });

  it(`queues more than ${QUICK_RUN_CELLS} quick cells, and ignores cells already stored or that cannot run`, () => {
    const many = Array.from({ length: QUICK_RUN_CELLS + 1 }, (_, i) => todo('flow', 0, i));
    expect(isQuickRun(many)).toBe(false);
    const stored = many.map((w, i) => (i === 0 ? { ...w, cached: true } : w));
    expect(isQuickRun(stored)).toBe(true);
    const invalid = many.map((w, i) => (i === 0 ? { ...w, key: null } : w));
    expect(isQuickRun(invalid)).toBe(true);
  });
});
