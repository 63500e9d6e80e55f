import { describe, expect, it } from 'vitest';
import { splitOutputKeys, storedCells, storedTrash } from './draft-keys';

const cell = (cellId: string, keys: { lastOutputKey?: string | null; lastGoodOutputKey?: string | null } = {}) => ({
  cellId,
  kind: 'flow',
  title: cellId,
  collapsed: false,
  inputs: { mach: 0.7 },
  ...keys,
});

describe('draft output keys, kept apart from the cells', () => {
  it('writes cells and trash without keys, and the keys of the cells in either by cell id', () => {
    const written = splitOutputKeys(
      [cell('a', { lastOutputKey: 'k2', lastGoodOutputKey: 'k1' }), cell('b'), cell('c', { lastOutputKey: 'k3', lastGoodOutputKey: null })],
      [{ ...cell('t', { lastOutputKey: 'kt', lastGoodOutputKey: 'kt' }), deletedAt: '2026-12-02T16:00:00.000Z', deletedBy: null }],
    );
    expect(written.cells).toEqual([cell('a'), cell('b'), cell('c')]);
    expect(written.trash).toEqual([{ ...cell('t'), deletedAt: '2026-12-02T16:00:00.000Z', deletedBy: null }]);
    expect(written.outputKeys).toEqual({ a: { last: 'k2', good: 'k1' }, c: { last: 'k3', good: null }, t: { last: 'kt', good: 'kt' } });
  });

  it('reads back the cells and the trash as they were written, keys and all', () => {
    const cells = [cell('a', { lastOutputKey: 'k2', lastGoodOutputKey: 'k1' }), cell('b', { lastOutputKey: null, lastGoodOutputKey: null })];
    const trash = [{ ...cell('t', { lastOutputKey: 'kt', lastGoodOutputKey: null }), deletedAt: '2026-12-02T16:00:00.000Z', deletedBy: 'u' }];
    const written = splitOutputKeys(cells, trash);
    const row = { cells: written.cells, trash: written.trash, outputKeys: written.outputKeys };
    expect(storedCells(row)).toEqual(cells);
    expect(storedTrash(row)).toEqual(trash);
  });

  it('gives a cell in both the keys it has in the cells, and a cell with no entry none', () => {
    const written = splitOutputKeys([cell('a', { lastOutputKey: 'new' })], [{ ...cell('a', { lastOutputKey: 'old', lastGoodOutputKey: 'old' }), deletedAt: 'x', deletedBy: null }]);
    expect(written.outputKeys).toEqual({ a: { last: 'new', good: null } });
    const cleared = splitOutputKeys([cell('a')], [{ ...cell('a', { lastOutputKey: 'old' }), deletedAt: 'x', deletedBy: null }]);
    expect(cleared.outputKeys).toEqual({});
    // Keys left over for a cell in neither (a run that marked a cell deleted meanwhile) do not show.
    expect(storedCells({ cells: [cell('b')], outputKeys: { gone: { last: 'k', good: 'k' } } })).toEqual([cell('b', { lastOutputKey: null, lastGoodOutputKey: null })]);
  });
});
