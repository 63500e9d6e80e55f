import type { CellKind, DraftCell, VersionSummary } from '@laminote/contracts';

/**
 * "What changed since I last looked": what a person saw of a branch's draft the last time they had the
 * study open in this browser (each cell's title and a fingerprint of its inputs, the draft revision,
 * when), and what differs now. Kept in the browser's storage, per person and branch: it needs no
 * server round trip and forgets nothing the server holds.
 */
export interface LookSnapshot {
  readonly seenAt: string;
  readonly revision: number;
  readonly cells: Readonly<Record<string, { readonly title: string; readonly kind: CellKind; readonly hash: string }>>;
}

export interface LookChanges {
  readonly seenAt: string;
  readonly added: readonly string[];
  readonly removed: readonly string[];
  readonly changed: readonly string[];
  /** Versions saved on the branch by others since then, oldest first. */
  readonly versions: readonly { readonly number: number; readonly author: string; readonly message: string }[];
}

/** FNV-1a, 32 bits: enough to tell whether a cell's inputs changed, not a security hash. */
function fingerprint(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16);
}

function cellTitle(cell: { readonly title: string; readonly kind: CellKind }, label: (kind: CellKind) => string): string {
  return cell.title.trim() || label(cell.kind);
}

export function snapshotOf(cells: readonly DraftCell[], revision: number, now: Date = new Date()): LookSnapshot {
  return {
    seenAt: now.toISOString(),
    revision,
    cells: Object.fromEntries(cells.map((c) => [c.cellId, { title: c.title, kind: c.kind, hash: fingerprint(`${c.title}\u0000${JSON.stringify(c.inputs)}`) }])),
  };
}

/** What differs from a snapshot; null when nothing does. */
export function changesSince(
  before: LookSnapshot,
  cells: readonly DraftCell[],
  revision: number,
  versions: readonly VersionSummary[],
  me: string | null,
  label: (kind: CellKind) => string,
): LookChanges | null {
  const now = snapshotOf(cells, revision);
  const added: string[] = [];
  const changed: string[] = [];
  for (const cell of cells) {
    const seen = before.cells[cell.cellId];
    if (!seen) added.push(cellTitle(cell, label));
    else if (seen.hash !== now.cells[cell.cellId]!.hash) changed.push(cellTitle(cell, label));
  }
  const removed = Object.entries(before.cells)
    .filter(([id]) => !(id in now.cells))
    .map(([, seen]) => cellTitle(seen, label));
  const since = Date.parse(before.seenAt);
  const saved = versions
    .filter((v) => Date.parse(v.createdAt) > since && v.author?.id !== me)
    .sort((a, b) => a.number - b.number)
    .map((v) => ({ number: v.number, author: v.author?.name ?? 'Someone', message: v.message }));
  if (added.length + removed.length + changed.length + saved.length === 0) return null;
  return { seenAt: before.seenAt, added, removed, changed, versions: saved };
}

const KEY = (person: string, branchId: string) => `laminote.lastLook.${person}.${branchId}`;

export function readSnapshot(person: string, branchId: string): LookSnapshot | null {
  try {
    const text = globalThis.localStorage?.getItem(KEY(person, branchId));
    const parsed = text ? (JSON.parse(text) as LookSnapshot) : null;
    return parsed && typeof parsed.seenAt === 'string' && typeof parsed.cells === 'object' ? parsed : null;
  } catch {
    return null;
  }
}

export function writeSnapshot(person: string, branchId: string, snapshot: LookSnapshot): void {
  try {
    globalThis.localStorage?.setItem(KEY(person, branchId), JSON.stringify(snapshot));
  } catch {
    // Storage full or refused (private window): the next visit simply has nothing to compare with.
  }
}
