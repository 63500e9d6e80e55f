import { CELL_INPUT_SCHEMAS, CELL_REFERENCE_FIELDS, fieldLabel, orderedFields, sameJson, sci, valueLabel, type CellDiff, type CellKind, type FieldChange, type TextDiff } from '@laminote/contracts';
import { diffPressureTables, tableRowCount, type TableInputs } from './table-diff';

/** A cell as a version (or a draft) holds it, enough to compare. */
export interface SnapshotCell {
  cellId: string;
  kind: CellKind;
  title: string;
  collapsed: boolean;
  inputs: Record<string, unknown>;
  outputKey: string | null;
}

type Json = unknown;

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Inputs with their kind's defaults filled in, so a field left out and the same value given do not differ. */
function normalised(kind: CellKind, inputs: Record<string, unknown>): Record<string, unknown> {
  const parsed = CELL_INPUT_SCHEMAS[kind]?.safeParse(inputs);
  return parsed?.success ? (parsed.data as Record<string, unknown>) : inputs;
}

function display(value: Json, titles: Map<string, string>, reference: boolean, field: string): string {
  if (value === undefined || value === null) return '—';
  if (typeof value === 'number') return sci(value, 6, true);
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') {
    if (reference) return titles.get(value) ?? `a cell no longer in the study (${value.slice(0, 8)})`;
    const shown = valueLabel(field, value);
    return shown.length > 120 ? `${shown.slice(0, 117)}…` : shown;
  }
  if (Array.isArray(value)) return value.map((v) => display(v, titles, false, field)).join(', ') || '(none)';
  return JSON.stringify(value);
}

/** Field-level differences of two input objects, depth first; arrays compare as a whole. */
function diffInputs(kind: CellKind, a: Record<string, unknown>, b: Record<string, unknown>, titles: Map<string, string>, skip: Set<string>): FieldChange[] {
  const out: FieldChange[] = [];
  const walk = (path: string[], x: Json, y: Json) => {
    if (sameJson(x, y)) return;
    if (isPlainObject(x) && isPlainObject(y) && path.length < 4) {
      for (const k of new Set([...Object.keys(x), ...Object.keys(y)])) walk([...path, k], x[k], y[k]);
      return;
    }
    // A record that appears or goes away (trips on a surface): one change per entry.
    if ((isPlainObject(x) && y === undefined) || (x === undefined && isPlainObject(y))) {
      const entries = isPlainObject(x) ? x : (y as Record<string, unknown>);
      for (const k of Object.keys(entries)) walk([...path, k], isPlainObject(x) ? x[k] : undefined, isPlainObject(y) ? y[k] : undefined);
      return;
    }
    const p = path.join('.');
    const reference = path.length === 1 && CELL_REFERENCE_FIELDS.has(path[0]!);
    const relative = typeof x === 'number' && typeof y === 'number' && x !== 0 ? (y - x) / Math.abs(x) : null;
    out.push({ path: p, label: fieldLabel(kind, p), old: x ?? null, new: y ?? null, oldText: display(x, titles, reference, p), newText: display(y, titles, reference, p), relative });
  };
  for (const k of orderedFields(kind, new Set([...Object.keys(a), ...Object.keys(b)]))) if (!skip.has(k)) walk([k], a[k], b[k]);
  return out;
}

const MAX_EXCERPT = 12;

/** Lines added and removed between two texts (longest common subsequence of lines). */
export function diffText(a: string, b: string): TextDiff {
  const x = a.split(/\r\n|\r|\n/);
  const y = b.split(/\r\n|\r|\n/);
  const n = x.length;
  const m = y.length;
  const excerpt: TextDiff['excerpt'] = [];
  if (n * m > 4_000_000) {
    // Too long for a full table: count lines one side has more often than the other.
    const count = (lines: string[]) => lines.reduce((map, l) => map.set(l, (map.get(l) ?? 0) + 1), new Map<string, number>());
    const cx = count(x);
    const cy = count(y);
    let added = 0;
    let removed = 0;
    for (const [l, c] of cy) {
      const d = c - (cx.get(l) ?? 0);
      if (d > 0) added += d;
      if (d > 0 && excerpt.length < MAX_EXCERPT) excerpt.push({ op: '+', text: l });
    }
    for (const [l, c] of cx) {
      const d = c - (cy.get(l) ?? 0);
      if (d > 0) removed += d;
      if (d > 0 && excerpt.length < MAX_EXCERPT) excerpt.push({ op: '-', text: l });
    }
    return { linesAdded: added, linesRemoved: removed, excerpt };
  }
  const table = Array.from({ length: n + 1 }, () => new Uint32Array(m + 1));
  for (let i = n - 1; i >= 0; i--) for (let j = m - 1; j >= 0; j--) table[i]![j] = x[i] === y[j] ? table[i + 1]![j + 1]! + 1 : Math.max(table[i + 1]![j]!, table[i]![j + 1]!);
  let i = 0;
  let j = 0;
  let added = 0;
  let removed = 0;
  while (i < n || j < m) {
    if (i < n && j < m && x[i] === y[j]) {
      i++;
      j++;
    } else if (j < m && (i === n || table[i]![j + 1]! >= table[i + 1]![j]!)) {
      added++;
      if (excerpt.length < MAX_EXCERPT) excerpt.push({ op: '+', text: y[j]! });
      j++;
    } else {
      removed++;
      if (excerpt.length < MAX_EXCERPT) excerpt.push({ op: '-', text: x[i]! });
      i++;
    }
  }
  return { linesAdded: added, linesRemoved: removed, excerpt };
}

