import { Injectable, type Signal, type WritableSignal, inject, signal } from '@angular/core';
import type { Member, Problem, Study, StudyReview, Thread } from '@laminote/contracts';
import { catchError, shareReplay, switchMap, throwError, type Observable } from 'rxjs';
import { toProblem } from '../core/problem';
import { ProjectApi } from '../shared/project-api';
import { StudyApi } from '../shared/study-api';
import { ReviewApi, type ReviewView, viewKey } from './review-api';

interface Entry {
  readonly threads: WritableSignal<readonly Thread[]>;
  readonly loading: WritableSignal<boolean>;
  readonly problem: WritableSignal<Problem | null>;
  loadedAt: number;
}

/** A study's threads as seen from one view, shared by every cell of the page (one request for all). */
export interface ThreadsOfView {
  readonly threads: Signal<readonly Thread[]>;
  readonly loading: Signal<boolean>;
  readonly problem: Signal<Problem | null>;
}

const FRESH_MS = 15_000;

/**
 * The page's review state: threads per study and view, which cells have their threads open, and the
 * people who can be mentioned in a study's project.
 */
@Injectable({ providedIn: 'root' })
export class ThreadStore {
  private readonly api = inject(ReviewApi);
  private readonly studies = inject(StudyApi);
  private readonly projects = inject(ProjectApi);

  private readonly entries = new Map<string, Entry>();
  private readonly openCells = signal<ReadonlySet<string>>(new Set());
  private readonly memberLists = new Map<string, Observable<Member[]>>();
  private readonly studyInfo = new Map<string, Observable<Study>>();
  private readonly studyReviews = new Map<string, Observable<StudyReview>>();

  /** The threads of a study from a view; loads them the first time (and again when they are old). */
  view(studyId: string, view: ReviewView): ThreadsOfView {
    const key = viewKey(studyId, view);
    let entry = this.entries.get(key);
    if (!entry) {
      entry = { threads: signal<readonly Thread[]>([]), loading: signal(false), problem: signal<Problem | null>(null), loadedAt: 0 };
      this.entries.set(key, entry);
    }
    if (!entry.loading() && Date.now() - entry.loadedAt > FRESH_MS) this.load(studyId, view, entry);
    return { threads: entry.threads.asReadonly(), loading: entry.loading.asReadonly(), problem: entry.problem.asReadonly() };
  }

  reload(studyId: string, view: ReviewView): void {
    const entry = this.entries.get(viewKey(studyId, view));
    if (entry) this.load(studyId, view, entry);
  }

  private load(studyId: string, view: ReviewView, entry: Entry): void {
    entry.loading.set(true);
    this.api.threads(studyId, view).subscribe({
      next: (threads) => {
        entry.threads.set(threads);
        entry.problem.set(null);
        entry.loading.set(false);
        entry.loadedAt = Date.now();
      },
      error: (error: unknown) => {
        entry.problem.set(toProblem(error));
        entry.loading.set(false);
      },
    });
  }

  /** Puts a thread the server just answered with in place (or adds it). */
  put(studyId: string, view: ReviewView, thread: Thread): void {
    const entry = this.entries.get(viewKey(studyId, view));
    if (!entry) return;
    entry.threads.update((list) => (list.some((t) => t.id === thread.id) ? list.map((t) => (t.id === thread.id ? thread : t)) : [...list, thread]));
  }

  /** The cells whose threads are open on the page. */
  readonly openCellIds: Signal<ReadonlySet<string>> = this.openCells.asReadonly();

  setOpen(cellId: string, open: boolean): void {
    this.openCells.update((set) => {
      const next = new Set(set);
      if (open) next.add(cellId);
      else next.delete(cellId);
      return next;
    });
  }

  /** The study (for its project), asked once per study. */
  study(studyId: string): Observable<Study> {
    return this.cached(this.studyInfo, studyId, () => this.studies.get(studyId));
  }

  /** Every version's review summary of a study, asked once until `forgetReview` (after a request or verdict). */
  studyReview(studyId: string): Observable<StudyReview> {
    return this.cached(this.studyReviews, studyId, () => this.api.studyReview(studyId));
  }

  forgetReview(studyId: string): void {
    this.studyReviews.delete(studyId);
  }

  /** The members of the study's project, for @-mentions (asked once per study). */
  members(studyId: string): Observable<Member[]> {
    return this.cached(this.memberLists, studyId, () => this.study(studyId).pipe(switchMap((study) => this.projects.members(study.projectId))));
  }

  private cached<T>(cache: Map<string, Observable<T>>, key: string, make: () => Observable<T>): Observable<T> {
    let list = cache.get(key);
    if (!list) {
      list = make().pipe(
        // A failed request is asked again next time.
        catchError((error: unknown) => {
          cache.delete(key);
          return throwError(() => error);
        }),
        shareReplay({ bufferSize: 1, refCount: false }),
      );
      cache.set(key, list);
    }
    return list;
  }
}
