import { LiveAnnouncer } from '@angular/cdk/a11y';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { CdkDrag, type CdkDragDrop, CdkDropList } from '@angular/cdk/drag-drop';
import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  DestroyRef,
  Injector,
  PendingTasks,
  afterNextRender,
  computed,
  effect,
  inject,
  untracked,
  input,
  signal,
  viewChildren,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { MatDialogRef } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import type { Branch, Draft, DraftCell, ProjectAccess, Study } from '@laminote/contracts';
import type { CellKind } from '@laminote/contracts/cell-kinds';
import { can } from '@laminote/contracts/access';
import { Subject, debounceTime, merge, of, switchMap, throwError } from 'rxjs';
import { Auth } from '../core/auth';
import { loader } from '../shared/load-state';
import { NotFound } from '../shared/not-found';
import { ProblemBanner } from '../shared/problem-banner';
import { roleLabel } from '../shared/role-label';
import { AddCell, AddCellMenu } from './add-cell';
import { CellBody, bodyPlaceholderHeight } from './cell-body';
import { fetchBodiesOf } from './cell-bodies';
import { CellFrame } from './cell-frame';
import { cellKindInfo } from '../shared/cell-kinds';
import type { ConflictChoice, ConflictDialog } from './conflict-dialog';
import { DraftSession } from '../shared/draft-session';
import { BranchJobs } from './branch-jobs';
import { CellProgress } from './cell-progress';
import { RunProgress } from './run-progress';
import { NotebookApi } from '../shared/notebook-api';
import { RemovedCells } from './removed-cells';
import { SaveIndicator } from './save-indicator';
import { VersionBar } from '../versions/version-bar';
import { SinceLastLook } from './since-last-look';
import { DIALOG_NOT_LOADED, openLazyBottomSheet, openLazyDialog } from '../shared/lazy-dialog';
import { Notifier } from '../core/notifier';
import { pageQuiet, plotsWaitingForQuiet } from '../shared/plot-schedule';

interface OpenedStudy {
  readonly study: Study;
  readonly branches: Branch[];
  readonly branch: Branch;
  readonly draft: Draft;
}

/**
 * Cell bodies drawn at once: the top cell's, then every other cell whose frame starts on the first
 * screen (measured with the bodies' placeholders, which are about as tall as the drawn bodies). The rest
 * follow one body per idle moment of the browser, so a keystroke never waits behind more than one body.
 */
const FIRST_BODIES = 1;
/**
 * How long the bodies out of sight wait at most for plots near the window to start (the page to go
 * quiet): a page kept busy (something drawing every frame) draws them after this anyway.
 */
const FAR_BODIES_WAIT_MS = 1500;

function isTextEntry(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  return target.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName) || target.getAttribute('role') === 'combobox';
}

/**
 * A study's notebook: its cells stacked top to bottom, each with inputs and result, saved as the
 * person types. The page owns the draft session; the cells and the header bars share it.
 */
@Component({
  selector: 'lam-notebook-page',
  imports: [
    AddCell,
    AddCellMenu,
    CdkDrag,
    CdkDropList,
    CellBody,
    CellFrame,
    CellProgress,
    MatButtonModule,
    MatIconModule,
    MatTooltipModule,
    NotFound,
    ProblemBanner,
    RemovedCells,
    RouterLink,
    RunProgress,
    SaveIndicator,
    VersionBar,
    SinceLastLook,
  ],
  providers: [DraftSession, BranchJobs],
  templateUrl: './notebook-page.html',
  styleUrl: './notebook-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    '(document:keydown)': 'onKeydown($event)',
  },
})
export class NotebookPage {
  private readonly api = inject(NotebookApi);
  private readonly auth = inject(Auth);
  private readonly title = inject(Title);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly notifier = inject(Notifier);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly injector = inject(Injector);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly session = inject(DraftSession);
  /** The branch's run jobs, followed while the page is open by those who may run cells. */
  protected readonly jobs = inject(BranchJobs);
  protected readonly cancelling = signal<string | null>(null);
  protected readonly cellTitles = computed(() => new Map(this.cells().map((cell) => [cell.cellId, cell.title.trim() || cellKindInfo(cell.kind).label])));

  /** From the route. */
  readonly studyId = input.required<string>();
  /** From the `?branch=` query parameter. */
  readonly branch = input<string | undefined>(undefined);