/** The ids of the longest run of common cells that keep their relative order; the rest moved. */
function inOrder(a: string[], b: string[]): Set<string> {
  const n = a.length;
  const m = b.length;
  const table = Array.from({ length: n + 1 }, () => new Uint16Array(m + 1));
  for (let i = n - 1; i >= 0; i--) for (let j = m - 1; j >= 0; j--) table[i]![j] = a[i] === b[j] ? table[i + 1]![j + 1]! + 1 : Math.max(table[i + 1]![j]!, table[i]![j + 1]!);
  const keep = new Set<string>();
  let i = 0;
  let j = 0;
  while (i < n && j < m) {
    if (a[i] === b[j]) {
      keep.add(a[i]!);
      i++;
      j++;
    } else if (table[i + 1]![j]! >= table[i]![j + 1]!) i++;
    else j++;
  }
  return keep;
}

function tableInputs(inputs: Record<string, unknown>): TableInputs {
  return {
    text: typeof inputs['text'] === 'string' ? inputs['text'] : '',
    layout: inputs['layout'] === 'surface' ? 'surface' : 'closedLoop',
    surfaceName: typeof inputs['surfaceName'] === 'string' ? inputs['surfaceName'] : 'upper',
  };
}

const rows = (text: string) => {
  const count = tableRowCount(text);
  return count === null ? 'a table that does not read' : `${count} rows`;
};

/**
 * Cells matched by id: added, removed, changed (inputs or title), moved (order among the common
 * cells), unchanged. The list follows B's order, with removed cells where they stood in A.
 */
export function diffCells(a: SnapshotCell[], b: SnapshotCell[]): CellDiff[] {
  const inA = new Map(a.map((c, i) => [c.cellId, { cell: c, position: i }]));
  const inB = new Map(b.map((c, i) => [c.cellId, { cell: c, position: i }]));
  const titles = new Map<string, string>();
  for (const c of [...a, ...b]) titles.set(c.cellId, c.title || c.kind);
  const common = inOrder(
    a.filter((c) => inB.has(c.cellId)).map((c) => c.cellId),
    b.filter((c) => inA.has(c.cellId)).map((c) => c.cellId),
  );

  const diffOne = (cellId: string): CellDiff => {
    const x = inA.get(cellId);
    const y = inB.get(cellId);
    const kind = (y ?? x)!.cell.kind;
    const base = {
      cellId,
      kind,
      titleA: x?.cell.title ?? null,
      titleB: y?.cell.title ?? null,
      positionA: x?.position ?? null,
      positionB: y?.position ?? null,
    };
    if (!x || !y) {
      return { ...base, change: x ? 'removed' : 'added', moved: false, fields: [], table: null, text: null, outputChanged: false };
    }
    const ia = normalised(kind, x.cell.inputs);
    const ib = normalised(kind, y.cell.inputs);
    const skip = new Set<string>();
    const fields: FieldChange[] = [];
    let table: CellDiff['table'] = null;
    let text: CellDiff['text'] = null;
    if (x.cell.kind !== y.cell.kind) {
      fields.push({ path: 'kind', label: 'Cell kind', old: x.cell.kind, new: y.cell.kind, oldText: x.cell.kind, newText: y.cell.kind, relative: null });
    }
    if (x.cell.title !== y.cell.title) {
      fields.push({ path: 'title', label: 'Title', old: x.cell.title, new: y.cell.title, oldText: x.cell.title || '—', newText: y.cell.title || '—', relative: null });
    }
    if (kind === 'pressure') {
      skip.add('text');
      const ta = tableInputs(ia);
      const tb = tableInputs(ib);
      if (ta.text !== tb.text || ta.layout !== tb.layout || ta.surfaceName !== tb.surfaceName) table = diffPressureTables(ta, tb);
      if (ta.text !== tb.text) fields.push({ path: 'text', label: fieldLabel(kind, 'text'), old: null, new: null, oldText: rows(ta.text), newText: rows(tb.text), relative: null });
    }
    if (kind === 'note') {
      skip.add('markdown');
      const ma = typeof ia['markdown'] === 'string' ? ia['markdown'] : '';
      const mb = typeof ib['markdown'] === 'string' ? ib['markdown'] : '';
      if (ma !== mb) {
        text = diffText(ma, mb);
        fields.push({ path: 'markdown', label: fieldLabel(kind, 'markdown'), old: null, new: null, oldText: `${ma.split('\n').length} lines`, newText: `${mb.split('\n').length} lines`, relative: null });
      }
    }
    fields.push(...diffInputs(kind, ia, ib, titles, skip));
    const moved = !common.has(cellId);
    return {
      ...base,
      change: fields.length > 0 ? 'changed' : moved ? 'moved' : 'unchanged',
      moved,
      fields,
      table,
      text,
      outputChanged: (x.cell.outputKey ?? null) !== (y.cell.outputKey ?? null),
    };
  };

  // B's order; a removed cell goes after the nearest cell before it in A that B still has.
  const order: string[] = b.map((c) => c.cellId);
  let anchor = -1;
  const removedAfter = new Map<number, string[]>();
  for (const c of a) {
    const inBoth = inB.get(c.cellId);
    if (inBoth) anchor = inBoth.position;
    else removedAfter.set(anchor, [...(removedAfter.get(anchor) ?? []), c.cellId]);
  }
  const merged: string[] = [...(removedAfter.get(-1) ?? [])];
  order.forEach((cellId, i) => merged.push(cellId, ...(removedAfter.get(i) ?? [])));
  return merged.map(diffOne);
}

export function summarise(diffs: CellDiff[]) {
  const summary = { added: 0, removed: 0, changed: 0, moved: 0, unchanged: 0 };
  for (const d of diffs) summary[d.change]++;
  return summary;
}
