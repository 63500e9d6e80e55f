import { HttpErrorResponse } from '@angular/common/http';
import { DestroyRef, Injectable, InjectionToken, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type { Draft, DraftCell, Job, Problem, RunResponse } from '@laminote/contracts';
import { type CellKind, referenceFields, upstreamCellIds } from '@laminote/contracts/cell-kinds';
import { sameJson } from '@laminote/contracts/values';
import {
  BehaviorSubject,
  EMPTY,
  type Observable,
  Subject,
  catchError,
  concatMap,
  debounceTime,
  defer,
  filter,
  from,
  ignoreElements,
  firstValueFrom,
  map,
  merge,
  retry,
  tap,
  throwError,
  timer,
} from 'rxjs';
import { toProblem } from '../core/problem';
import { defaultInputs, cellKindInfo } from './cell-kinds';
import { byTime } from './format';
import { type CellChange, type SavedCell, diffStacks, toSavedCell } from './draft-diff';
import { JobsApi } from './jobs-api';
import { NotebookApi } from './notebook-api';
import { type RuntimeChecks, loadRuntimeChecks, runtimeChecks } from './runtime-checks';

/** How long editing pauses before the draft is saved. */
export const AUTOSAVE_DELAY_MS = new InjectionToken<number>('AUTOSAVE_DELAY_MS', { factory: () => 900 });

/**
 * Where the draft stands with the server:
 * `saved` nothing waits; `pending` edits wait for the pause; `saving` a save is on its way;
 * `offline` the server cannot be reached (retrying); `failed` the server refused the save;
 * `conflict` someone else saved first and the person has to choose.
 */
export type SaveStatus = 'saved' | 'pending' | 'saving' | 'offline' | 'failed' | 'conflict';

/** A 409 on save: the server's draft, and who changed what since the stack both sides started from. */
export interface DraftConflict {
  readonly theirs: Draft;
  readonly theirChanges: readonly CellChange[];
  readonly myChanges: readonly CellChange[];
  /** Cells changed on both sides. */
  readonly clashing: ReadonlySet<string>;
}

/** A cell in the "Recently removed" list. `pending` means the removal is not saved yet. */
export interface RemovedCell extends SavedCell {
  readonly deletedAt: string | null;
  readonly deletedBy: string | null;
  readonly deletedByName: string | null;
  readonly pending: boolean;
}

function newCellId(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  // Outside a secure context randomUUID is missing; build a version-4 UUID from random bytes.
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  bytes[6] = (bytes[6] & 0x0f) | 0x40;
  bytes[8] = (bytes[8] & 0x3f) | 0x80;
  const hex = Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

function isUnreachable(error: unknown): boolean {
  return error instanceof HttpErrorResponse && (error.status === 0 || error.status === 502 || error.status === 503 || error.status === 504);
}

function isConflict(error: unknown): boolean {
  return error instanceof HttpErrorResponse && error.status === 409;
}

/** The server's draft inside a 409 problem (`current`), when it sent one that reads as a draft. */
function conflictDraft(error: unknown, checks: RuntimeChecks | null): Draft | null {
  if (!checks || !isConflict(error)) return null;
  const body: unknown = (error as HttpErrorResponse).error;
  if (typeof body !== 'object' || body === null) return null;
  const parsed = checks.draftSchema.safeParse((body as { current?: unknown }).current);
  return parsed.success ? parsed.data : null;
}

/**
 * The branch draft being edited on the notebook page: the cell stack as the person sees it, the
 * autosave (debounced, one save at a time, each on the revision the last one returned), conflicts, runs.
 * Provided by the notebook page; the cells and the page's bars inject it.
 */
@Injectable()
export class DraftSession {
  private readonly api = inject(NotebookApi);
  private readonly jobs = inject(JobsApi);
  private readonly queuedJobs = new Subject<Job>();
  /** Jobs this session's runs queued, as the server answered them. */
  readonly queued = this.queuedJobs.asObservable();
  private readonly delay = inject(AUTOSAVE_DELAY_MS);

  private readonly draftSignal = signal<Draft | null>(null);
  private readonly cellsSignal = signal<DraftCell[]>([]);
  private readonly statusSignal = signal<SaveStatus>('saved');
  private readonly saveProblemSignal = signal<Problem | null>(null);
  private readonly conflictSignal = signal<DraftConflict | null>(null);
  private readonly runningSignal = signal<ReadonlySet<string>>(new Set());
  private readonly runJobsSignal = signal<ReadonlyMap<string, string>>(new Map());
  private readonly runProblemsSignal = signal<ReadonlyMap<string, Problem>>(new Map());
  private readonly removedLocally = signal<RemovedCell[]>([]);
  private readonly revisionSignal = signal(0);

  /** Whether the person may change the stack (engineers and leads). */
  readonly editable = signal(false);
  /** Whether the person may run cells. */
  readonly mayRun = signal(false);

  readonly draft = this.draftSignal.asReadonly();
  readonly cells = this.cellsSignal.asReadonly();
  readonly status = this.statusSignal.asReadonly();
  readonly saveProblem = this.saveProblemSignal.asReadonly();
  readonly conflict = this.conflictSignal.asReadonly();
  readonly running = this.runningSignal.asReadonly();
  /** The job computing each running cell, once the server has queued it (cell id → job id). */
  readonly runJobs = this.runJobsSignal.asReadonly();
  readonly runProblems = this.runProblemsSignal.asReadonly();
  readonly revision = this.revisionSignal.asReadonly();
  readonly studyRunning = computed(() => this.runningSignal().size > 0);

  /** Removed cells that can be brought back: unsaved removals first, then the draft's trash, newest first. */
  readonly recentlyRemoved = computed((): RemovedCell[] => {
    const present = new Set(this.cellsSignal().map((cell) => cell.cellId));
    const local = this.removedLocally().filter((cell) => !present.has(cell.cellId));
    const localIds = new Set(local.map((cell) => cell.cellId));
    const trash = (this.draftSignal()?.trash ?? [])
      .filter((cell) => !present.has(cell.cellId) && !localIds.has(cell.cellId))
      .map((cell): RemovedCell => ({ ...toSavedCell(cell), deletedAt: cell.deletedAt, deletedBy: cell.deletedBy, deletedByName: cell.deletedByName ?? null, pending: false }))
      .sort((a, b) => byTime(b.deletedAt ?? '', a.deletedAt ?? ''));
    return [...local, ...trash];
  });

  private branchId: string | null = null;
  /** The stack as the server last confirmed it: what both sides of a conflict started from. */
  private base: SavedCell[] = [];
  private editSeq = 0;
  private savedSeq = 0;
  private inFlight = false;
  private readonly edits = new Subject<void>();
  private readonly flushes = new Subject<void>();
  private readonly statusChanges = new BehaviorSubject<SaveStatus>('saved');

  constructor() {
    merge(this.edits.pipe(debounceTime(this.delay)), this.flushes)
      .pipe(
        concatMap(() => this.saveOnce()),
        takeUntilDestroyed(inject(DestroyRef)),
      )
      .subscribe();
  }

  /** Starts editing a branch's draft as the server has it. */
  open(branchId: string, draft: Draft): void {
    this.branchId = branchId;
    this.draftSignal.set(draft);
    this.cellsSignal.set(draft.cells);
    this.base = draft.cells.map(toSavedCell);
    this.revisionSignal.set(draft.revision);
    this.editSeq = this.savedSeq = 0;
    this.removedLocally.set([]);
    this.conflictSignal.set(null);
    this.runProblemsSignal.set(new Map());
    this.setStatus('saved');
  }

  get currentBranchId(): string | null {
    return this.branchId;
  }

  /** Whether there are edits the server has not confirmed. */
  dirty(): boolean {
    return this.editSeq !== this.savedSeq || this.inFlight;
  }

  cell(cellId: string): DraftCell | undefined {
    return this.cellsSignal().find((cell) => cell.cellId === cellId);
  }

  // ── Editing ──────────────────────────────────────────────────────────────────────────────────

  /** Adds a new cell of `kind` at `index` (the end when omitted); answers its id. */
  add(kind: CellKind, index = this.cellsSignal().length): string {
    const cellId = newCellId();
    const count = this.cellsSignal().filter((cell) => cell.kind === kind).length;
    const label = cellKindInfo(kind).label;
    const cell: DraftCell = {
      cellId,
      kind,
      title: count === 0 ? label : `${label} ${count + 1}`,
      collapsed: false,
      inputs: { ...defaultInputs(kind), ...this.nearestSources(kind, index) },
      runState: 'idle',
      problems: [],
      output: null,
      lastGoodOutput: null,
    };
    this.cellsSignal.update((cells) => [...cells.slice(0, index), cell, ...cells.slice(index)]);
    this.changed();
    return cellId;
  }

  /** A new cell uses the nearest cells above it of the kinds it may name, as a study is usually read. */
  private nearestSources(kind: CellKind, index: number): Record<string, string> {
    const above = this.cellsSignal().slice(0, index).reverse();
    const links: Record<string, string> = {};
    for (const [field, reference] of referenceFields(kind)) {
      const nearest = above.find((c) => reference.kinds.includes(c.kind))?.cellId;
      if (nearest !== undefined) links[field] = nearest;
    }
    return links;
  }

  /** A copy just below, with a fresh id and no result (it has not been computed as itself). */
  duplicate(cellId: string): string | null {
    const index = this.indexOf(cellId);
    if (index < 0) return null;
    const source = this.cellsSignal()[index];
    const copy: DraftCell = {
      ...source,
      cellId: newCellId(),
      title: `${source.title} (copy)`.slice(0, 200),
      inputs: structuredClone(source.inputs),
      runState: 'idle',
      output: null,
      lastGoodOutput: null,
    };
    this.cellsSignal.update((cells) => [...cells.slice(0, index + 1), copy, ...cells.slice(index + 1)]);
    this.changed();
    return copy.cellId;
  }

  /** Moves a cell by `delta` places; answers whether it moved. */
  move(cellId: string, delta: number): boolean {
    const from = this.indexOf(cellId);
    return from >= 0 && this.moveTo(from, from + delta);
  }

  moveTo(from: number, to: number): boolean {
    const cells = [...this.cellsSignal()];
    if (from < 0 || from >= cells.length || to < 0 || to >= cells.length || from === to) return false;
    const [cell] = cells.splice(from, 1);
    cells.splice(to, 0, cell);
    this.cellsSignal.set(cells);
    this.changed();
    return true;
  }

  remove(cellId: string): void {
    const cell = this.cell(cellId);
    if (!cell) return;
    this.cellsSignal.update((cells) => cells.filter((c) => c.cellId !== cellId));
    this.removedLocally.update((removed) => [
      { ...toSavedCell(cell), deletedAt: null, deletedBy: null, deletedByName: null, pending: true },
      ...removed.filter((c) => c.cellId !== cellId),
    ]);
    this.changed();
  }

  /** Brings a removed cell back at the end of the stack, as it was when removed. */
  restore(cellId: string): void {
    const removed = this.recentlyRemoved().find((cell) => cell.cellId === cellId);
    if (!removed) return;
    const cell: DraftCell = {
      cellId: removed.cellId,
      kind: removed.kind,
      title: removed.title,
      collapsed: removed.collapsed,
      inputs: removed.inputs,
      runState: 'idle',
      problems: [],
      output: null,
      lastGoodOutput: null,
    };
    this.cellsSignal.update((cells) => [...cells, cell]);
    this.removedLocally.update((list) => list.filter((c) => c.cellId !== cellId));
    this.changed();
  }

  setTitle(cellId: string, title: string): void {
    this.patch(cellId, (cell) => (cell.title === title ? cell : { ...cell, title }));
  }

  setCollapsed(cellId: string, collapsed: boolean): void {
    this.patch(cellId, (cell) => (cell.collapsed === collapsed ? cell : { ...cell, collapsed }));
  }

  /** New inputs for a cell; its result and those of the cells that use it no longer match. */
  setInputs(cellId: string, inputs: Record<string, unknown>): void {
    const cell = this.cell(cellId);
    if (!cell || sameJson(cell.inputs, inputs)) return;
    const stale = this.downstreamOf(cellId);
    this.cellsSignal.update((cells) =>
      cells.map((c) => {
        if (c.cellId === cellId) return { ...c, inputs, runState: c.runState === 'current' ? 'outdated' : c.runState };
        if (stale.has(c.cellId) && c.runState === 'current') return { ...c, runState: 'outdated' };
        return c;
      }),
    );
    this.changed();
  }

  // ── Saving ───────────────────────────────────────────────────────────────────────────────────

  /** Saves now instead of after the pause; resolves when nothing waits (or saving cannot go on). */
  async flush(): Promise<boolean> {
    if (!this.dirty()) return true;
    this.flushes.next();
    const status = await firstValueFrom(
      this.statusChanges.pipe(filter((s) => (s === 'saved' && !this.dirty()) || s === 'conflict' || s === 'failed' || s === 'offline')),
    );
    return status === 'saved';
  }

  /** Keep my stack: save it again on top of the revision the other person made. */
  keepMine(): void {
    const conflict = this.conflictSignal();
    if (!conflict) return;
    this.acceptServerDraft(conflict.theirs, { keepLocalCells: true });
    this.conflictSignal.set(null);
    this.editSeq++;
    this.setStatus('pending');
    this.flushes.next();
  }

  /** Take their stack and drop my unsaved edits (the person chose this in the conflict dialog). */
  takeTheirs(): void {
    const conflict = this.conflictSignal();
    if (!conflict) return;
    this.acceptServerDraft(conflict.theirs, { keepLocalCells: false });
    this.removedLocally.set([]);
    this.conflictSignal.set(null);
    this.savedSeq = this.editSeq;
    this.setStatus('saved');
  }

  /** Tries a refused or unreachable save again. */
  retrySave(): void {
    if (this.conflictSignal()) return;
    this.flushes.next();
  }

  // ── Running ──────────────────────────────────────────────────────────────────────────────────

  /** Runs the given cells, or the whole study when none are given, after saving what waits. */
  async run(cellIds?: string[]): Promise<void> {
    const branchId = this.branchId;
    if (!branchId || !this.mayRun()) return;
    const saved = await this.flush();
    if (!saved) return;
    const ids = cellIds ?? this.cellsSignal().filter((cell) => cellKindInfo(cell.kind).runs).map((cell) => cell.cellId);
    this.runningSignal.update((running) => new Set([...running, ...ids]));
    this.runProblemsSignal.update((problems) => {
      const next = new Map(problems);
      for (const id of ids) next.delete(id);
      return next;
    });
    const seq = this.editSeq;
    try {
      const result = await firstValueFrom(this.api.run(branchId, cellIds ? { cellIds } : {}));
      if ('jobId' in result) {
        // Queued: workers compute it; the page shows its progress meanwhile.
        this.runJobsSignal.update((jobs) => new Map([...jobs, ...ids.map((id) => [id, result.jobId] as const)]));
        this.queuedJobs.next(result.job);
        const job = await this.jobs.finished(result.jobId);
        if (job.state === 'failed') throw { type: 'about:blank', title: 'The run failed', status: 500, detail: job.error } satisfies Problem;
        const draft = await firstValueFrom(this.api.draft(branchId));
        this.acceptRunDraft(draft, seq);
        this.noteRunProblems(job.ran ?? []);
      } else if (result.revision !== this.revisionSignal()) {
        // Someone saved while it ran: its changed cells alone would mix two revisions, so read the draft.
        this.acceptRunDraft(await firstValueFrom(this.api.draft(branchId)), seq);
        this.noteRunProblems(result.ran);
      } else {
        this.acceptRunCells(result.cells);
        this.noteRunProblems(result.ran);
      }
    } catch (error) {
      const problem = toProblem(error);
      this.runProblemsSignal.update((problems) => {
        const next = new Map(problems);
        for (const id of ids) next.set(id, problem);
        return next;
      });
    } finally {
      this.settle(ids);
    }
  }

  /**
   * Takes the outputs that have landed since (a job's worker stored them): the server's draft, as long
   * as nobody else saved meanwhile (their save is for the autosave's conflict dialog to show). The cells
   * named in `landed` (cell id → the job that stored its output) have their outputs stored though the
   * rest of their job goes on (a study's light cells land long before its sweep ends): once the draft is
   * read they no longer say "Computing…", unless a newer run of theirs was queued meanwhile.
   */
  async refreshOutputs(landed: ReadonlyMap<string, string> = new Map()): Promise<void> {
    const branchId = this.branchId;
    if (!branchId) return;
    const seq = this.editSeq;
    const draft = await firstValueFrom(this.api.draft(branchId)).catch(() => null);
    const runJobs = this.runJobsSignal();
    this.settle([...landed].filter(([cellId, jobId]) => runJobs.get(cellId) === jobId).map(([cellId]) => cellId));
    if (!draft || draft.revision !== this.revisionSignal() || this.conflictSignal()) return;
    const clean = seq === this.editSeq && this.editSeq === this.savedSeq;
    this.acceptServerDraft(draft, { keepLocalCells: !clean });
  }

  // ── Internals ────────────────────────────────────────────────────────────────────────────────

  /** The cells are no longer being computed by this session's runs. */
  private settle(cellIds: readonly string[]): void {
    if (cellIds.length === 0) return;
    this.runningSignal.update((running) => new Set([...running].filter((id) => !cellIds.includes(id))));
    this.runJobsSignal.update((jobs) => new Map([...jobs].filter(([id]) => !cellIds.includes(id))));
  }

  private indexOf(cellId: string): number {
    return this.cellsSignal().findIndex((cell) => cell.cellId === cellId);
  }

  private patch(cellId: string, change: (cell: DraftCell) => DraftCell): void {
    let changed = false;
    this.cellsSignal.update((cells) =>
      cells.map((cell) => {
        if (cell.cellId !== cellId) return cell;
        const next = change(cell);
        changed = next !== cell;
        return next;
      }),
    );
    if (changed) this.changed();
  }

  /** Every cell that uses `cellId`, directly or through others. */
  private downstreamOf(cellId: string): Set<string> {
    const cells = this.cellsSignal();
    const found = new Set<string>();
    let frontier = [cellId];
    while (frontier.length > 0) {
      const next: string[] = [];
      for (const cell of cells) {
        if (found.has(cell.cellId)) continue;
        if (upstreamCellIds(cell.kind, cell.inputs).some((id) => frontier.includes(id))) {
          found.add(cell.cellId);
          next.push(cell.cellId);
        }
      }
      frontier = next;
    }
    return found;
  }

  private changed(): void {
    this.editSeq++;
    if (this.statusSignal() === 'saved') this.setStatus('pending');
    this.edits.next();
  }

  private setStatus(status: SaveStatus): void {
    this.statusSignal.set(status);
    this.statusChanges.next(status);
  }

  private saveOnce(): Observable<void> {
    // Rebuilt on every retry, so a save that waited for the network carries the newest edits.
    const attempt = defer(() => {
      const branchId = this.branchId;
      if (!branchId || this.conflictSignal() || this.editSeq === this.savedSeq || !this.editable()) return EMPTY;
      const seq = this.editSeq;
      const cells = this.cellsSignal().map(toSavedCell);
      this.inFlight = true;
      this.setStatus('saving');
      return this.api.saveDraft(branchId, { baseRevision: this.revisionSignal(), cells }).pipe(
        map((draft) => ({ draft, seq })),
        tap({ finalize: () => (this.inFlight = false) }),
      );
    });
    return attempt.pipe(
      retry({
        delay: (error: unknown, count: number) => {
          if (!isUnreachable(error)) return throwError(() => error);
          this.setStatus('offline');
          return timer(Math.min(1000 * 2 ** (count - 1), 15_000));
        },
      }),
      tap(({ draft, seq }) => {
        // Before the status moves on, so that a waiting flush sees nothing in flight.
        this.inFlight = false;
        this.saveProblemSignal.set(null);
        this.acceptSaved(draft, seq);
      }),
      map(() => undefined),
      catchError((error: unknown) => {
        this.inFlight = false;
        const settle = (checks: RuntimeChecks | null) => {
          const theirs = conflictDraft(error, checks);
          if (theirs) this.openConflict(theirs);
          else {
            this.saveProblemSignal.set(toProblem(error));
            this.setStatus('failed');
          }
        };
        const checks = runtimeChecks();
        if (checks || !isConflict(error)) {
          settle(checks);
          return EMPTY;
        }
        // A conflict before the draft's schema has loaded (it loads apart from the first screen).
        return from(loadRuntimeChecks().catch(() => null)).pipe(tap(settle), ignoreElements());
      }),
    );
  }

  private acceptSaved(draft: Draft, seq: number): void {
    this.savedSeq = seq;
    this.acceptServerDraft(draft, { keepLocalCells: seq !== this.editSeq });
    const removedIds = new Set(draft.trash.map((cell) => cell.cellId));
    this.removedLocally.update((removed) => removed.filter((cell) => !removedIds.has(cell.cellId)));
    this.setStatus(this.editSeq === this.savedSeq ? 'saved' : 'pending');
  }

  /**
   * Takes the server's draft as the new base. With `keepLocalCells`, the stack stays as edited here and
   * only what the server computed (run states, problems, outputs) is taken for cells whose inputs match.
   */
  private acceptServerDraft(draft: Draft, options: { keepLocalCells: boolean }): void {
    this.draftSignal.set(draft);
    this.revisionSignal.set(draft.revision);
    this.base = draft.cells.map(toSavedCell);
    if (!options.keepLocalCells) {
      this.cellsSignal.set(draft.cells);
      return;
    }
    this.mergeServerCells(draft.cells);
  }

  private mergeServerCells(serverCells: readonly DraftCell[]): void {
    const byId = new Map(serverCells.map((cell) => [cell.cellId, cell]));
    this.cellsSignal.update((cells) =>
      cells.map((cell) => {
        const server = byId.get(cell.cellId);
        if (!server) return cell;
        if (server.kind === cell.kind && sameJson(server.inputs, cell.inputs)) {
          return { ...cell, runState: server.runState, problems: server.problems, output: server.output, lastGoodOutput: server.lastGoodOutput };
        }
        // Inputs changed here since: the server's result is for the old inputs, so it is outdated.
        const output = server.output ?? cell.output;
        return {
          ...cell,
          output,
          lastGoodOutput: server.lastGoodOutput ?? cell.lastGoodOutput,
          runState: output ? 'outdated' : cell.runState,
        };
      }),
    );
  }

  /** Takes the draft read after a run (a job's, or one that someone's save overtook). */
  private acceptRunDraft(draft: Draft, seq: number): void {
    // A run does not move the revision; the cells' new outputs come with the draft.
    const clean = seq === this.editSeq && this.editSeq === this.savedSeq;
    this.acceptServerDraft(draft, { keepLocalCells: !clean });
  }

  /**
   * Takes what a run computed at once: the cells whose outputs it changed, on the revision this
   * session holds (their inputs are the ones saved; the stack and the other cells are as they are).
   */
  private acceptRunCells(cells: readonly DraftCell[]): void {
    if (cells.length === 0) return;
    const byId = new Map(cells.map((cell) => [cell.cellId, cell]));
    this.draftSignal.update((draft) => (draft ? { ...draft, cells: draft.cells.map((cell) => byId.get(cell.cellId) ?? cell) } : draft));
    this.mergeServerCells(cells);
  }

  /** Cells a run could not compute (invalid inputs, a server fault) show why, each on its own. */
  private noteRunProblems(ran: RunResponse['ran']): void {
    const notRun = ran.filter((report) => report.status === 'invalid' || report.status === 'internal');
    if (notRun.length === 0) return;
    this.runProblemsSignal.update((problems) => {
      const next = new Map(problems);
      for (const report of notRun) {
        next.set(report.cellId, {
          type: 'about:blank',
          title: report.status === 'invalid' ? 'Fix the inputs first' : 'The server could not compute this cell',
          status: report.status === 'invalid' ? 400 : 500,
          detail: report.error?.message,
          field: report.error?.field,
        });
      }
      return next;
    });
  }

  private openConflict(theirs: Draft): void {
    const theirCells = theirs.cells.map(toSavedCell);
    const mine = this.cellsSignal().map(toSavedCell);
    const theirChanges = diffStacks(this.base, theirCells);
    const myChanges = diffStacks(this.base, mine);
    const theirIds = new Set(theirChanges.filter((c) => c.change !== 'moved').map((c) => c.cellId));
    const clashing = new Set(myChanges.filter((c) => c.change !== 'moved' && theirIds.has(c.cellId)).map((c) => c.cellId));
    this.conflictSignal.set({ theirs, theirChanges, myChanges, clashing });
    this.setStatus('conflict');
  }
}
