import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { Inbox, Notification, NotificationKind } from '@laminote/contracts';
import { Auth } from '../core/auth';
import { Notifier } from '../core/notifier';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { InboxApi } from './inbox-api';
import { NotificationSettings } from './notification-settings';
import { UnreadCount } from './unread-count';

export const KIND_ICONS: Record<NotificationKind, string> = {
  mention: 'alternate_email',
  reviewRequest: 'rate_review',
  reply: 'reply',
  verdict: 'verified',
};

const KIND_WORDS: Record<NotificationKind, string> = {
  mention: 'Mention',
  reviewRequest: 'Review request',
  reply: 'Reply',
  verdict: 'Verdict',
};

/**
 * The signed-in person's inbox: mentions, review requests, replies to their threads and verdicts on
 * their versions, newest first; opening one goes straight to the cell or version and marks it read.
 */
@Component({
  selector: 'lam-inbox-page',
  imports: [DatePipe, MatButtonModule, MatButtonToggleModule, MatIconModule, MatProgressBarModule, NotificationSettings, ProblemBanner, RouterLink],
  templateUrl: './inbox-page.html',
  styleUrl: './inbox-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InboxPage {
  private readonly api = inject(InboxApi);
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  private readonly unread = inject(UnreadCount);
  /** Site admins also reach the development mail page from here (it exists outside production only). */
  private readonly auth = inject(Auth);
  protected readonly siteAdmin = computed(() => this.auth.me()?.user.siteAdmin ?? false);

  /** `?settings=1` (the link in every e-mail) scrolls to the notification settings. */
  readonly settings = input<string | undefined>(undefined);

  protected readonly filter = signal<'all' | 'unread'>('all');
  private readonly inboxLoad = loader(this.filter, (filter) => this.api.list({ unreadOnly: filter === 'unread' }));
  protected readonly state = this.inboxLoad.state;
  /** Entries marked read on this page before the list was asked again. */
  private readonly readHere = signal<ReadonlySet<string>>(new Set());
  protected readonly items = computed(() => (this.state().value?.items ?? []).map((n) => (this.readHere().has(n.id) ? { ...n, read: true } : n)));
  protected readonly unreadCount = computed(() => this.items().filter((n) => !n.read).length);
  protected readonly icons = KIND_ICONS;
  protected readonly words = KIND_WORDS;

  constructor() {
    effect(() => {
      const inbox: Inbox | undefined = this.state().value;
      if (inbox) this.unread.set(inbox.unreadCount);
    });
    effect(() => {
      if (this.settings()) setTimeout(() => document.getElementById('notification-settings')?.scrollIntoView({ block: 'start' }));
    });
  }

  protected retry(): void {
    this.inboxLoad.reload();
  }

  protected open(event: MouseEvent, item: Notification): void {
    // A new tab or window follows the link as it is; here the app navigates and marks the entry read.
    if (event.button !== 0 || event.ctrlKey || event.metaKey || event.shiftKey) return;
    event.preventDefault();
    this.markRead(item);
    void this.router.navigateByUrl(item.link);
  }

  protected markRead(item: Notification): void {
    if (item.read) return;
    this.readHere.update((set) => new Set([...set, item.id]));
    this.api.markRead(item.id).subscribe({ next: ({ unreadCount }) => this.unread.set(unreadCount), error: (error: unknown) => this.notifier.problem(error) });
  }

  protected markAllRead(): void {
    this.api.markAllRead().subscribe({
      next: ({ unreadCount }) => {
        this.readHere.set(new Set(this.items().map((n) => n.id)));
        this.unread.set(unreadCount);
      },
      error: (error: unknown) => this.notifier.problem(error),
    });
  }
}
