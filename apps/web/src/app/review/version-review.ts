import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { VERDICTS, type VerdictKind, type VersionReviewDetail } from '@laminote/contracts';
import { Notifier } from '../core/notifier';
import { UnreadCount } from '../inbox/unread-count';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { CommentBody } from './comment-body';
import { ReviewApi } from './review-api';
import { ReviewStateTag } from './review-state';
import { SendForReviewDialog, type SendForReviewData } from './send-for-review-dialog';
import { ThreadStore } from './thread-store';
import { VERDICT_WORDS, verdictPast } from './verdict-words';

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
  private readonly dialog = inject(MatDialog);

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
  protected readonly past = verdictPast;
  protected readonly verdictWords = VERDICT_WORDS;
  protected readonly verdictKinds = VERDICTS;

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

  /** Sends the version for review from the dialog the version bar and the save step use too. */
  protected sendForReview(review: VersionReviewDetail): void {
    const data: SendForReviewData = { studyId: this.studyId(), versionId: this.versionId(), versionNumber: review.summary.versionNumber, branchName: this.branchName() ?? '' };
    this.dialog
      .open<SendForReviewDialog, SendForReviewData, VersionReviewDetail>(SendForReviewDialog, { data, width: '34rem', maxWidth: '94vw' })
      .afterClosed()
      .subscribe((answer) => {
        if (answer) this.answered.set(answer);
      });
  }

  protected giveVerdict(): void {
    const verdict = this.verdict();
    if (!verdict || !this.summaryText().trim()) return;
    this.busy.set(true);
    this.api.giveVerdict(this.versionId(), { verdict, summary: this.summaryText() }).subscribe({
      next: (review) => {
        this.done(review, `Verdict recorded: ${VERDICT_WORDS[verdict].past}`);
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
