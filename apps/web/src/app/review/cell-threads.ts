import { ChangeDetectionStrategy, Component, ElementRef, computed, effect, inject, input, signal, untracked, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute } from '@angular/router';
import type { PlotAnchor } from '@laminote/contracts';
import { Notifier } from '../core/notifier';
import { UnreadCount } from '../inbox/unread-count';
import { DraftSession } from '../shared/draft-session';
import { roleLabel } from '../shared/role-label';
import { AnchorStrip } from './anchor-strip';
import { cellReviewContext } from './cell-review-context';
import { CommentBox } from './comment-box';
import { CommentThread } from './comment-thread';
import { ReviewApi } from './review-api';
import { ThreadStore } from './thread-store';

/** Surface names of a cell's last result (an analysis or a pressure table), for anchoring a comment. */
export function resultSurfaces(result: unknown): string[] {
  const surfaces = (result as { surfaces?: unknown } | null)?.surfaces;
  if (!Array.isArray(surfaces)) return [];
  return surfaces.map((s) => (s as { name?: unknown }).name).filter((n): n is string => typeof n === 'string' && n.length > 0);
}

/**
 * A cell's comment threads, below the cell when opened from its head: the threads (open first), the
 * places on the plot they point at, and a box to start a thread, optionally at an x/c on a surface.
 * Opens by itself, scrolled into view, when the page was reached by a link to this cell (?cell=…).
 */
@Component({
  selector: 'lam-cell-threads',
  imports: [
    AnchorStrip,
    CommentBox,
    CommentThread,
    FormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
  ],
  templateUrl: './cell-threads.html',
  styleUrl: './cell-threads.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[class.open]': 'open()' },
})
export class CellThreads {
  private readonly store = inject(ThreadStore);
  private readonly api = inject(ReviewApi);
  private readonly notifier = inject(Notifier);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly session = inject(DraftSession, { optional: true });
  private readonly route = inject(ActivatedRoute, { optional: true });
  private readonly unread = inject(UnreadCount);

  readonly cellId = input.required<string>();
  readonly studyId = input<string | undefined>(undefined);
  readonly versionId = input<string | undefined>(undefined);
  readonly branchId = input<string | undefined>(undefined);
  /** Surfaces a comment can point at; by default those of the cell's result. */
  readonly surfaces = input<readonly string[] | undefined>(undefined);
  /** The cell's result where it is not in the notebook's draft (a saved version's stored output). */
  readonly result = input<unknown>(undefined);

  private readonly newBox = viewChild<CommentBox>('newBox');

  protected readonly review = cellReviewContext({ cellId: this.cellId, studyId: this.studyId, versionId: this.versionId, branchId: this.branchId });
  protected readonly open = computed(() => this.store.openCellIds().has(this.cellId()));
  protected readonly resolvedCount = computed(() => this.review.threads().length - this.review.openCount());
  /** Resolved threads stay folded away until asked for (a thread a link points at is always shown). */
  protected readonly showResolved = signal(false);
  protected readonly shownThreads = computed(() =>
    this.showResolved() ? this.review.threads() : this.review.threads().filter((t) => !t.resolved || t.id === this.linkedThread()),
  );
  protected readonly hiddenResolved = computed(() => this.review.threads().length - this.shownThreads().length);
  protected readonly readOnlyNote = computed(() => {
    const access = this.review.access();
    return access && !this.review.canComment() ? `You read these comments as ${roleLabel(access.role, access.siteAdmin).toLowerCase()}.` : null;
  });
  protected readonly surfaceChoices = computed(() => {
    const given = this.surfaces();
    if (given?.length) return given;
    const cell = this.session?.cells().find((c) => c.cellId === this.cellId());
    const found = resultSurfaces(this.result() ?? cell?.output?.result ?? cell?.lastGoodOutput?.result ?? null);
    return found.length ? found : ['upper', 'lower'];
  });

