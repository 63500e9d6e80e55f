import { sql } from 'drizzle-orm';
import type { CellError, CellKind, CellOutput } from '@laminote/contracts';
import type { Tx } from '../db/client';
import type { StoredKeysAnswer } from '../access/branch';
import { outputs } from '../db/schema';
import type { ComputedOutput } from '@laminote/aero';

/**
 * Stored outputs, with an in-memory cache in front of the table. An output row never changes (its key
 * is the hash of everything it was computed from), so the cache needs no invalidation: it only keeps
 * the recently used ones, each with its JSON text ready, so answering a draft does not parse and
 * re-serialise large results on every request.
 */

export interface CachedOutput {
  key: string;
  status: 'ok' | 'error';
  error: CellError | null;
  computedAt: string;
  durationMs: number;
  /** The output as the API sends it (CellOutput), serialised. */
  readonly json: string;
  /**
   * The same as UTF-8 bytes, when it was put together from bytes (an output this server has just
   * computed): `json` is then decoded from them each time something asks for it, and not kept (draft
   * and run answers splice the bytes; only comparisons and exports ask for the text).
   */
  bytes?: Buffer;
  /** Its length in bytes or characters, for the cache's budget. */
  size: number;
}

/** A result's JSON: its text, or the UTF-8 bytes of that text (as an engine thread hands it over). */
export type ResultJson = string | Uint8Array;

/** A computed output whose result is text or bytes. */
export type ComputedResult = Omit<ComputedOutput, 'resultJson'> & { resultJson: ResultJson | null };

/** A result as a parameter for pg: text as it is, bytes as a Buffer over the same memory (sent as they are). */
export const resultParameter = (result: ResultJson | null): string | Buffer | null =>
  result === null || typeof result === 'string' ? result : Buffer.from(result.buffer, result.byteOffset, result.byteLength);


/** A stored output as read here: its result as the stored JSON text (spliced into answers, never parsed). */
type OutputRow = Omit<typeof outputs.$inferSelect, 'result'> & { resultText: string | null };

/** An output computed by a run and not stored yet. */
export interface FreshOutput {
  fresh: true;
  key: string;
  kind: CellKind;
  computed: ComputedResult;
}

/**
 * Fresh outputs as PostgreSQL takes them: their small fields as rows of JSON for `json_to_recordset`
 * (i, key, kind, status, error, engine_version, duration_ms), and each result apart, as the text the
 * engine made, to be bound to a parameter of its own (row i to the i-th): a result inside the rows'
 * JSON was parsed twice by PostgreSQL, once with the rows and once more as its json column, about a
 * third of PostgreSQL's CPU in a run of a 2 × 300-station analysis.
 */
export function freshOutputsRows(fresh: readonly FreshOutput[], engineVersion: string): { rows: string; results: (string | Buffer | null)[] } {
  const rows = fresh.map(({ key, kind, computed }, i) => ({ i: i + 1, key, kind, status: computed.status, error: computed.error, engine_version: engineVersion, duration_ms: Math.round(computed.durationMs) }));
  return { rows: JSON.stringify(rows), results: fresh.map(({ computed }) => resultParameter(computed.resultJson)) };
}

function outputJson(meta: Omit<CellOutput, 'result'>, resultJson: string | null): string {
  // The result is spliced in as text: it is already JSON.
  const head = JSON.stringify(meta);
  return `${head.slice(0, -1)},"result":${resultJson ?? 'null'}}`;
}

const RESULT_END = Buffer.from('}');

/**
 * An output put together from its fields and its result: as text, or, when the result is bytes, as
 * bytes only. The text decoded from them is not kept: kept beside the bytes, it doubled what the cache
 * holds outside its budget, and each such string (tens of kB, made in V8's young generation and then
 * held) was copied by the next scavenges and promoted, which made most of the server's collector work
 * in the run bench (--trace-gc: the heap grew by about 1.5 MB a scavenge, to 150-200 MB).
 */
function cachedOutput(meta: Omit<CellOutput, 'result'>, resultJson: ResultJson | null): CachedOutput {
  const fields = { key: meta.key, status: meta.status, error: meta.error, computedAt: meta.computedAt, durationMs: meta.durationMs };
  if (resultJson === null || typeof resultJson === 'string') {
    const json = outputJson(meta, resultJson);
    return { ...fields, json, size: json.length };
  }
  const bytes = Buffer.concat([Buffer.from(`${JSON.stringify(meta).slice(0, -1)},"result":`), resultJson, RESULT_END]);
  return {
    ...fields,
    bytes,
    size: bytes.length,
    get json() {
      return bytes.toString('utf8');
    },
  };
}

