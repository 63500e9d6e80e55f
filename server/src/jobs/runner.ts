import { setTimeout as sleep } from 'node:timers/promises';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type PgBoss from 'pg-boss';
import pg from 'pg';
import { assembleSweep, ENGINE_VERSION, gatherSweepWarnings, resultJson, sweepCaseCount, sweepValues, toCellError, upstreamFailedError, type ComputedOutput, type SweepCase, type SweepWarning } from '@laminote/aero';
import { CELL_KIND_LABELS, CELL_KIND_REGISTRY, jobIsActive, type CellError, type CellRunReport, type JobState, type SweepInputs, type SweepResult } from '@laminote/contracts';
import { audit } from '../audit/audit';
import type { Database } from '../db/client';
import { isDatabaseUnavailable } from '../db/availability';
import { runJobs, sweepCases } from '../db/schema';
import type { Logger } from '../logger';
import { OutputStore } from '../notebook/outputs';
import type { ComputePool } from './compute-pool';
import { markDraftCells } from './mark';
import { RETENTION_QUEUE, stableJobId, WORK_QUEUE, type WorkMessage } from './queue';
import { pruneRetained, type RetentionPolicy } from './retention';
import { JOB_CHANNEL, loadJob, notifyJob, notifyJobs, type JobNotice, type RunJobRow } from './store';
import { CASES_PER_CHUNK, type JobWork } from './work';

const { escapeLiteral } = pg;

/** While quick cells are computed in a row, how often the job's state is read again (a cancel is heeded within this). */
const STATE_CHECK_MS = 100;

/** Second argument of hashtextextended for a sweep's lock: keeps these locks apart from any other advisory lock. */
const SWEEP_LOCK_SEED = 1_3_0_5;

/** The version byte of jsonb's binary form (PostgreSQL's jsonb_recv: a version number, then the JSON text). */
const JSONB_VERSION = Buffer.from([1]);

/** JSON bytes as a jsonb parameter: pg sends a Buffer in binary form, which for jsonb is the text after a version byte. */
const jsonbParameter = (json: Uint8Array): Buffer => Buffer.concat([JSONB_VERSION, json]);

/**
 * A job worker: fetches pieces of work from the queue and runs them on its compute threads, one piece
 * per thread. A run job computes its light cells in order and fans each sweep out into chunks of cases
 * that any worker may take; whoever stores the last case puts the sweep's output together, and whoever
 * stores the last output finishes the job.
 *
 * Every piece is idempotent: outputs and cases are stored once by key, so a piece handed out again (its
 * worker was killed, or the database went away before it was acknowledged) only does what is missing.
 * While the database is away the worker waits and carries on with the same piece; nothing fails for it.
 */

export interface JobRunnerOptions {
  /** Pieces of work at once; defaults to the compute threads. */
  slots?: number;
  /** How long an idle slot waits before asking the queue again. */
  pollMs?: number;
  /** Clean-up of old outputs and sent mail; absent: this runner does not take that job. */
  retention?: RetentionPolicy;
}

class JobDefect extends Error {}

/** What a job needs to know of a stored output: that it is there and how it went, never its result. */
interface StoredOutcome {
  status: 'ok' | 'error';
  error: CellError | null;
  durationMs: number;
}

/** Outcomes a worker keeps in memory (a few hundred bytes each). */
const KEPT_OUTCOMES = 10_000;

export class JobRunner {
  private stopping = false;
  private readonly loops: Promise<void>[] = [];
  private readonly wakers = new Set<() => void>();
  /** Slots waiting for work, woken early when a notice says a job may have been queued. */
  private readonly idleWakers = new Set<() => void>();
  /**
   * Stores the outputs this worker computes. It keeps none of them: a worker never sends a result
   * anywhere, so what it needs of stored outputs is how they went (`outcomes`), not their JSON.
   */
  private readonly outputs = new OutputStore(0);
  /** How stored outputs went, by key (an output is stored once and never changes), the most recent last. */
  private readonly outcomes = new Map<string, StoredOutcome>();
  /** Job rows by id (their work does not change), so a chunk does not read a large plan again. */
  private readonly rows = new Map<string, RunJobRow>();
  /** Pieces of work finished since start (the benchmark and tests read it). */
  processed = 0;