  private readonly opening = loader(
    () => ({ studyId: this.studyId(), branch: this.branch() }),
    ({ studyId, branch }) =>
      this.api.opening(studyId, branch).pipe(
        switchMap(({ study, branches, draft }) => {
          const chosen = draft ? branches.find((b) => b.id === draft.branchId) : undefined;
          if (!chosen || !draft) {
            return throwError(() => ({
              type: 'about:blank',
              title: branch ? `This study has no branch “${branch}”` : 'This study has no branch to open',
              status: 404,
            }));
          }
          return of<OpenedStudy>({ study, branches, branch: chosen, draft });
        }),
      ),
  );
  protected readonly state = this.opening.state;
  protected readonly notFound = computed(() => this.state().problem?.status === 404 && !this.state().value);
  protected readonly opened = computed(() => this.state().value ?? null);
  protected readonly studyExportUrl = computed(() => {
    const opened = this.opened();
    return opened ? this.api.studyExportUrl(opened.branch.id) : null;
  });

  protected readonly access = computed((): ProjectAccess | null => {
    const opened = this.opened();
    const me = this.auth.me();
    if (!opened || !me) return null;
    const membership = me.memberships.find((m) => m.projectId === opened.study.projectId);
    return { role: membership?.role ?? null, siteAdmin: me.user.siteAdmin };
  });
  protected readonly projectName = computed(() => {
    const opened = this.opened();
    return this.auth.me()?.memberships.find((m) => m.projectId === opened?.study.projectId)?.projectName ?? 'Project';
  });
  protected readonly editable = computed(() => {
    const access = this.access();
    const opened = this.opened();
    return access !== null && can(access, 'editStudy') && !opened?.study.archived && !opened?.branch.archived;
  });
  protected readonly mayRun = computed(() => {
    const access = this.access();
    return access !== null && can(access, 'runCells') && this.editable();
  });
  protected readonly readOnlyReason = computed(() => {
    const access = this.access();
    const opened = this.opened();
    if (!access || !opened) return null;
    if (opened.study.archived) return 'This study is archived: it can be read, not changed.';
    if (opened.branch.archived) return 'This branch is archived: it can be read, not changed.';
    if (!can(access, 'editStudy')) {
      return `You read this study as ${roleLabel(access.role, access.siteAdmin).toLowerCase()}: editing and running cells are for the project’s engineers and leads.`;
    }
    return null;
  });

  protected readonly cells = this.session.cells;
  protected readonly runnableCount = computed(() => this.cells().filter((cell) => cellKindInfo(cell.kind).runs).length);

  /**
   * The cells (by id) whose bodies are drawn. A long study shows every frame at once and the bodies of
   * the first screen, then draws the others one at a time between the person's input, so the page
   * answers at once: first those on the screen (a person who scrolled far down right after opening
   * sees those bodies next, not the ones in between), then from the top. A frame gets its buttons and
   * the insertion line below it with its body. A cell the person adds, copies, brings back or goes to
   * is drawn at once, with the cells above it; and a cell added above drawn ones leaves them drawn.
   */
  protected readonly drawn = signal<ReadonlySet<string>>(new Set());
  protected readonly placeholderHeight = bodyPlaceholderHeight;
  private readonly pendingTasks = inject(PendingTasks);

  private readonly addControls = viewChildren(AddCell);
  /** The conflict dialog while it is open (or its code is being fetched). */
  private conflictRef: Promise<MatDialogRef<ConflictDialog, ConflictChoice>> | null = null;

