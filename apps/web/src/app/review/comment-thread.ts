import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, linkedSignal, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { CommentRevision, Member, Thread } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { Notifier } from '../core/notifier';
import { CommentBody } from './comment-body';
import { CommentBox } from './comment-box';
import { ReviewApi, type ReviewView } from './review-api';
import { ThreadStore } from './thread-store';

/** Where a thread was started, as the thread's head says it. */
export function originLabel(thread: Thread): string {
  const o = thread.origin;
  const branch = o.branchName ? ` (${o.branchName})` : '';
  return o.versionId ? `On version ${o.versionNumber ?? '?'}${branch}` : `On the draft${branch}`;
}

/**
 * One thread: where it was started and whether the cell changed since, its comments (each with its
 * earlier texts when edited), a reply box, and resolve / reopen for those allowed.
 */
@Component({
  selector: 'lam-comment-thread',
  imports: [CommentBody, CommentBox, DatePipe, MatButtonModule, MatIconModule, MatTooltipModule],
  templateUrl: './comment-thread.html',
  styleUrl: './comment-thread.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[attr.data-thread-id]': 'thread().id', '[class.resolved]': 'thread().resolved', '[class.highlighted]': 'highlighted()' },
})
export class CommentThread {
  private readonly api = inject(ReviewApi);
  private readonly store = inject(ThreadStore);
  private readonly notifier = inject(Notifier);

  readonly thread = input.required<Thread>();
  readonly studyId = input.required<string>();
  readonly view = input.required<ReviewView>();
  readonly members = input<readonly Member[]>([]);
  readonly canComment = input(false);
  readonly highlighted = input(false);

  private readonly replyBox = viewChild<CommentBox>('replyBox');
  private readonly editBox = viewChild<CommentBox>('editBox');

  protected readonly origin = computed(() => originLabel(this.thread()));
  protected readonly people = computed(() => this.members().map((m) => m.name));
  /** A resolved thread shows only its first comment until opened. */
  protected readonly expanded = linkedSignal(() => !this.thread().resolved || this.highlighted());
  protected readonly shown = computed(() => (this.expanded() ? this.thread().comments : this.thread().comments.slice(0, 1)));
  protected readonly replying = signal(false);
  protected readonly editing = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly history = signal<{ commentId: string; revisions: CommentRevision[] } | null>(null);

  protected toggleReply(): void {
    this.replying.update((v) => !v);
    if (this.replying()) setTimeout(() => this.replyBox()?.focus());
  }

  private send(request: Observable<Thread>, done: () => void, success?: string): void {
    this.busy.set(true);
    request.subscribe({
      next: (thread) => {
        this.store.put(this.studyId(), this.view(), thread);
        this.busy.set(false);
        done();
        if (success) this.notifier.done(success);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.notifier.problem(error);
      },
    });
  }

  protected reply(body: string): void {
    this.send(this.api.reply(this.thread().id, body, this.view()), () => {
      this.replyBox()?.clear();
      this.replying.set(false);
    });
  }

  protected saveEdit(commentId: string, body: string): void {
    this.send(this.api.editComment(commentId, body, this.view()), () => {
      this.editBox()?.clear();
      this.editing.set(null);
      if (this.history()?.commentId === commentId) this.history.set(null);
    });
  }

  protected setResolved(resolved: boolean): void {
    this.send(this.api.setResolved(this.thread().id, resolved, this.view()), () => undefined, resolved ? 'Thread resolved' : 'Thread reopened');
  }

  protected toggleHistory(commentId: string): void {
    if (this.history()?.commentId === commentId) {
      this.history.set(null);
      return;
    }
    this.api.revisions(commentId).subscribe({
      next: (revisions) => this.history.set({ commentId, revisions }),
      error: (error: unknown) => this.notifier.problem(error),
    });
  }
}