  constructor(
    private readonly database: Database,
    private readonly boss: PgBoss,
    private readonly compute: ComputePool,
    private readonly logger: Logger,
    private readonly options: JobRunnerOptions = {},
  ) {}

  private get db() {
    return this.database.db;
  }

  start(): void {
    const slots = this.options.slots ?? this.compute.threads;
    for (let i = 0; i < slots; i++) this.loops.push(this.loop());
    if (this.options.retention) this.loops.push(this.retentionLoop(this.options.retention));
  }

  /** Stops fetching and waits for the pieces under way (a piece cut short is handed out again later). */
  async stop(): Promise<void> {
    this.stopping = true;
    for (const wake of this.wakers) wake();
    await Promise.all(this.loops);
  }

  private async pause(ms: number, idle = false): Promise<void> {
    if (this.stopping) return;
    const ac = new AbortController();
    const wake = () => ac.abort();
    this.wakers.add(wake);
    if (idle) this.idleWakers.add(wake);
    await sleep(ms, undefined, { signal: ac.signal }).catch(() => undefined);
    this.wakers.delete(wake);
    this.idleWakers.delete(wake);
  }

  /**
   * Work may have been queued (a run was asked for, or a job fanned out its chunks): idle slots ask the
   * queue now instead of at their next poll, which backs off to 2 s. A notice that brings no work costs
   * an idle slot one fetch.
   */
  wake(): void {
    for (const wake of this.idleWakers) wake();
  }

  /** Does `fn` again while the database is away, until it answers or the runner stops. */
  private async whileAway<T>(what: string, fn: () => Promise<T>): Promise<T | undefined> {
    for (let attempt = 0; ; attempt++) {
      try {
        return await fn();
      } catch (err) {
        if (!isDatabaseUnavailable(err)) throw err;
        if (this.stopping) return undefined;
        if (attempt === 0) this.logger.warn({ err: (err as Error).message }, `the database is away (${what}); waiting for it`);
        await this.pause(Math.min(250 * 2 ** attempt, 5000));
      }
    }
  }

  private async loop(): Promise<void> {
    let idle = 0;
    while (!this.stopping) {
      let job: PgBoss.Job<WorkMessage> | undefined;
      try {
        [job] = await this.boss.fetch<WorkMessage>(WORK_QUEUE, { batchSize: 1 });
      } catch (err) {
        if (!isDatabaseUnavailable(err)) this.logger.error({ err }, 'could not fetch work');
        await this.pause(1000);
        continue;
      }
      if (!job) {
        await this.pause(Math.min((this.options.pollMs ?? 500) * 2 ** Math.min(idle++, 2), 2000), true);
        continue;
      }
      idle = 0;
      await this.process(job);
    }
  }

  private async process(job: PgBoss.Job<WorkMessage>): Promise<void> {
    try {
      const done = await this.whileAway('running a job', async () => {
        await this.handle(job.data);
        return true;
      });
      // Stopped while the database was away: the piece stays active and is handed out again.
      if (!done) return;
    } catch (err) {
      const message = err instanceof JobDefect ? err.message : `the server could not compute it: ${err instanceof Error ? err.message : String(err)}`;
      this.logger.error({ err, jobId: job.data.jobId }, 'a job failed');
      await this.whileAway('recording a failed job', () => this.failJob(job.data.jobId, message)).catch(() => undefined);
    }
    this.processed++;
    await this.whileAway('acknowledging a job', () => this.boss.complete(WORK_QUEUE, job.id)).catch((err: unknown) => this.logger.error({ err }, 'could not acknowledge a job'));
  }

  private handle(message: WorkMessage): Promise<void> {
    return message.type === 'run' ? this.runJob(message.jobId) : this.sweepChunk(message);
  }

  private async row(jobId: string): Promise<RunJobRow | null> {
    const hit = this.rows.get(jobId);
    if (hit) return hit;
    const row = await loadJob(this.db, jobId);
    if (row) {
      if (this.rows.size >= 50) this.rows.delete(this.rows.keys().next().value!);
      this.rows.set(jobId, row);
    }
    return row;
  }

  /** Keeps how a stored output went. */
  private know(key: string, outcome: StoredOutcome): StoredOutcome {
    this.outcomes.delete(key);
    this.outcomes.set(key, outcome);
    if (this.outcomes.size > KEPT_OUTCOMES) this.outcomes.delete(this.outcomes.keys().next().value!);
    return outcome;
  }

