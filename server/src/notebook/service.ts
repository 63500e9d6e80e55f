import { eq, getTableName, inArray, sql } from 'drizzle-orm';
import { ENGINE_VERSION, upstreamFailedError } from '@laminote/aero';
import {
  CELL_KIND_LABELS,
  RUN_RANK,
  TRASH_LIMIT,
  type CellKind,
  type CellOutput,
  type CellRunReport,
  type Draft,
  type DraftCell,
  type RunState,
  type saveDraftSchema,
} from '@laminote/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/types';
import { audit } from '../audit/audit';
import type { Db, Tx } from '../db/client';
import type pg from 'pg';
import { auditEvents, cells as cellsTable, drafts, outputs, studies, users } from '../db/schema';
import { EngineBusyError, type EngineOutput, type EnginePool } from '../engine/pool';
import { badRequest, conflict, ProblemError } from '../http/problem';
import type { Logger } from '../logger';
import type { BranchContext, StoredKeysAnswer } from '../access/branch';
import { freshOutputsRows, OutputStore, type CachedOutput, type ComputedResult, type FreshOutput } from './outputs';
import { storedCells, storedTrash, splitOutputKeys } from './draft-keys';
import { keepCells, keptEntryOf, knownCells } from './draft-cells';
import { canonicalJson, planCells, taskOf, type CellPlan, type StoredCell } from './plan';

/** The places in a run, first to last: the cells of one place run together, after those before it. */
const RUN_RANKS = [...new Set(Object.values(RUN_RANK))].sort((a, b) => a - b);

type DraftRow = typeof drafts.$inferSelect;
type TrashEntry = DraftRow['trash'][number] & { lastGoodOutputKey?: string | null };
type SaveDraftBody = z.infer<typeof saveDraftSchema>;

/** A column's name as it stands in SQL text. */
const q = (c: { name: string }) => `"${c.name}"`;

/**
 * What storeAndMark runs for `results` fresh outputs, as one prepared statement: the fresh outputs
 * stored once by key ($1, their small fields as rows for json_to_recordset; each result the text of a
 * parameter of its own from $7 on, so PostgreSQL parses it once, as it enters its json column), the
 * cells' new keys ($2) merged into the draft's output keys as they are now (drafts.output_keys: the
 * cells' inputs in drafts.cells are not rewritten), and the run's audit event, all or nothing.
 * Parameters: $3 the branch, $4 the actor, $5 the project, $6 the audit detail.
 */
function storeAndMarkSql(results: number): string {
  const resultRows = results === 0 ? 'select null::integer as i, null::json as result where false' : `values ${Array.from({ length: results }, (_, i) => `(${i + 1}, $${i + 7}::json)`).join(', ')}`;
  return `
  with incoming as (
    select o.key, o.kind, o.status, r.result, o.error, o.engine_version, o.duration_ms
    from json_to_recordset($1::json) as o(i integer, key text, kind text, status text, error jsonb, engine_version text, duration_ms integer)
    join (${resultRows}) as r(i, result) on r.i = o.i
  ), stored as (
    insert into "${getTableName(outputs)}" (${[outputs.key, outputs.kind, outputs.status, outputs.result, outputs.error, outputs.engineVersion, outputs.durationMs].map(q).join(', ')})
    select key, kind, status, result, error, engine_version, duration_ms from incoming
    on conflict do nothing
    returning ${q(outputs.key)} as key, ${q(outputs.computedAt)} as computed_at
  ), marked as (
    update "${getTableName(drafts)}" set ${q(drafts.outputKeys)} = ${q(drafts.outputKeys)} || (
      select jsonb_object_agg(m.cell_id, jsonb_build_object('last', m.key, 'good',
        case when m.ok then to_jsonb(m.key) else coalesce(${q(drafts.outputKeys)} -> m.cell_id -> 'good', 'null'::jsonb) end))
      from jsonb_to_recordset($2::jsonb) as m(cell_id text, key text, ok boolean)
    )
    where ${q(drafts.branchId)} = $3::uuid and jsonb_array_length($2::jsonb) > 0
    returning ${q(drafts.revision)} as revision
  ), logged as (
    insert into "${getTableName(auditEvents)}" (${[auditEvents.actorId, auditEvents.projectId, auditEvents.action, auditEvents.targetType, auditEvents.targetId, auditEvents.detail].map(q).join(', ')})
    select $4::uuid, $5::uuid, 'cells.run', 'branch', $3::text, $6::jsonb from marked
  )
  select (select revision from marked) as revision,
    coalesce((select jsonb_agg(jsonb_build_array(key, computed_at)) from stored), '[]'::jsonb) as stored`;
}
/** The statement's text by its number of results, made once each. */
const storeAndMarkStatements = new Map<number, string>();
const storeAndMarkStatement = (results: number) => {
  let text = storeAndMarkStatements.get(results);
  if (text === undefined) storeAndMarkStatements.set(results, (text = storeAndMarkSql(results)));
  return text;
};

