import { type Signal, computed, effect, inject, signal, untracked } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute } from '@angular/router';
import type { Member, ProjectAccess, Thread } from '@laminote/contracts';
import { can } from '@laminote/contracts/access';
import { catchError, of, switchMap } from 'rxjs';
import { Auth } from '../core/auth';
import { DraftSession } from '../shared/draft-session';
import type { ReviewView } from './review-api';
import { ThreadStore, type ThreadsOfView } from './thread-store';

/** What a cell's review parts need to know, from their inputs or else from the notebook around them. */
export interface CellReviewInputs {
  readonly cellId: () => string;
  readonly studyId: () => string | undefined;
  /** Set when the cell is shown as it is in a saved version; else the notebook's draft is the view. */
  readonly versionId: () => string | undefined;
  readonly branchId: () => string | undefined;
}

export interface CellReviewContext {
  readonly studyId: Signal<string | null>;
  readonly view: Signal<ReviewView | null>;
  /** This cell's threads, unresolved first, then resolved, each oldest first. */
  readonly threads: Signal<readonly Thread[]>;
  readonly openCount: Signal<number>;
  readonly loading: Signal<boolean>;
  readonly access: Signal<ProjectAccess | null>;
  readonly canComment: Signal<boolean>;
  readonly members: Signal<readonly Member[]>;
}

/**
 * Works out the study and view of a cell (inputs first; else the notebook page's draft session and the
 * route), and follows the study's threads for that view through the shared store. Call in an
 * injection context.
 */
export function cellReviewContext(inputs: CellReviewInputs): CellReviewContext {
  const store = inject(ThreadStore);
  const auth = inject(Auth);
  const session = inject(DraftSession, { optional: true });
  const route = inject(ActivatedRoute, { optional: true });
  const routeStudy = route ? toSignal(route.paramMap, { initialValue: route.snapshot.paramMap }) : signal(null);

  const studyId = computed(() => inputs.studyId() ?? session?.draft()?.studyId ?? routeStudy()?.get('studyId') ?? null);
  const view = computed((): ReviewView | null => {
    const versionId = inputs.versionId();
    if (versionId) return { versionId };
    const branchId = inputs.branchId() ?? session?.draft()?.branchId;
    return branchId ? { branchId } : null;
  });

  const source = signal<ThreadsOfView | null>(null);
  effect(() => {
    const s = studyId();
    const v = view();
    untracked(() => source.set(s && v ? store.view(s, v) : null));
  });
  const threads = computed(() => {
    const cellId = inputs.cellId();
    const all = source()?.threads() ?? [];
    const mine = all.filter((t) => t.cellId === cellId);
    return [...mine.filter((t) => !t.resolved), ...mine.filter((t) => t.resolved)];
  });

  const study$ = toObservable(studyId).pipe(switchMap((id) => (id ? store.study(id).pipe(catchError(() => of(null))) : of(null))));
  const study = toSignal(study$, { initialValue: null });
  const access = computed((): ProjectAccess | null => {
    const me = auth.me();
    const s = study();
    if (!me || !s) return null;
    return { role: me.memberships.find((m) => m.projectId === s.projectId)?.role ?? null, siteAdmin: me.user.siteAdmin };
  });
  const members$ = toObservable(studyId).pipe(switchMap((id) => (id ? store.members(id).pipe(catchError(() => of([] as Member[]))) : of([] as Member[]))));

  return {
    studyId,
    view,
    threads,
    openCount: computed(() => threads().filter((t) => !t.resolved).length),
    loading: computed(() => source()?.loading() ?? false),
    access,
    canComment: computed(() => {
      const a = access();
      return a !== null && can(a, 'comment');
    }),
    members: toSignal(members$, { initialValue: [] as Member[] }),
  };
}