  /**
   * How the outputs stored under these keys went (keys not stored are absent): from memory, else read
   * without their results. `reread` asks the database for every key: what a job finds stored when it
   * starts decides what it computes, and an output this worker saw may have been pruned since.
   */
  private async outcomesOf(keys: Iterable<string | null | undefined>, reread = false): Promise<Map<string, StoredOutcome>> {
    const found = new Map<string, StoredOutcome>();
    const missing: string[] = [];
    for (const key of new Set(keys)) {
      if (typeof key !== 'string') continue;
      const hit = reread ? undefined : this.outcomes.get(key);
      if (hit) found.set(key, hit);
      else missing.push(key);
    }
    if (missing.length) {
      const { rows } = await this.database.pool.query<{ key: string; status: 'ok' | 'error'; error: CellError | null; duration_ms: number }>({
        name: 'job_output_outcomes',
        text: 'select key, status, error, duration_ms from outputs where key = any($1::text[])',
        values: [missing],
      });
      for (const r of rows) found.set(r.key, this.know(r.key, { status: r.status, error: r.status === 'error' ? (r.error ?? { message: 'the run failed' }) : null, durationMs: r.duration_ms }));
    }
    return found;
  }

  /** Stores a computed output (once: a concurrent store of the same key keeps the first) and keeps how it went. */
  private async put(key: string, kind: JobWork['kind'], computed: ComputedOutput): Promise<void> {
    const out = await this.outputs.put(this.db, key, kind, ENGINE_VERSION, computed);
    this.know(key, { status: out.status, error: out.error, durationMs: out.durationMs });
  }

  private async state(jobId: string): Promise<JobState | null> {
    const [row] = await this.db.select({ state: runJobs.state }).from(runJobs).where(eq(runJobs.id, jobId));
    return row?.state ?? null;
  }

  private async runJob(jobId: string): Promise<void> {
    const row = await this.row(jobId);
    if (!row) return;
    const started = await this.db
      .update(runJobs)
      .set({ state: 'running', startedAt: sql`now()` })
      .where(and(eq(runJobs.id, jobId), eq(runJobs.state, 'queued')))
      .returning({ id: runJobs.id });
    const work = row.work as JobWork[];
    // A job taken up again (its worker died) or cancelled meanwhile: its state says whether to go on.
    if (!started.length && !(await this.active(jobId))) return;
    const notices: JobNotice[] = started.length ? [{ type: 'job', jobId, branchId: row.branchId }] : [];
    let checkedAt = performance.now();
    const stored = await this.outcomesOf(work.map((w) => w.key), true);
    // Outputs stored and not yet shown in the draft: quick cells land together, in one draft update.
    const landed: JobWork[] = [];
    const chunks: PgBoss.JobInsert<WorkMessage>[] = [];
    for (const w of work) {
      if (w.key === null) continue;
      // Stored before this job (another run computed the same inputs): shown with the first outputs that
      // land, not only when the whole job ends, so the cell does not wait behind a long sweep.
      if (stored.has(w.key)) {
        landed.push(w);
        continue;
      }
      const failed = await this.failedUpstream(w, work);
      if (failed) {
        await this.put(w.key, w.kind, { status: 'error', resultJson: null, error: failed, durationMs: 0 });
        landed.push(w);
        continue;
      }
      if (w.cases > 0) {
        for (let from = 0; from < w.cases; from += CASES_PER_CHUNK) {
          chunks.push({ id: stableJobId(jobId, w.cellId, from), name: WORK_QUEUE, data: { type: 'cases', jobId, cellId: w.cellId, from, to: Math.min(from + CASES_PER_CHUNK, w.cases) } });
        }
        continue;
      }
      // Before a long computation the outputs so far are shown, and a cancel is heeded.
      const quick = CELL_KIND_REGISTRY[w.kind].quick;
      if (!quick) await this.show(row, landed.splice(0), notices.splice(0));
      if (!quick || performance.now() - checkedAt > STATE_CHECK_MS) {
        if (!(await this.active(jobId))) return void (await this.show(row, landed, notices));
        checkedAt = performance.now();
      }
      const computed = await this.compute.cell(w.task!);
      await this.put(w.key!, w.kind, computed);
      landed.push(w);
    }
    // Sent again after a retry these are the same ids, which the queue keeps once. The notice wakes idle
    // workers to take them.
    if (chunks.length) {
      await this.show(row, landed.splice(0), notices.splice(0));
      await this.boss.insert(chunks);
      notices.push({ type: 'job', jobId, branchId: row.branchId });
    }
    await this.finishIfDone(row, landed, notices);
  }

