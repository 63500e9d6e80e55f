import { DestroyRef, Injectable, inject, signal } from '@angular/core';
import type { ReadAbout } from '@laminote/contracts';
import { Auth } from '../core/auth';
import { InboxApi } from './inbox-api';

const POLL_MS = 60_000;

/**
 * How many inbox entries the signed-in person has not read, for the top bar: asked at start, every
 * minute while the tab is visible, and set directly whenever the inbox page marks something read.
 */
@Injectable({ providedIn: 'root' })
export class UnreadCount {
  private readonly api = inject(InboxApi);
  private readonly auth = inject(Auth);
  private readonly count = signal(0);
  private timer: ReturnType<typeof setInterval> | null = null;

  readonly value = this.count.asReadonly();

  constructor() {
    inject(DestroyRef).onDestroy(() => this.stop());
  }

  start(): void {
    if (this.timer) return;
    this.refresh();
    this.timer = setInterval(() => {
      if (typeof document === 'undefined' || document.visibilityState === 'visible') this.refresh();
    }, POLL_MS);
  }

  stop(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
  }

  refresh(): void {
    if (!this.auth.signedIn()) return;
    // The count is a hint in the top bar; a failed poll keeps the last one and tries again later.
    this.api.unreadCount().subscribe({ next: ({ unreadCount }) => this.count.set(unreadCount), error: () => undefined });
  }

  /** The person opened a thread or a version: what their inbox holds about it is read now. */
  readAbout(about: ReadAbout): void {
    if (!this.auth.signedIn()) return;
    this.api.markReadAbout(about).subscribe({ next: ({ unreadCount }) => this.count.set(unreadCount), error: () => undefined });
  }

  set(count: number): void {
    this.count.set(count);
  }
}