/** A run as planned from one reading of the draft (NotebookService.planRun). */
export interface PlannedRun {
  row: DraftRow;
  stored: StoredCell[];
  plans: Map<string, CellPlan>;
  /** The cells to run: the named ones and everything they use. */
  targets: Set<string>;
  /** The targets' outputs that are stored already, by key. */
  known: Map<string, CachedOutput>;
}

/** A draft ready to answer: cells with their outputs as stored JSON text, serialised on the way out. */
export interface DraftDoc {
  meta: Omit<Draft, 'cells'>;
  cells: { cell: Omit<DraftCell, 'output' | 'lastGoodOutput'>; output: CachedOutput | null; lastGoodOutput: CachedOutput | null }[];
}

/**
 * Cells as a JSON array, their outputs spliced in as they are held, without parsing them again: an
 * output held as bytes (just computed) as those bytes, so it is never decoded or encoded again, one
 * held as text as that text; the pieces are handed to `piece` in order.
 */
function writeCells(cells: DraftDoc['cells'], piece: (part: string | Buffer) => void): void {
  const output = (o: CachedOutput | null) => piece(o === null ? 'null' : (o.bytes ?? o.json));
  cells.forEach(({ cell, output: last, lastGoodOutput }, i) => {
    piece(`${i ? ',' : '['}${JSON.stringify(cell).slice(0, -1)},"output":`);
    output(last);
    piece(',"lastGoodOutput":');
    output(lastGoodOutput);
    piece('}');
  });
  piece(cells.length ? ']' : '[]');
}

/**
 * JSON put together from text and outputs, as UTF-8 bytes: the text between outputs is gathered and
 * encoded once per stretch; an output held as bytes goes in as those bytes, never decoded.
 */
function jsonBytes(write: (piece: (part: string | Buffer) => void) => void): Buffer {
  const parts: Buffer[] = [];
  let text = '';
  write((part) => {
    if (typeof part === 'string') return void (text += part);
    if (text) parts.push(Buffer.from(text));
    parts.push(part);
    text = '';
  });
  if (text) parts.push(Buffer.from(text));
  return Buffer.concat(parts);
}

/**
 * The draft as UTF-8 JSON, outputs spliced in without parsing them again (those held as bytes as
 * their bytes: a save's answer no longer decodes the analysis it holds into a string).
 */
export function draftBytes(doc: DraftDoc): Buffer {
  return jsonBytes((piece) => {
    piece('{"cells":');
    writeCells(doc.cells, piece);
    piece(`,${JSON.stringify(doc.meta).slice(1)}`);
  });
}

/**
 * What a run computed at once answers (RunResponse): what ran, and only the cells whose recorded
 * outputs the run changed, as the draft now holds them; every other cell is as the client has it.
 */
export interface RunDoc {
  meta: Pick<Draft, 'branchId' | 'studyId' | 'revision'>;
  cells: DraftDoc['cells'];
  ran: CellRunReport[];
}

/** A run's answer as UTF-8 bytes: the outputs it has just computed go in as the bytes the engine made. */
export function runBytes(doc: RunDoc): Buffer {
  return jsonBytes((piece) => {
    piece('{"cells":');
    writeCells(doc.cells, piece);
    piece(`,${JSON.stringify({ ...doc.meta, ran: doc.ran }).slice(1)}`);
  });
}