  constructor() {
    if (typeof window !== 'undefined') {
      window.addEventListener('beforeunload', this.onBeforeUnload);
      this.destroyRef.onDestroy(() => window.removeEventListener('beforeunload', this.onBeforeUnload));
    }
    effect(() => {
      const opened = this.opened();
      if (!opened) return;
      this.session.open(opened.branch.id, opened.draft);
      fetchBodiesOf(opened.draft.cells.map((cell) => cell.kind));
      this.drawBodiesProgressively(opened.draft.cells);
    });
    effect(() => {
      this.session.editable.set(this.editable());
      this.session.mayRun.set(this.mayRun());
    });
    // Runs are jobs: follow the branch's while the page is open; outputs fill in as they land.
    effect(() => {
      const branchId = this.opened()?.branch.id;
      const follow = this.mayRun();
      untracked(() => (branchId && follow ? this.jobs.follow(branchId) : this.jobs.stop()));
    });
    this.session.queued.pipe(takeUntilDestroyed()).subscribe((job) => this.jobs.add(job));
    // Outputs fill in as they land: the draft is read again once the notices pause. A cell this page runs
    // stops saying "Computing…" once its job has stored its output (the job's own per-cell count tells,
    // also to a page that connected after the output's notice), while the rest of the job goes on; its
    // read is the same one as the notices'.
    const landed = new Map<string, string>();
    const settling = new Set<string>();
    const countsMoved = new Subject<void>();
    merge(this.jobs.outputs, countsMoved)
      .pipe(debounceTime(250), takeUntilDestroyed())
      .subscribe(() => {
        const cells = new Map(landed);
        landed.clear();
        for (const cellId of cells.keys()) settling.add(cellId);
        void this.session.refreshOutputs(cells).finally(() => cells.forEach((_, cellId) => settling.delete(cellId)));
      });
    effect(() => {
      const computedCells = this.jobs.computedCells();
      const fresh = [...this.session.runJobs()].filter(([cellId, jobId]) => !landed.has(cellId) && !settling.has(cellId) && computedCells.get(jobId)?.has(cellId));
      if (fresh.length === 0) return;
      for (const [cellId, jobId] of fresh) landed.set(cellId, jobId);
      countsMoved.next();
    });
    effect(() => {
      const opened = this.opened();
      if (opened) this.title.setTitle(`${opened.study.title} · Laminote`);
    });
    effect(() => {
      if (this.session.conflict() && !this.conflictRef) this.showConflict();
    });
  }

  protected retry(): void {
    this.opening.reload();
  }

  protected async cancelRun(jobId: string): Promise<void> {
    this.cancelling.set(jobId);
    try {
      await this.jobs.cancel(jobId);
      this.announcer.announce('The run was stopped; what it had computed is kept');
    } catch {
      this.announcer.announce('The run could not be stopped');
    } finally {
      this.cancelling.set(null);
    }
  }

  private drawBodiesProgressively(cells: readonly DraftCell[]): void {
    const count = cells.length;
    this.drawn.set(new Set(cells.slice(0, FIRST_BODIES).map((cell) => cell.cellId)));
    if (count <= FIRST_BODIES) return;
    // The page counts as busy until every body is drawn (tests and whenStable wait for it).
    const pending = this.pendingTasks.add();
    // Which frames are inside the window, as the browser tells once it has laid the page out for a frame
    // anyway: reading the frames' places after each body drawn would lay the page out again at each step.
    const inWindow = new Set<string>();
    // Set while the bodies far below the window wait for plots near it to start (see step).
    let resume: (() => void) | null = null;
    const watch =
      typeof IntersectionObserver === 'function'
        ? new IntersectionObserver((entries) => {
            for (const entry of entries) {
              const id = (entry.target as HTMLElement).dataset['cellId'];
              if (!id) continue;
              if (entry.isIntersecting) inWindow.add(id);
              else inWindow.delete(id);
              // A body not drawn yet came into the window (the person scrolled): it is drawn now.
              if (entry.isIntersecting && !this.drawn().has(id)) resume?.();
            }
          })
        : null;
    const done = () => {
      watch?.disconnect();
      pending();
    };
    const idle = (next: () => void) =>
      typeof requestIdleCallback === 'function' ? requestIdleCallback(next, { timeout: 500 }) : setTimeout(next, 16);
    const step = () => {
      // The person may have left the study before the browser was idle: nothing more to draw.
      if (this.destroyRef.destroyed) return done();
      const undrawn = this.cells().filter((cell) => !this.drawn().has(cell.cellId));
      const inSight = undrawn.find((cell) => inWindow.has(cell.cellId));
      const next = (inSight ?? undrawn[0])?.cellId;
      if (!next) return done();
      // Plots near the window start their library once the page is quiet, which it is not while bodies
      // are drawn: the bodies out of sight wait for that moment (at most FAR_BODIES_WAIT_MS), so those
      // plots come about 1 s sooner in the 20-cell study (cold) instead of after every body.
      if (!inSight && plotsWaitingForQuiet()) {
        let resumed = false;
        resume = () => {
          if (resumed) return;
          resumed = true;
          resume = null;
          idle(step);
        };
        const go = resume;
        void pageQuiet().then(go);
        setTimeout(go, FAR_BODIES_WAIT_MS);
        return;
      }
      this.draw([next]);
      afterNextRender(() => idle(step), { injector: this.injector });
    };
    // Once the frames are laid out (the browser lays them out for this frame anyway): every cell whose
    // frame starts on the screen gets its body now, the others while the browser is idle.
    afterNextRender(
      () => {
        if (this.destroyRef.destroyed) return done();
        const onScreen = this.undrawnOnScreen();
        for (const frame of Array.from(this.host.nativeElement.querySelectorAll<HTMLElement>('lam-cell-frame'))) watch?.observe(frame);
        if (onScreen.length === 0) return idle(step);
        this.draw(onScreen);
        afterNextRender(() => idle(step), { injector: this.injector });
      },
      { injector: this.injector },
    );
  }

