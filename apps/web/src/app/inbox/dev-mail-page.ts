import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { SinkMessage } from '@laminote/contracts';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { InboxApi } from './inbox-api';

/** A message's text cut into plain runs and web addresses, so the addresses can be followed. */
export function linkify(text: string): { text: string; href: string | null }[] {
  const parts: { text: string; href: string | null }[] = [];
  let last = 0;
  for (const match of text.matchAll(/https?:\/\/[^\s<>"]+/g)) {
    if (match.index > last) parts.push({ text: text.slice(last, match.index), href: null });
    parts.push({ text: match[0], href: match[0] });
    last = match.index + match[0].length;
  }
  if (last < text.length) parts.push({ text: text.slice(last), href: null });
  return parts;
}

/**
 * For site admins outside production: the mail the development SMTP sink received (nothing is
 * delivered anywhere), newest first, as plain text with working links.
 */
@Component({
  selector: 'lam-dev-mail-page',
  imports: [DatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, ProblemBanner],
  templateUrl: './dev-mail-page.html',
  styleUrl: './dev-mail-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DevMailPage {
  private readonly api = inject(InboxApi);
  private readonly mailLoad = loader(
    () => null,
    () => this.api.devMail(),
  );
  protected readonly state = this.mailLoad.state;
  protected readonly notFound = computed(() => this.state().problem?.status === 404);
  protected readonly open = signal<string | null>(null);
  protected readonly messages = computed(() => (this.state().value ?? []).map((m: SinkMessage) => ({ ...m, parts: linkify(m.text) })));

  protected reload(): void {
    this.mailLoad.reload();
  }
}