  protected readonly anchoring = signal(false);
  protected readonly anchorSurface = signal('upper');
  protected readonly anchorX = signal<number | null>(null);
  protected readonly anchorError = computed(() => {
    if (!this.anchoring()) return null;
    const x = this.anchorX();
    return x === null || !Number.isFinite(x) || x < 0 || x > 1 ? 'x/c is a number from 0 to 1' : null;
  });
  protected readonly busy = signal(false);

  private readonly query = this.route ? toSignal(this.route.queryParamMap, { initialValue: this.route.snapshot.queryParamMap }) : signal(null);
  /** The thread a link pointed at (?thread=…), to show and outline. */
  protected readonly linkedThread = computed(() => (this.query()?.get('cell') === this.cellId() ? this.query()?.get('thread') ?? null : null));
  private scrolledFor: string | null = null;

  constructor() {
    effect(() => {
      const linkedCell = this.query()?.get('cell');
      const cellId = this.cellId();
      if (linkedCell !== cellId || this.review.loading()) return;
      const threads = this.review.threads();
      untracked(() => {
        const key = `${cellId}|${this.linkedThread() ?? ''}|${threads.length > 0}`;
        if (this.scrolledFor === key) return;
        this.scrolledFor = key;
        this.store.setOpen(cellId, true);
        const linked = this.linkedThread();
        if (linked && threads.some((t) => t.id === linked)) this.unread.readAbout({ threadId: linked });
        // After the threads are on screen: bring the cell (and the linked thread) into view.
        setTimeout(() => {
          const thread = this.linkedThread() ? this.host.nativeElement.querySelector<HTMLElement>(`[data-thread-id="${this.linkedThread()}"]`) : null;
          const target = thread ?? this.host.nativeElement.closest<HTMLElement>('lam-cell-frame') ?? this.host.nativeElement;
          target.scrollIntoView?.({ block: thread ? 'center' : 'start' });
        }, 50);
      });
    });
    // Opened from the cell's head, the panel appears below the cell's body: on a tall cell that is
    // off-screen, so bring it into view (a link to a thread scrolls to the thread instead, above).
    let wasOpen = false;
    effect(() => {
      const open = this.open();
      if (open && !wasOpen) {
        setTimeout(() => {
          if (this.query()?.get('cell') === untracked(this.cellId)) return;
          // These run after a timeout, which may come after the component (or a test's page without layout) is gone.
          this.host.nativeElement.querySelector<HTMLElement>('.panel')?.scrollIntoView?.({ block: 'nearest', behavior: 'smooth' });
        });
      }
      wasOpen = open;
    });
    effect(() => {
      const choices = this.surfaceChoices();
      if (!choices.includes(untracked(this.anchorSurface))) this.anchorSurface.set(choices[0] ?? 'upper');
    });
  }

  /** Unresolved threads that point at the plot, shown beside it while the comments are closed. */
  protected readonly anchoredOpen = computed(() => this.review.threads().filter((t) => t.anchor && !t.resolved));

  protected openAt(threadId: string): void {
    this.store.setOpen(this.cellId(), true);
    setTimeout(() => this.host.nativeElement.querySelector<HTMLElement>(`[data-thread-id="${threadId}"]`)?.scrollIntoView?.({ block: 'center' }));
  }

  protected close(): void {
    this.store.setOpen(this.cellId(), false);
  }

  protected start(body: string): void {
    const studyId = this.review.studyId();
    const view = this.review.view();
    if (!studyId || !view || this.anchorError()) return;
    const anchor: PlotAnchor | null = this.anchoring() ? { surface: this.anchorSurface(), x: this.anchorX()! } : null;
    this.busy.set(true);
    this.api
      .startThread(
        studyId,
        { cellId: this.cellId(), versionId: 'versionId' in view ? view.versionId : null, ...('branchId' in view ? { branchId: view.branchId } : {}), body, anchor },
        view,
      )
      .subscribe({
        next: (thread) => {
          this.store.put(studyId, view, thread);
          this.busy.set(false);
          this.newBox()?.clear();
          this.anchoring.set(false);
          this.anchorX.set(null);
        },
        error: (error: unknown) => {
          this.busy.set(false);
          this.notifier.problem(error);
        },
      });
  }
}
