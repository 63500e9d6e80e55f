import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { REVIEW_STATE_LABELS, VERDICT_LABELS, type Member, type VerdictKind, type VersionReviewDetail } from '@laminote/contracts';
import { catchError, of, switchMap } from 'rxjs';
import { Notifier } from '../core/notifier';
import { UnreadCount } from '../inbox/unread-count';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { CommentBody } from './comment-body';
import { ReviewApi } from './review-api';
import { ReviewStateTag } from './review-state';
import { ThreadStore } from './thread-store';

/**
 * The review of one version: its state, who was asked and who answered, every verdict (the newest of
 * each reviewer counts), and, for those allowed, asking named reviewers or giving a verdict.
 */
@Component({
  selector: 'lam-version-review',
  imports: [
    CommentBody,
    DatePipe,
    FormsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ProblemBanner,
    ReviewStateTag,
  ],
  templateUrl: './version-review.html',
  styleUrl: './version-review.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VersionReview {
  private readonly api = inject(ReviewApi);
  private readonly store = inject(ThreadStore);
  private readonly notifier = inject(Notifier);
  private readonly unread = inject(UnreadCount);

  readonly versionId = input.required<string>();
  readonly studyId = input.required<string>();
  readonly branchName = input<string | null>(null);

  private readonly load = loader(this.versionId, (id) => this.api.versionReview(id));
  protected readonly state = this.load.state;
  private readonly answered = signal<VersionReviewDetail | null>(null);
  /** The newest answer: what the server said after a request or verdict from here, else the load. */
  protected readonly review = computed(() => {
    const loaded = this.state().value;
    const mine = this.answered();
    return mine && mine.summary.versionId === this.versionId() ? mine : (loaded ?? null);
  });
  protected readonly stateLabels = REVIEW_STATE_LABELS;
  protected readonly verdictLabels = VERDICT_LABELS;

  private readonly members = toSignal(
    toObservable(this.studyId).pipe(switchMap((id) => this.store.members(id).pipe(catchError(() => of([] as Member[]))))),
    { initialValue: [] as Member[] },
  );
  protected readonly reviewers = computed(() => this.members().filter((m) => m.role === 'reviewer'));

  protected readonly asking = signal(false);
  protected readonly chosenReviewers = signal<string[]>([]);
  protected readonly requestMessage = signal('');
  protected readonly verdict = signal<VerdictKind | null>(null);
  protected readonly summaryText = signal('');
  protected readonly busy = signal(false);

  constructor() {
    // Opening a version's review reads what the inbox holds about it (requests, verdicts).
    effect(() => {
      const id = this.state().value?.summary.versionId;
      if (id) untracked(() => this.unread.readAbout({ versionId: id }));
    });
  }

  protected retry(): void {
    this.load.reload();
  }

  private done(review: VersionReviewDetail, message: string): void {
    this.answered.set(review);
    this.store.forgetReview(this.studyId());
    this.busy.set(false);
    this.notifier.done(message);
  }

  protected requestReview(): void {
    const reviewerIds = this.chosenReviewers();
    if (reviewerIds.length === 0) return;
    this.busy.set(true);
    this.api.requestReview(this.versionId(), { reviewerIds, message: this.requestMessage() }).subscribe({
      next: (review) => {
        this.done(review, reviewerIds.length === 1 ? 'Review requested; the reviewer was notified' : 'Review requested; the reviewers were notified');
        this.asking.set(false);
        this.chosenReviewers.set([]);
        this.requestMessage.set('');
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.notifier.problem(error);
      },
    });
  }

  protected giveVerdict(): void {
    const verdict = this.verdict();
    if (!verdict || !this.summaryText().trim()) return;
    this.busy.set(true);
    this.api.giveVerdict(this.versionId(), { verdict, summary: this.summaryText() }).subscribe({
      next: (review) => {
        this.done(review, `Verdict recorded: ${VERDICT_LABELS[verdict].toLowerCase()}`);
        this.verdict.set(null);
        this.summaryText.set('');
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.notifier.problem(error);
      },
    });
  }
}