/** The draft as an object; with `only`, just that cell (the others are left out). */
export function draftObject(doc: DraftDoc, only?: string): Draft {
  const parse = (o: CachedOutput | null) => (o ? (JSON.parse(o.json) as CellOutput) : null);
  const cells = only === undefined ? doc.cells : doc.cells.filter((c) => c.cell.cellId === only);
  return { ...doc.meta, cells: cells.map(({ cell, output, lastGoodOutput }) => ({ ...cell, output: parse(output), lastGoodOutput: parse(lastGoodOutput) })) };
}

/** The branch's draft row, created empty if the branch has none yet (a branch made before drafts existed). */
async function draftRow(tx: Tx, branchId: string, lock: boolean): Promise<DraftRow> {
  const [row] = lock ? await tx.select().from(drafts).where(eq(drafts.branchId, branchId)).for('update') : await draftQuery(tx).execute({ branchId });
  if (row) return row;
  await tx.insert(drafts).values({ branchId }).onConflictDoNothing();
  return draftRow(tx, branchId, lock);
}

/** Reading a draft, built once per database handle and prepared by name: every notebook answer reads one. */
function draftQuery(tx: Tx) {
  let query = draftQueries.get(tx);
  if (!query) draftQueries.set(tx, (query = buildDraftQuery(tx)));
  return query;
}
const buildDraftQuery = (tx: Tx) => tx.select().from(drafts).where(eq(drafts.branchId, sql.placeholder('branchId'))).prepare('draft_row');
const draftQueries = new WeakMap<Tx, ReturnType<typeof buildDraftQuery>>();

function runStateOf(plan: CellPlan, last: CachedOutput | undefined): RunState {
  if (!last) return 'idle';
  if (plan.key !== null && last.key === plan.key) return last.status === 'ok' ? 'current' : 'failed';
  return 'outdated';
}

/** One cell as the client sees it, from its plan and the outputs its keys name. */
function cellView(cell: StoredCell, plan: CellPlan, found: ReadonlyMap<string, CachedOutput>): DraftDoc['cells'][number] {
  const last = cell.lastOutputKey ? found.get(cell.lastOutputKey) : undefined;
  const good = last?.status === 'error' && cell.lastGoodOutputKey ? found.get(cell.lastGoodOutputKey) : undefined;
  return {
    cell: {
      cellId: cell.cellId,
      kind: cell.kind as CellKind,
      title: cell.title,
      collapsed: cell.collapsed,
      inputs: cell.inputs,
      runState: runStateOf(plan, last),
      problems: plan.problems,
    },
    output: last ?? null,
    lastGoodOutput: good ?? null,
  };
}

const editable = (c: { kind: string; title: string; collapsed: boolean; inputs: unknown }) => canonicalJson([c.kind, c.title, c.collapsed, c.inputs]);

/**
 * The notebook of a branch: its draft (autosave with optimistic concurrency), and runs of its cells on
 * the engine's worker pool with outputs stored by key. One per app.
 */
export class NotebookService {
  readonly outputs = new OutputStore();
  /** Outputs being computed right now, so two runs of the same key compute once. */
  private readonly inFlight = new Map<string, Promise<EngineOutput>>();

  constructor(
    private readonly db: Db,
    private readonly engine: EnginePool,
    private readonly logger: Logger,
  ) {}

  /** People's names for a draft's "updated by" and trash, remembered for a minute (every answer needs them). */
  private readonly nameCache = new Map<string, { name: string; at: number }>();