function fromRow(row: OutputRow): CachedOutput {
  const error = row.status === 'error' ? ((row.error as CellError | null) ?? { message: 'the run failed' }) : null;
  const meta = { key: row.key, status: row.status, error, engineVersion: row.engineVersion, durationMs: row.durationMs, computedAt: row.computedAt.toISOString() };
  return cachedOutput(meta, row.status === 'ok' ? (row.resultText ?? 'null') : null);
}

/** Reading outputs by key, built once per database handle and prepared by name (a run reads them every time). */
function outputsQuery(tx: Tx) {
  let query = outputsQueries.get(tx);
  if (!query) outputsQueries.set(tx, (query = buildOutputsQuery(tx)));
  return query;
}
const buildOutputsQuery = (tx: Tx) =>
  tx
    .select({
      key: outputs.key,
      kind: outputs.kind,
      status: outputs.status,
      resultText: sql<string | null>`${outputs.result}::text`,
      error: outputs.error,
      engineVersion: outputs.engineVersion,
      durationMs: outputs.durationMs,
      computedAt: outputs.computedAt,
    })
    .from(outputs)
    .where(sql`${outputs.key} = any(${sql.placeholder('keys')}::text[])`)
    .prepare('outputs_by_key');
const outputsQueries = new WeakMap<Tx, ReturnType<typeof buildOutputsQuery>>();

export class OutputStore {
  private readonly cache = new Map<string, CachedOutput>();
  private bytes = 0;

  /** @param budgetBytes how much JSON the cache keeps (bytes, or characters of text). */
  constructor(private readonly budgetBytes = 64 * 1024 * 1024) {}

  private remember(out: CachedOutput): CachedOutput {
    if (this.cache.has(out.key)) return out;
    this.cache.set(out.key, out);
    this.bytes += out.size;
    for (const [key, old] of this.cache) {
      if (this.bytes <= this.budgetBytes) break;
      this.cache.delete(key);
      this.bytes -= old.size;
    }
    return out;
  }

  private touch(key: string): CachedOutput | undefined {
    const hit = this.cache.get(key);
    if (hit) {
      // Most recently used last, so eviction takes the oldest first.
      this.cache.delete(key);
      this.cache.set(key, hit);
    }
    return hit;
  }

  async get(tx: Tx, key: string): Promise<CachedOutput | null> {
    return (await this.getMany(tx, [key])).get(key) ?? null;
  }

  /**
   * The outputs stored under these keys. `told`, when given, says which keys were asked of the
   * database a moment ago and which of them were stored then (branchAccessWithDraft): a key asked and
   * not stored is not asked again. One stored since is found at the run's store, which keeps the
   * first output of a key.
   */
  async getMany(tx: Tx, keys: Iterable<string | null | undefined>, told?: StoredKeysAnswer | null): Promise<Map<string, CachedOutput>> {
    const found = new Map<string, CachedOutput>();
    const missing: string[] = [];
    for (const key of new Set(keys)) {
      if (typeof key !== 'string') continue;
      const hit = this.touch(key);
      if (hit) found.set(key, hit);
      else if (!told?.asked.has(key) || told.stored.has(key)) missing.push(key);
    }
    if (missing.length) {
      const rows = await outputsQuery(tx).execute({ keys: missing });
      for (const row of rows) found.set(row.key, this.remember(fromRow(row)));
    }
    return found;
  }

  /** An output this server has just stored (at `computedAt`), kept in the cache with its JSON text. */
  keep(key: string, engineVersion: string, computed: ComputedResult, computedAt: string): CachedOutput {
    const meta = { key, status: computed.status, error: computed.error, engineVersion, durationMs: Math.round(computed.durationMs), computedAt };
    return this.remember(cachedOutput(meta, computed.resultJson));
  }

  /** Stores a computed output (once: a concurrent store of the same key keeps the first). */
  async put(tx: Tx, key: string, kind: CellKind, engineVersion: string, computed: ComputedResult): Promise<CachedOutput> {
    const durationMs = Math.round(computed.durationMs);
    const [row] = await tx
      .insert(outputs)
      .values({
        key,
        kind,
        status: computed.status,
        result: computed.resultJson === null ? null : sql`${resultParameter(computed.resultJson)}::json`,
        error: computed.error,
        engineVersion,
        durationMs,
      })
      .onConflictDoNothing()
      .returning({ computedAt: outputs.computedAt });
    if (!row) return (await this.get(tx, key))!;
    return this.keep(key, engineVersion, computed, row.computedAt.toISOString());
  }
}