  /** The cells whose frames are (partly) inside the window and whose bodies are not drawn, from the top. */
  private undrawnOnScreen(): string[] {
    const bottom = typeof window === 'undefined' ? 0 : window.innerHeight;
    const drawn = this.drawn();
    const ids: string[] = [];
    for (const frame of Array.from(this.host.nativeElement.querySelectorAll<HTMLElement>('lam-cell-frame'))) {
      const id = frame.dataset['cellId'];
      if (!id || drawn.has(id)) continue;
      const rect = frame.getBoundingClientRect();
      if (rect.top < bottom && rect.bottom > 0) ids.push(id);
    }
    return ids;
  }

  private draw(cellIds: Iterable<string>): void {
    const next = new Set(this.drawn());
    for (const id of cellIds) next.add(id);
    if (next.size !== this.drawn().size) this.drawn.set(next);
  }

  // ── Cell actions ─────────────────────────────────────────────────────────────────────────────

  /** Draws the bodies of every cell down to this one. */
  private drawDownTo(cellId: string): void {
    const index = this.cells().findIndex((cell) => cell.cellId === cellId);
    this.draw(this.cells().slice(0, index + 1).map((cell) => cell.cellId));
  }

  protected add(kind: CellKind, index: number): void {
    const cellId = this.session.add(kind, index);
    this.announcer.announce(`${cellKindInfo(kind).label} cell added at position ${index + 1}`);
    this.focusCell(cellId, 'input, textarea, select, [tabindex="0"]');
  }

  protected duplicate(cellId: string): void {
    const copy = this.session.duplicate(cellId);
    if (copy) this.focusCell(copy);
  }

  protected move(cellId: string, delta: -1 | 1): void {
    if (!this.session.move(cellId, delta)) return;
    const index = this.cells().findIndex((cell) => cell.cellId === cellId);
    this.announcer.announce(`Moved to position ${index + 1} of ${this.cells().length}`);
    this.focusCell(cellId);
  }

  protected remove(cellId: string): void {
    const index = this.cells().findIndex((cell) => cell.cellId === cellId);
    const title = this.session.cell(cellId)?.title ?? 'Cell';
    this.session.remove(cellId);
    this.announcer.announce(`${title} removed; it can be brought back from Recently removed`);
    const next = this.cells()[Math.min(index, this.cells().length - 1)];
    if (next) this.focusCell(next.cellId);
  }

  protected restore(cellId: string): void {
    this.session.restore(cellId);
    this.focusCell(cellId);
  }

  protected dropped(event: CdkDragDrop<unknown>): void {
    this.session.moveTo(event.previousIndex, event.currentIndex);
  }

  protected run(cellId: string): void {
    void this.session.run([cellId]);
  }

  protected runStudy(): void {
    void this.session.run();
  }

  protected showShortcuts(): void {
    openLazyBottomSheet(this.injector, () => import('./shortcuts').then((m) => m.Shortcuts), { ariaLabel: 'Keyboard shortcuts' }).catch(() =>
      this.notifier.problem(DIALOG_NOT_LOADED),
    );
  }