  private async names(tx: Tx, ids: (string | null)[]): Promise<Map<string, string>> {
    const now = Date.now();
    const out = new Map<string, string>();
    const missing: string[] = [];
    for (const id of new Set(ids)) {
      if (id === null) continue;
      const hit = this.nameCache.get(id);
      if (hit && now - hit.at < 60_000) out.set(id, hit.name);
      else missing.push(id);
    }
    if (missing.length) {
      const rows = await tx.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, missing));
      if (this.nameCache.size > 10_000) this.nameCache.clear();
      for (const r of rows) {
        out.set(r.id, r.name);
        this.nameCache.set(r.id, { name: r.name, at: now });
      }
    }
    return out;
  }

  /** The draft as the client sees it: cells with run state, problems, last output and last good output. */
  async view(tx: Tx, ctx: BranchContext, row: DraftRow): Promise<DraftDoc> {
    const stored = storedCells(row);
    const plans = planCells(stored, keptEntryOf(row.cells));
    const found = await this.outputs.getMany(tx, stored.flatMap((c) => [c.lastOutputKey, c.lastGoodOutputKey]));
    const names = await this.names(tx, [row.updatedBy, ...row.trash.map((t) => t.deletedBy)]);
    return {
      meta: {
        branchId: ctx.branch.id,
        studyId: ctx.study.id,
        revision: row.revision,
        trash: row.trash.map((t) => ({
          cellId: t.cellId,
          kind: t.kind as CellKind,
          title: t.title,
          collapsed: t.collapsed,
          inputs: t.inputs,
          deletedAt: t.deletedAt,
          deletedBy: t.deletedBy,
          deletedByName: t.deletedBy ? (names.get(t.deletedBy) ?? null) : null,
        })),
        basedOnVersionId: row.basedOnVersionId,
        updatedAt: row.updatedAt.toISOString(),
        updatedBy: row.updatedBy ? { id: row.updatedBy, name: names.get(row.updatedBy) ?? '' } : null,
      },
      cells: stored.map((cell) => cellView(cell, plans.get(cell.cellId)!, found)),
    };
  }

  /** The draft as the client sees it; `row` when the caller has read it already (branchAccessWithDraft). */
  async getDraft(ctx: BranchContext, row?: DraftRow | null): Promise<DraftDoc> {
    return this.view(this.db, ctx, row ?? (await draftRow(this.db, ctx.branch.id, false)));
  }

  /**
   * Autosave with optimistic concurrency: the draft row is locked, and a save based on another revision
   * than the current one is refused with 409 carrying the current draft, so nothing is overwritten
   * silently. Cells a save leaves out go to the trash; output keys are the server's and are carried over
   * from the stored cells (or from the trash when a cell is brought back), never taken from the client.
   */
  async saveDraft(ctx: BranchContext, actor: SessionUser, body: SaveDraftBody): Promise<DraftDoc> {
    const seen = new Map<string, number>();
    body.cells.forEach((cell, i) => {
      if (seen.has(cell.cellId)) throw badRequest(`cells[${i}].cellId: the cell ${cell.cellId} is in the draft twice (also at cells[${seen.get(cell.cellId)}])`, `cells[${i}].cellId`);
      seen.set(cell.cellId, i);
    });
    return this.db.transaction(async (tx) => {
      const row = await draftRow(tx, ctx.branch.id, true);
      if (row.revision !== body.baseRevision) {
        throw conflict(
          `The draft is at revision ${row.revision}; this save was based on revision ${body.baseRevision}. Nothing was saved: merge your edits into the current draft and save again.`,
          { baseRevision: body.baseRevision, currentRevision: row.revision, current: draftObject(await this.view(tx, ctx, row)) },
        );
      }
      const old = storedCells(row);
      const oldById = new Map(old.map((c) => [c.cellId, c]));
      const oldTrash: TrashEntry[] = storedTrash(row);
      const trashById = new Map(oldTrash.map((t) => [t.cellId, t]));

      // Cell ids are the study's own: a new id is registered, a known id keeps its kind.
      const ids = body.cells.map((c) => c.cellId);
      // Cells already in this draft or its trash are registered to this study with their kind.
      const knownById = new Map<string, { id: string; studyId: string; kind: string }>();
      for (const c of [...old, ...oldTrash]) knownById.set(c.cellId, { id: c.cellId, studyId: ctx.study.id, kind: c.kind });
      const unknown = ids.filter((id) => !knownById.has(id));
      if (unknown.length) for (const c of await tx.select().from(cellsTable).where(inArray(cellsTable.id, unknown))) knownById.set(c.id, c);
      body.cells.forEach((cell, i) => {
        const k = knownById.get(cell.cellId);
        // Said without telling whether the id is in use elsewhere (another project does not exist for the caller).
        if (k && k.studyId !== ctx.study.id) throw badRequest(`cells[${i}].cellId: this id cannot be used here; give the new cell an id of its own`, `cells[${i}].cellId`);
        if (k && k.kind !== cell.kind) throw badRequest(`cells[${i}].kind: the cell is a ${CELL_KIND_LABELS[k.kind as CellKind] ?? k.kind} and keeps its kind; add a new cell instead`, `cells[${i}].kind`);
      });

      const next: StoredCell[] = body.cells.map((cell) => {
        const before = oldById.get(cell.cellId) ?? trashById.get(cell.cellId);
        return {
          cellId: cell.cellId,
          kind: cell.kind,
          title: cell.title,
          collapsed: cell.collapsed,
          inputs: cell.inputs,
          lastOutputKey: before?.lastOutputKey ?? null,
          lastGoodOutputKey: before?.lastGoodOutputKey ?? null,
        };
      });
      const nextIds = new Set(ids);
      const unchanged = next.length === old.length && next.every((c, i) => c.cellId === old[i]!.cellId && editable(c) === editable(old[i]!));
      if (unchanged) return this.view(tx, ctx, row);

      const now = new Date().toISOString();
      const removed = old.filter((c) => !nextIds.has(c.cellId));
      const trash: TrashEntry[] = [
        ...removed.map((c) => ({ ...c, deletedAt: now, deletedBy: actor.id })),
        ...oldTrash.filter((t) => !nextIds.has(t.cellId) && !removed.some((r) => r.cellId === t.cellId)),
      ].slice(0, TRASH_LIMIT);

      const fresh = body.cells.filter((c) => !knownById.has(c.cellId));
      if (fresh.length) {
        await tx
          .insert(cellsTable)
          .values(fresh.map((c) => ({ id: c.cellId, studyId: ctx.study.id, kind: c.kind, createdBy: actor.id })))
          .onConflictDoNothing();
      }
      const written = splitOutputKeys(next, trash);
      const [updated] = await tx
        .update(drafts)
        .set({ revision: row.revision + 1, cells: written.cells, trash: written.trash, outputKeys: written.outputKeys, updatedBy: actor.id, updatedAt: sql`now()` })
        .where(eq(drafts.branchId, ctx.branch.id))
        .returning();
      // Kept under the token the trigger gave them: a transaction rolled back leaves a token no row has.
      keepCells(this.db, ctx.branch.id, updated!.cellsToken, updated!.cells, updated!.trash);
      await tx.update(studies).set({ updatedAt: sql`now()` }).where(eq(studies.id, ctx.study.id));

      const added = next.filter((c) => !oldById.has(c.cellId)).map((c) => c.cellId);
      const edited = next.filter((c) => oldById.has(c.cellId) && editable(c) !== editable(oldById.get(c.cellId)!)).map((c) => c.cellId);
      const oldOrder = old.filter((c) => nextIds.has(c.cellId)).map((c) => c.cellId);
      const newOrder = next.filter((c) => oldById.has(c.cellId)).map((c) => c.cellId);
      // One event per save: the client debounces its autosave, and the event names cells, not their inputs.
      await audit(tx, {
        actorId: actor.id,
        projectId: ctx.projectId,
        action: 'draft.save',
        targetType: 'branch',
        targetId: ctx.branch.id,
        detail: {
          studyId: ctx.study.id,
          revision: updated!.revision,
          added,
          removed: removed.map((c) => c.cellId),
          edited,
          moved: oldOrder.join() !== newOrder.join(),
        },
      });
      return this.view(tx, ctx, updated!);
    });
  }

  /**
   * What running the named cells (or every cell) takes, read once from the draft as it stands: the
   * cells, their plans, the targets (the named cells and what they use) and which of their outputs are
   * stored already. The run route decides from it whether to compute at once or queue a job. `read`
   * is the draft row when the caller has it already (branchAccessWithDraft).
   */
  async planRun(ctx: BranchContext, cellIds: string[] | undefined, read?: DraftRow | null, told?: StoredKeysAnswer | null): Promise<PlannedRun> {
    const row = read ?? (await draftRow(this.db, ctx.branch.id, false));
    const stored = storedCells(row);
    const plans = planCells(stored, keptEntryOf(row.cells));
    const targets = this.targets(plans, stored, cellIds);
    // Every output the run could reuse, looked up at once (only those the access query has not answered).
    const known = await this.outputs.getMany(this.db, [...targets].map((id) => plans.get(id)!.key), told);
    return { row, stored, plans, targets, known };
  }

  /**
   * The output keys a run of these cells (or of all) will look up, from the draft's cells as this app
   * holds them (none when it holds none): the run's access query asks for them, so that their lookup
   * rides with it. A guess: if the draft has changed meanwhile, planRun looks up what it was not told.
   */
  runKeysGuess(branchId: string, cellIds: readonly string[] | undefined): string[] {
    const known = knownCells(this.db, branchId);
    if (!known) return [];
    const plans = planCells(known.cells as StoredCell[], known);
    const ids = cellIds?.filter((id) => plans.has(id)) ?? [...plans.keys()];
    const keys = new Set<string>();
    const add = (id: string) => {
      const plan = plans.get(id)!;
      if (plan.key === null || keys.has(plan.key)) return;
      keys.add(plan.key);
      for (const ref of plan.refs) if (plans.has(ref.cellId)) add(ref.cellId);
    };
    ids.forEach(add);
    return [...keys];
  }

  /**
   * Runs a planned run's cells in dependency order: flow and pressure before the analyses that name
   * them, analyses before their sweeps. A cell whose output key is already stored is not computed
   * again. The draft's cells get their new output keys without a new revision, so a run never makes
   * the author's next autosave stale. Answers what ran and the cells whose recorded outputs changed.
   */
  async run(ctx: BranchContext, actor: SessionUser, planned: PlannedRun): Promise<RunDoc> {
    const { row, stored, plans, targets, known } = planned;
    const reports = new Map<string, CellRunReport>();
    const outputsByCell = new Map<string, CachedOutput | FreshOutput>();
    // Every cell that has to compute goes to the engine at once: a task carries the inputs of the cells
    // it uses, so none waits for another's result. The ranks below then settle each cell in order, so
    // one whose upstream failed still fails as that upstream did.
    const computing = this.computeAll(
      stored.filter((c) => targets.has(c.cellId)).map((c) => plans.get(c.cellId)!),
      plans,
      known,
    );
    for (const rank of RUN_RANKS) {
      const level = stored.filter((c) => targets.has(c.cellId) && RUN_RANK[c.kind as CellKind] === rank);
      await Promise.all(
        level.map(async (cell) => {
          const { report, output } = await this.runOne(plans.get(cell.cellId)!, plans, reports, known, computing);
          reports.set(cell.cellId, report);
          if (output) outputsByCell.set(cell.cellId, output);
        }),
      );
    }
    const ran = stored.filter((c) => reports.has(c.cellId)).map((c) => reports.get(c.cellId)!);

    const detail = {
      studyId: ctx.study.id,
      cellIds: ran.map((r) => r.cellId),
      computed: ran.filter((r) => !r.reused && (r.status === 'ok' || r.status === 'error')).length,
      reused: ran.filter((r) => r.reused).length,
      failed: ran.filter((r) => r.status !== 'ok').length,
    };
    const statusOf = (out: CachedOutput | FreshOutput) => ('fresh' in out ? out.computed.status : out.status);
    // Only cells whose recorded keys change are marked (and answered): the others are as the client has them.
    const marked = stored.flatMap((cell) => {
      const out = outputsByCell.get(cell.cellId);
      if (!out) return [];
      const lastGoodOutputKey = statusOf(out) === 'ok' ? out.key : (cell.lastGoodOutputKey ?? null);
      if (cell.lastOutputKey === out.key && (cell.lastGoodOutputKey ?? null) === lastGoodOutputKey) return [];
      return [{ ...cell, lastOutputKey: out.key, lastGoodOutputKey }];
    });
    const marks = marked.map((c) => ({ cell_id: c.cellId, key: c.lastOutputKey!, ok: statusOf(outputsByCell.get(c.cellId)!) === 'ok' }));
    const fresh = [...new Map([...outputsByCell.values()].filter((o): o is FreshOutput => 'fresh' in o).map((o) => [o.key, o])).values()];
    const { revision, storedNow } = await this.storeAndMark(ctx, actor, fresh, marks, detail);

    const found = new Map(known);
    for (const out of storedNow) found.set(out.key, out);
    const meta = { branchId: ctx.branch.id, studyId: ctx.study.id, revision: revision ?? row.revision };
    if (revision === null || revision === row.revision) {
      // The draft is as it was read, with the new keys: its cells are answered from what is in hand.
      const missing = marked.flatMap((c) => [c.lastOutputKey, c.lastGoodOutputKey]).filter((k): k is string => !!k && !found.has(k));
      if (missing.length) for (const [k, o] of await this.outputs.getMany(this.db, missing)) found.set(k, o);
      return { meta, cells: marked.map((c) => cellView(c, plans.get(c.cellId)!, found)), ran };
    }
    // A save landed during the run: answer the marked cells as the draft holds them now.
    const ids = new Set(marked.map((c) => c.cellId));
    const now = await this.view(this.db, ctx, await draftRow(this.db, ctx.branch.id, false));
    return { meta, cells: now.cells.filter((c) => ids.has(c.cell.cellId)), ran };
  }

  /**
   * Stores the run's fresh outputs (each once by key: one stored meanwhile by someone else is kept)
   * and records the output keys of the draft's cells, with the run's audit event, in one statement:
   * the keys are merged into the draft's output keys as they are now (the cells themselves are not
   * written), so a save that landed during the run keeps its edits, and the revision stays (it counts
   * the author's edits; a run is not one, so it never makes the next autosave stale). A cell deleted
   * meanwhile gets its keys too, kept with it in the trash (a key names the inputs it was computed
   * from, so the cell's run state stays true); the next save drops keys of cells in neither. Answers
   * the draft's revision (null when nothing was marked) and the fresh outputs as stored.
   */
  private async storeAndMark(
    ctx: BranchContext,
    actor: SessionUser,
    fresh: FreshOutput[],
    marks: { cell_id: string; key: string; ok: boolean }[],
    detail: Record<string, unknown>,
  ): Promise<{ revision: number | null; storedNow: CachedOutput[] }> {
    // The run's audit event on its own, when no draft cell was marked.
    const auditAlone = () => audit(this.db, { actorId: actor.id, projectId: ctx.projectId, action: 'cells.run', targetType: 'branch', targetId: ctx.branch.id, detail });
    if (fresh.length === 0 && marks.length === 0) {
      await auditAlone();
      return { revision: null, storedNow: [] };
    }
    // Through the pool drizzle runs on (its documented $client), to prepare the statement by name.
    const pool = (this.db as Db & { $client: pg.Pool }).$client;
    const incoming = freshOutputsRows(fresh, ENGINE_VERSION);
    const { rows } = await pool.query<{ revision: number | null; stored: [string, string][] }>({
      name: `run_store_and_mark_${fresh.length}`,
      text: storeAndMarkStatement(fresh.length),
      values: [incoming.rows, JSON.stringify(marks), ctx.branch.id, actor.id, ctx.projectId, JSON.stringify(detail), ...incoming.results],
    });
    const revision = rows[0]?.revision ?? null;
    if (revision === null) await auditAlone();
    const computedAt = new Map(rows[0]?.stored ?? []);
    const storedNow: CachedOutput[] = [];
    const takenMeanwhile: string[] = [];
    for (const out of fresh) {
      const at = computedAt.get(out.key);
      if (at === undefined) takenMeanwhile.push(out.key);
      else storedNow.push(this.outputs.keep(out.key, ENGINE_VERSION, out.computed, new Date(at).toISOString()));
    }
    // Stored by someone else since the run looked: theirs is the output (the same key computes the same).
    if (takenMeanwhile.length) storedNow.push(...(await this.outputs.getMany(this.db, takenMeanwhile)).values());
    return { revision: revision === null ? null : Number(revision), storedNow };
  }

  /** The cells to run: the named ones and everything upstream of them, or every cell that computes (run jobs plan with it too). */
  targets(plans: Map<string, CellPlan>, stored: StoredCell[], cellIds: string[] | undefined): Set<string> {
    const out = new Set<string>();
    const add = (id: string) => {
      if (out.has(id)) return;
      const plan = plans.get(id)!;
      if (plan.kind === 'note') return;
      out.add(id);
      for (const ref of plan.refs) add(ref.cellId);
    };
    if (cellIds === undefined) {
      for (const cell of stored) add(cell.cellId);
      return out;
    }
    cellIds.forEach((id, i) => {
      if (!plans.has(id)) throw badRequest(`cellIds[${i}]: names no cell of this draft (save the draft first)`, `cellIds[${i}]`);
      add(id);
    });
    return out;
  }

  private async runOne(
    plan: CellPlan,
    plans: Map<string, CellPlan>,
    reports: Map<string, CellRunReport>,
    known: Map<string, CachedOutput>,
    computing: Map<string, Promise<EngineOutput>>,
  ): Promise<{ report: CellRunReport; output: CachedOutput | FreshOutput | null }> {
    const base = { cellId: plan.cell.cellId, kind: plan.kind };
    const started = performance.now();
    const internal = (message: string, field?: string) => ({
      report: { ...base, status: 'internal' as const, reused: false, key: null, durationMs: performance.now() - started, error: { message, ...(field ? { field } : {}) } },
      output: null,
    });
    const reused = (output: CachedOutput) => ({
      report: { ...base, status: output.status, reused: true, key: output.key, durationMs: performance.now() - started, error: output.error },
      output,
    });
    const fresh = (computed: ComputedResult) => ({
      report: { ...base, status: computed.status, reused: false, key: plan.key, durationMs: performance.now() - started, error: computed.error },
      output: { fresh: true as const, key: plan.key!, kind: plan.kind, computed },
    });
    if (plan.key === null) {
      const first = plan.problems[0];
      return { report: { ...base, status: 'invalid', reused: false, key: null, durationMs: 0, error: first ? { message: `${first.field}: ${first.message}`, field: first.field } : null }, output: null };
    }
    const existing = known.get(plan.key);
    if (existing) return reused(existing);

    for (const ref of plan.refs) {
      if (reports.get(ref.cellId)?.status === 'internal') return internal(`not run: the cell it uses (${ref.field}) could not be computed`, ref.field);
    }
    // Something upstream that failed makes this cell fail too, named by the input that uses it.
    const failedRef = plan.refs.find((ref) => reports.get(ref.cellId)?.status === 'error');
    if (failedRef) {
      const up = reports.get(failedRef.cellId)!;
      const error = upstreamFailedError(plans.get(failedRef.cellId)!.kind, failedRef.field, up.error);
      return fresh({ status: 'error', resultJson: null, error, durationMs: 0 });
    }
    try {
      return fresh(await computing.get(plan.key)!);
    } catch (error) {
      if (error instanceof EngineBusyError) throw new ProblemError(503, 'engine-busy', 'The engine is busy', { detail: 'Too many computations are waiting; try the run again in a moment.' });
      this.logger.error({ err: error, cellId: plan.cell.cellId }, 'engine task failed');
      return internal(`the server could not compute this cell: ${error instanceof Error ? error.message : String(error)}`);
    }
  }

  /**
   * Starts computing the cells whose outputs are not stored, by key, on the engine pool; two runs of
   * the same key at once compute it once. Flow conditions (microseconds of arithmetic) ride in the task
   * of the first other cell; every other cell is a task of its own, so heavy cells share the threads.
   */
  private computeAll(wanted: CellPlan[], plans: Map<string, CellPlan>, known: Map<string, CachedOutput>): Map<string, Promise<EngineOutput>> {
    const out = new Map<string, Promise<EngineOutput>>();
    const starting = new Set<string>();
    const light: CellPlan[] = [];
    const batches: CellPlan[][] = [];
    for (const plan of wanted) {
      if (plan.key === null || known.has(plan.key) || out.has(plan.key) || starting.has(plan.key)) continue;
      const running = this.inFlight.get(plan.key);
      if (running) {
        out.set(plan.key, running);
        continue;
      }
      starting.add(plan.key);
      if (plan.kind === 'flow') light.push(plan);
      else batches.push([plan]);
    }
    if (light.length) (batches[0] ?? (batches[0] = [])).unshift(...light);
    for (const batch of batches) {
      const promises = this.engine.runAll(batch.map((plan) => taskOf(plan, plans)!));
      batch.forEach((plan, i) => {
        const key = plan.key!;
        const promise = promises[i]!.finally(() => this.inFlight.delete(key));
        // A cell whose upstream failed does not wait for its own result: that result is dropped, not left unhandled.
        promise.catch(() => undefined);
        this.inFlight.set(key, promise);
        out.set(key, promise);
      });
    }
    return out;
  }
}