  /** Whether the job is still to be worked on (not cancelled, failed or gone). */
  private async active(jobId: string): Promise<boolean> {
    const state = await this.state(jobId);
    return state !== null && jobIsActive(state);
  }

  /** Shows outputs that have landed in the draft, then tells the app servers (each cell's notice, and any others given), in one statement. */
  private async show(row: RunJobRow, landed: readonly JobWork[], notices: readonly JobNotice[] = []): Promise<void> {
    if (landed.length) {
      const found = await this.outcomesOf(landed.map((w) => w.key));
      await markDraftCells(this.db, row.branchId, landed.map((w) => ({ cellId: w.cellId, key: w.key!, ok: found.get(w.key!)?.status === 'ok' })));
    }
    await notifyJobs(this.db, [...landed.map((w): JobNotice => ({ type: 'output', jobId: row.id, branchId: row.branchId, cellId: w.cellId })), ...notices]);
  }

  /** The error a cell stores when a cell it uses failed; a cell it uses that has no output is a defect. */
  private async failedUpstream(w: JobWork, work: readonly JobWork[]): Promise<CellError | null> {
    for (const ref of w.refs) {
      const up = work.find((u) => u.cellId === ref.cellId);
      const out = up?.key ? ((await this.outcomesOf([up.key])).get(up.key) ?? null) : null;
      if (!up || !out) throw new JobDefect(`${CELL_KIND_LABELS[w.kind]}: the cell it uses (${ref.field}) could not be computed`);
      if (out.status === 'error') return upstreamFailedError(up.kind, ref.field, out.error);
    }
    return null;
  }

  private async sweepChunk(message: Extract<WorkMessage, { type: 'cases' }>): Promise<void> {
    const row = await this.row(message.jobId);
    const w = row ? (row.work as JobWork[]).find((u) => u.cellId === message.cellId) : undefined;
    if (!row || !w?.key || !w.task) return;
    const key = w.key;
    // The job's state, and the chunk's cases stored already, in one round trip: a chunk handed out again
    // (its worker died, or a run after a cancelled one) computes only what is missing.
    const { rows } = await this.database.pool.query<{ state: JobState | null; have: number[] | null }>(
      `select (select state from run_jobs where id = $1) as state,
              (select array_agg(index) from sweep_cases where sweep_key = $2 and index >= $3 and index < $4) as have`,
      [row.id, key, message.from, message.to],
    );
    const state = rows[0]?.state ?? null;
    if (state === null || !jobIsActive(state)) return;
    const present = new Set(rows[0]?.have ?? []);
    const missing: number[] = [];
    for (let i = message.from; i < message.to; i++) if (!present.has(i)) missing.push(i);
    let stored: number;
    if (missing.length) {
      const { indices, json, engineCpuMs } = await this.compute.sweepCases({ task: w.task!, indices: missing });
      // The engine's own CPU time beside the job's (npm run bench -- jobs reads it to split the overhead).
      this.logger.debug({ jobId: row.id, cellId: w.cellId, cases: indices.length, engineCpuMs }, 'sweep cases computed');
      stored = await this.storeCases(row, key, indices, json);
    } else {
      stored = await this.storedCases(key);
    }
    if (stored < w.cases) return;
    await this.assemble(row, w);
    await this.finishIfDone(row, [w]);
  }