  protected showConflict(): void {
    const conflict = this.session.conflict();
    if (!conflict || this.conflictRef) return;
    this.conflictRef = openLazyDialog<ConflictDialog, typeof conflict, ConflictChoice>(this.injector, () => import('./conflict-dialog').then((m) => m.ConflictDialog), {
      data: conflict,
      disableClose: true,
      width: '44rem',
      maxWidth: '95vw',
    });
    this.conflictRef.then(
      (ref) =>
        ref.afterClosed().subscribe((choice) => {
          this.conflictRef = null;
          if (choice === 'mine') this.session.keepMine();
          else if (choice === 'theirs') this.session.takeTheirs();
        }),
      () => {
        // The save indicator still offers to resolve the conflict: that tries again.
        this.conflictRef = null;
        this.notifier.problem(DIALOG_NOT_LOADED);
      },
    );
  }

  // ── Keyboard ─────────────────────────────────────────────────────────────────────────────────

  /** The cell the focus is in, if any. */
  private activeCellId(target: EventTarget | null): string | null {
    const element = target instanceof Element ? target : null;
    const frame = element?.closest<HTMLElement>('lam-cell-frame[data-cell-id]');
    return frame && this.host.nativeElement.contains(frame) ? frame.dataset['cellId'] ?? null : null;
  }

  protected onKeydown(event: KeyboardEvent): void {
    if (!this.opened() || this.conflictRef) return;
    const mod = event.ctrlKey || event.metaKey;
    const cellId = this.activeCellId(event.target);

    if (event.key === '?' && !mod && !event.altKey && !isTextEntry(event.target)) {
      event.preventDefault();
      this.showShortcuts();
      return;
    }
    if (mod && !event.altKey && (event.key === 's' || event.key === 'S') && !event.shiftKey) {
      event.preventDefault();
      void this.session.flush();
      return;
    }
    if (mod && event.key === 'Enter' && !event.altKey) {
      if (!this.mayRun()) return;
      event.preventDefault();
      if (event.shiftKey) this.runStudy();
      else if (cellId && cellKindInfo(this.session.cell(cellId)!.kind).runs) this.run(cellId);
      return;
    }
    if (!event.altKey || mod || !cellId) return;
    if (event.key === 'Enter' && !event.shiftKey && this.editable()) {
      event.preventDefault();
      this.openAddBelow(cellId);
    } else if ((event.key === 'ArrowUp' || event.key === 'ArrowDown') && event.shiftKey && this.editable()) {
      event.preventDefault();
      this.move(cellId, event.key === 'ArrowUp' ? -1 : 1);
    } else if ((event.key === 'ArrowUp' || event.key === 'ArrowDown') && !event.shiftKey) {
      event.preventDefault();
      const index = this.cells().findIndex((cell) => cell.cellId === cellId);
      const next = this.cells()[index + (event.key === 'ArrowUp' ? -1 : 1)];
      if (next) this.focusCell(next.cellId);
    }
  }

  /**
   * Edits not yet saved hold the page (the browser asks) and are sent at once. A plain listener, not a
   * host one: Angular checks the page after each of its own listeners, and that check of every cell
   * (9 ms in a traced reload of the 20-cell bench study) ran on each reload and way out, on the thread the
   * next page needs.
   */
  private readonly onBeforeUnload = (event: BeforeUnloadEvent): void => {
    if (this.session.dirty()) {
      void this.session.flush();
      event.preventDefault();
    }
  };

  /** Opens the add-cell list just below a cell (the insertion line after it, or the end button). */
  private openAddBelow(cellId: string): void {
    const index = this.cells().findIndex((cell) => cell.cellId === cellId);
    // A cell not drawn yet has no insertion line below it: drawn, it gets one.
    this.drawDownTo(cellId);
    afterNextRender(() => this.addControls().find((c) => c.index() === index + 1)?.open(), { injector: this.injector });
  }

  /** Puts the focus in a cell once it is on screen: on its first field, or on the frame itself. */
  private focusCell(cellId: string, inside?: string): void {
    this.drawDownTo(cellId);
    afterNextRender(
      () => {
        const frame = this.host.nativeElement.querySelector<HTMLElement>(`lam-cell-frame[data-cell-id="${cellId}"]`);
        const target = (inside ? frame?.querySelector<HTMLElement>(`.body ${inside.split(', ').join(', .body ')}`) : null) ?? frame?.querySelector<HTMLElement>('.frame');
        target?.focus();
        frame?.scrollIntoView?.({ block: 'nearest' });
      },
      { injector: this.injector },
    );
  }
}
