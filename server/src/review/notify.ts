import { inArray } from 'drizzle-orm';
import type { NotificationKind } from '@laminote/contracts';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { notifications, users } from '../db/schema';
import { enqueueMail } from '../mail/outbox';

/**
 * Notifications: a row in each recipient's inbox and, unless they turned that kind off, an e-mail in
 * the outbox, both in the caller's transaction, so the change, its inbox entries and its mail land
 * together or not at all.
 */
export interface NotificationInput {
  kind: NotificationKind;
  recipientIds: readonly string[];
  actor: SessionUser;
  projectId: string;
  study: { id: string; title: string };
  /** One line: what happened, e.g. "Lotte Brandvik mentioned you on “Transition analysis”". */
  title: string;
  /** The words that were written (comment, message, summary), as written. */
  excerpt: string;
  /** Path in the app, e.g. /studies/…?cell=…; mail links are PUBLIC_URL + this. */
  link: string;
  /** Ids the inbox keeps with the entry (thread, cell, version). */
  refs: Record<string, string | number | null>;
}

const EXCERPT_LENGTH = 600;

export function excerpt(text: string, length = EXCERPT_LENGTH): string {
  const flat = text.trim();
  return flat.length <= length ? flat : `${flat.slice(0, length - 1).trimEnd()}…`;
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

const WHY: Record<NotificationKind, string> = {
  mention: 'you were mentioned',
  reviewRequest: 'you were asked to review',
  reply: 'someone replied in a thread you started or took part in',
  verdict: 'a reviewer gave a verdict on a version you saved or sent for review',
};

export function composeMail(input: NotificationInput, publicUrl: string): { subject: string; text: string; html: string } {
  const url = `${publicUrl}${input.link}`;
  const settings = `${publicUrl}/inbox?settings=1`;
  const quoted = input.excerpt
    .split('\n')
    .map((line) => `> ${line}`)
    .join('\n');
  const text = [
    input.title,
    '',
    `Study: ${input.study.title}`,
    '',
    ...(input.excerpt ? [quoted, ''] : []),
    `Open it in Laminote: ${url}`,
    '',
    '--',
    `Laminote sent this because ${WHY[input.kind]}. Choose which notifications reach you by e-mail: ${settings}`,
  ].join('\n');
  const html = [
    '<!doctype html><html><body style="font-family:Lato,Arial,sans-serif;color:#1d2a33;line-height:1.45">',
    `<p style="font-size:16px;margin:0 0 8px">${escapeHtml(input.title)}</p>`,
    `<p style="margin:0 0 12px;color:#51606b">Study: ${escapeHtml(input.study.title)}</p>`,
    input.excerpt
      ? `<blockquote style="margin:0 0 16px;padding:8px 12px;border-left:3px solid #2f7d6d;background:#f3f6f5;white-space:pre-wrap">${escapeHtml(input.excerpt)}</blockquote>`
      : '',
    `<p><a href="${escapeHtml(url)}" style="color:#1f5f8b">Open it in Laminote</a></p>`,
    `<p style="font-size:12px;color:#6b7a85">Laminote sent this because ${escapeHtml(WHY[input.kind])}. <a href="${escapeHtml(settings)}">Choose which notifications reach you by e-mail</a>.</p>`,
    '</body></html>',
  ].join('');
  return { subject: `${input.title} · ${input.study.title}`.slice(0, 250), text, html };
}

export async function notify(tx: Tx, publicUrl: string, input: NotificationInput): Promise<void> {
  const recipients = [...new Set(input.recipientIds)].filter((id) => id !== input.actor.id);
  if (recipients.length === 0) return;
  const people = await tx.select({ id: users.id, email: users.email, prefs: users.notificationPrefs }).from(users).where(inArray(users.id, recipients));
  const mail = composeMail(input, publicUrl);
  for (const person of people) {
    await tx.insert(notifications).values({
      userId: person.id,
      kind: input.kind,
      projectId: input.projectId,
      studyId: input.study.id,
      payload: {
        title: input.title,
        excerpt: input.excerpt,
        link: input.link,
        actorId: input.actor.id,
        actorName: input.actor.name,
        ...input.refs,
      },
    });
    if (person.prefs[input.kind] !== false) await enqueueMail(tx, { to: person.email, ...mail });
  }
}