  /**
   * Stores a chunk's cases, each once (one stored by an earlier try stays), tells the app servers, and
   * answers how many cases of the sweep are stored now, in one round trip: the database's
   * store_sweep_cases (migrations/0009) takes the chunk's indices and its cases as one JSON array, the
   * bytes the engine wrote, bound as a jsonb parameter in its binary form (a version byte, then the
   * text), so nothing of ~160 kB is written into a query string, scanned or encoded again here.
   *
   * The count decides who puts the sweep together, so it must see every other chunk's cases that are
   * stored: two chunks storing their last cases at once would otherwise each count without the other's
   * and neither would assemble. The sweep's stores therefore take turns (a lock on its key, held to the
   * end of the transaction), and the function counts in a statement of its own after the lock, which in
   * READ COMMITTED sees whatever the chunk before it committed.
   */
  private async storeCases(row: RunJobRow, key: string, indices: readonly number[], json: Uint8Array): Promise<number> {
    const notice = JSON.stringify({ type: 'job', jobId: row.id, branchId: row.branchId } satisfies JobNotice);
    const { rows } = await this.database.pool.query<{ n: number }>({
      name: 'store_sweep_cases',
      text: 'select store_sweep_cases($1, $2, $3, $4, $5) as n',
      // The indices as an array literal: pg's own array writer (arrayString) is a loop over them that V8
      // compiled afresh in nearly every job (--trace-opt in the jobs bench), a few ms each time.
      values: [key, `{${indices.join(',')}}`, jsonbParameter(json), JOB_CHANNEL, notice],
    });
    return rows[0]!.n;
  }

  /** How many cases of a sweep are stored, once the sweep's stores under way have committed (as storeCases counts). */
  private async storedCases(key: string): Promise<number> {
    const results = (await this.database.pool.query(
      `select pg_advisory_xact_lock(hashtextextended(${escapeLiteral(key)}, ${SWEEP_LOCK_SEED}));
       select count(*)::int as n from sweep_cases where sweep_key = ${escapeLiteral(key)}`,
    )) as unknown as pg.QueryResult<{ n: number }>[];
    return results[1]!.rows[0]!.n;
  }

  /**
   * Once every case of a sweep is stored: its output put together from them, in order, by PostgreSQL
   * itself. The warnings are read first (a few, each once with the cases that give it, for
   * gatherSweepWarnings to say alike ones once); then one statement joins the steps in order between
   * the result's head and its warnings and stores the output, so a thousand cases (~350 kB) are neither
   * read back here nor sent again. The cases' numbers are rounded already; the values the sweep runs
   * over are rounded here as the engine rounds results. When every step failed, assembleSweep says so
   * (it throws the sweep's error), from the cases read back as objects.
   */
  private async assemble(row: RunJobRow, w: JobWork): Promise<void> {
    const key = w.key!;
    const sw = w.task!.inputs as SweepInputs;
    const durationMs = Date.now() - (row.startedAt ?? row.createdAt).getTime();
    const { rows } = await this.database.pool.query<{ failed: boolean; warnings: string }>({
      name: 'sweep_warnings',
      text: `select bool_and(step -> 'step' ->> 'status' = 'error') as failed,
                    (select coalesce(json_agg(json_build_object('warning', seen.warning, 'steps', seen.steps) order by seen.first), '[]')::text
                       from (select w.warning, min(array[c.index::bigint, w.at]) as first, array_agg(distinct c.index) as steps
                               from sweep_cases c, jsonb_array_elements_text(c.step -> 'warnings') with ordinality as w(warning, at)
                              where c.sweep_key = $1
                              group by w.warning) as seen) as warnings
               from sweep_cases
              where sweep_key = $1`,
      values: [key],
    });
    const { failed, warnings } = rows[0]!;
    if (failed) return this.assembleFailed(key, w, sw, durationMs);
    const head: Omit<SweepResult, 'steps' | 'warnings'> = {
      parameter: sw.parameter,
      values: sweepValues(sw),
      ...(sw.second ? { second: { parameter: sw.second.parameter, values: sweepValues(sw.second) } } : {}),
    };
    const gathered = gatherSweepWarnings(JSON.parse(warnings) as SweepWarning[], sweepCaseCount(sw));
    const stored = await this.database.pool.query({
      name: 'store_assembled_sweep',
      text: `insert into outputs (key, kind, status, result, engine_version, duration_ms)
             select $1, $2, 'ok', ($3 || coalesce(string_agg((step -> 'step')::text, ',' order by index), '') || $4)::json, $5, $6
               from sweep_cases
              where sweep_key = $1
             on conflict do nothing
             returning 1`,
      values: [key, w.kind, `${resultJson(head).slice(0, -1)},"steps":[`, `],"warnings":${JSON.stringify(gathered)}}`, ENGINE_VERSION, Math.round(durationMs)],
    });
    // Stored by another try meanwhile: the first output of a key is kept, and read as it is.
    if (stored.rowCount) this.know(key, { status: 'ok', error: null, durationMs: Math.round(durationMs) });
  }

