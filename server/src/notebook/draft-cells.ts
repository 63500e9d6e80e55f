import type { drafts } from '../db/schema';
import type { CellPlan } from './plan';

/**
 * The parsed cells and trash of recently read drafts, by branch, each with the token that names their
 * content (drafts.cells_token: a trigger gives it a new number whenever either column is written, by
 * anyone). A request that reads a draft sends the token it holds, and PostgreSQL sends the cells only
 * when the token differs: the notebook's run and draft reads skip reading and parsing ~100 kB of cells
 * that have not changed (issue 15). What is kept is frozen, so nothing that reads it can change it for
 * the next request; one cache per database handle (one per app).
 */

type DraftRow = typeof drafts.$inferSelect;

export interface KnownCells {
  token: number;
  cells: DraftRow['cells'];
  trash: DraftRow['trash'];
  /** The cells' plans (planCells), made once for this content when first asked for. */
  plans?: Map<string, CellPlan>;
}

/** Drafts kept per app: a notebook open in a few hundred tabs at once stays in memory. */
const MAX_DRAFTS = 1_000;
const caches = new WeakMap<object, Map<string, KnownCells>>();
/** The entry of a kept cells array, so a plan made from it is kept with it. */
const byCells = new WeakMap<object, KnownCells>();

function cacheOf(db: object): Map<string, KnownCells> {
  let cache = caches.get(db);
  if (!cache) caches.set(db, (cache = new Map()));
  return cache;
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

/** The branch's draft cells this app holds, if any. */
export function knownCells(db: object, branchId: string): KnownCells | undefined {
  return cacheOf(db).get(branchId);
}

/** Keeps a draft's cells and trash as read or written at `token`; they are frozen from here on. */
export function keepCells(db: object, branchId: string, token: number, cells: DraftRow['cells'], trash: DraftRow['trash']): KnownCells {
  const cache = cacheOf(db);
  const entry: KnownCells = { token, cells: deepFreeze(cells), trash: deepFreeze(trash) };
  cache.delete(branchId);
  cache.set(branchId, entry);
  byCells.set(cells, entry);
  if (cache.size > MAX_DRAFTS) cache.delete(cache.keys().next().value!);
  return entry;
}

/** The kept entry whose cells array this is (the memo for its plans), or undefined. */
export function keptEntryOf(cells: DraftRow['cells']): KnownCells | undefined {
  return byCells.get(cells);
}