  /** A sweep whose every step failed: assembleSweep throws the sweep's error, which is its output. */
  private async assembleFailed(key: string, w: JobWork, sw: SweepInputs, durationMs: number): Promise<void> {
    let computed: ComputedOutput;
    try {
      const cases = await this.db.select({ step: sweepCases.step }).from(sweepCases).where(eq(sweepCases.sweepKey, key)).orderBy(asc(sweepCases.index));
      computed = { status: 'ok', resultJson: resultJson(assembleSweep(sw, cases.map((c) => c.step as SweepCase))), error: null, durationMs };
    } catch (err) {
      const error = toCellError(err);
      if (!error) throw err;
      computed = { status: 'error', resultJson: null, error, durationMs };
    }
    await this.put(key, w.kind, computed);
  }

  /**
   * When every output of the job is stored: the draft shows them all, the job is completed with its
   * reports. Otherwise the outputs that have just landed are shown. Either way the app servers are
   * told (those outputs' notices and the others given) once it is done.
   */
  private async finishIfDone(row: RunJobRow, landed: readonly JobWork[] = [], notices: readonly JobNotice[] = []): Promise<void> {
    const work = row.work as JobWork[];
    const keys = work.flatMap((w) => (w.key ? [w.key] : []));
    const found = await this.outcomesOf(keys);
    if (keys.some((k) => !found.has(k))) return this.show(row, landed, notices);
    await markDraftCells(this.db, row.branchId, work.flatMap((w) => (w.key ? [{ cellId: w.cellId, key: w.key, ok: found.get(w.key)!.status === 'ok' }] : [])));
    const reports: CellRunReport[] = [...work].sort((a, b) => a.position - b.position).map((w) => {
      const base = { cellId: w.cellId, kind: w.kind };
      if (w.key === null) return { ...base, status: 'invalid', reused: false, key: null, durationMs: 0, error: w.problem };
      const out = found.get(w.key)!;
      return { ...base, status: out.status, reused: w.cached, key: w.key, durationMs: out.durationMs, error: out.error };
    });
    const finished = await this.db.transaction(async (tx) => {
      const [done] = await tx
        .update(runJobs)
        .set({ state: 'completed', finishedAt: sql`now()`, reports })
        .where(and(eq(runJobs.id, row.id), inArray(runJobs.state, ['queued', 'running'])))
        .returning({ id: runJobs.id });
      if (!done) return false;
      await audit(tx, {
        actorId: row.createdBy,
        projectId: row.projectId,
        action: 'cells.run',
        targetType: 'branch',
        targetId: row.branchId,
        detail: {
          studyId: row.studyId,
          jobId: row.id,
          cellIds: reports.map((r) => r.cellId),
          computed: reports.filter((r) => !r.reused && (r.status === 'ok' || r.status === 'error')).length,
          reused: reports.filter((r) => r.reused).length,
          failed: reports.filter((r) => r.status !== 'ok').length,
        },
      });
      return true;
    });
    const told = landed.map((w): JobNotice => ({ type: 'output', jobId: row.id, branchId: row.branchId, cellId: w.cellId }));
    await notifyJobs(this.db, [...told, ...notices.filter((n) => !finished || n.type !== 'job'), ...(finished ? [{ type: 'job', jobId: row.id, branchId: row.branchId } as const] : [])]);
  }

  private async failJob(jobId: string, message: string): Promise<void> {
    const [row] = await this.db
      .update(runJobs)
      .set({ state: 'failed', error: message, finishedAt: sql`now()` })
      .where(and(eq(runJobs.id, jobId), inArray(runJobs.state, ['queued', 'running'])))
      .returning({ branchId: runJobs.branchId });
    if (row) await notifyJob(this.db, { type: 'job', jobId, branchId: row.branchId });
  }

  private async retentionLoop(policy: RetentionPolicy): Promise<void> {
    while (!this.stopping) {
      try {
        const [job] = await this.boss.fetch(RETENTION_QUEUE, { batchSize: 1 });
        if (job) {
          const pruned = await pruneRetained(this.db, policy);
          this.logger.info(pruned, 'retention: pruned old outputs, sweep cases, finished jobs and sent mail');
          await this.boss.complete(RETENTION_QUEUE, job.id);
        }
      } catch (err) {
        if (!isDatabaseUnavailable(err)) this.logger.error({ err }, 'retention failed');
      }
      await this.pause(30_000);
    }
  }
}
