import { randomUUID } from 'node:crypto';
import express from 'express';
import { eq, isNull } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Inbox, StudyHistory, StudyReview, Thread, VersionReviewDetail } from '@laminote/contracts';
import { freePort } from '../../scripts/lib/proc';
import { branches, cells, drafts, mailOutbox, type DraftCell } from '../../server/src/db/schema';
import { createLogger } from '../../server/src/logger';
import { devMailRouter } from '../../server/src/mail/dev-routes';
import { smtpMailer } from '../../server/src/mail/mailer';
import { OutboxSender, retryDelayMs } from '../../server/src/mail/outbox';
import { startSink, type Sink } from '../../server/src/mail/sink';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { demoUser, signIn, type SignedIn } from '../support/sign-in';

/**
 * Review through the HTTP API against real PostgreSQL: threads on cells anchored to versions, replies,
 * edits with history, resolve rules, the role matrix, mentions into the inbox and the mail outbox, review
 * requests and verdicts, and the outbox's delivery when the mail server is down for a while.
 */
let t: TestApp;
let smtpPort: number;
let sinkHttpPort: number;
const as: Record<string, SignedIn> = {};
const ROLES = ['lead', 'engineer', 'reviewer', 'viewer', 'admin', 'outsider'] as const;
const logger = createLogger('silent');

// The demo study's main branch with three cells; version 1, then version 2 with the analysis changed.
let branchId: string;
let v1: string;
let v2: string;
const flowCell = randomUUID();
const pressureCell = randomUUID();
const analysisCell = randomUUID();

function draftCells(reynolds: number): DraftCell[] {
  return [
    { cellId: flowCell, kind: 'flow', title: 'Cruise, FL 370', collapsed: false, inputs: { mode: 'reynolds', reynolds, mach: 0.72, nCrit: 9 } },
    { cellId: pressureCell, kind: 'pressure', title: 'Outboard Cp (invented)', collapsed: false, inputs: { text: 'x y cp\n1 0 0.2\n0 0 1\n1 0 0.2', layout: 'closedLoop' } },
    {
      cellId: analysisCell,
      kind: 'analysis',
      title: 'Transition analysis',
      collapsed: false,
      inputs: { flowCellId: flowCell, pressureCellId: pressureCell, criteria: reynolds > 2e7 ? ['eN'] : ['eN', 'michel'] },
    },
  ];
}

/**
 * Puts the cells in the main branch's draft (as the notebook's draft save leaves them: the draft row and
 * each cell's identity) and saves the draft as the next version through the versions API.
 */
async function saveVersion(cellList: DraftCell[], parent: string | null): Promise<string> {
  await t.database.db.transaction(async (tx) => {
    await tx.insert(cells).values(cellList.map((c) => ({ id: c.cellId, studyId: t.demo.studyId, kind: c.kind }))).onConflictDoNothing();
    await tx.update(drafts).set({ cells: cellList }).where(eq(drafts.branchId, branchId));
  });
  const res = await as['engineer']!.post(`/api/branches/${branchId}/versions`, { message: 'Cruise case, invented data', expectedHeadVersionId: parent });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

const ids = new Map<string, string>();
async function userId(role: (typeof ROLES)[number]): Promise<string> {
  if (!ids.has(role)) {
    const me = await as[role]!.get('/api/me').expect(200);
    ids.set(role, me.body.user.id as string);
  }
  return ids.get(role)!;
}

async function outboxFor(email: string) {
  return t.database.db.select().from(mailOutbox).where(eq(mailOutbox.toEmail, email));
}

const threadsUrl = () => `/api/studies/${t.demo.studyId}/threads`;

async function startThread(who: SignedIn, body: string, cellId = analysisCell, versionId: string | null = v1, extra: object = {}): Promise<Thread> {
  const res = await who.post(threadsUrl(), { cellId, versionId, ...(versionId ? {} : { branchId }), body, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as Thread;
}

beforeAll(async () => {
  [smtpPort, sinkHttpPort] = [await freePort(), await freePort()];
  t = await createTestApp({ SMTP_PORT: String(smtpPort), SMTP_SINK_HTTP_PORT: String(sinkHttpPort) });
  for (const role of ROLES) as[role] = await signIn(t.app, role, testEnv.publicUrl);
  const [main] = await t.database.db.select().from(branches).where(eq(branches.studyId, t.demo.studyId));
  branchId = main!.id;
  v1 = await saveVersion(draftCells(6e6), null);
  v2 = await saveVersion(draftCells(3e7), v1);
});
afterAll(async () => t?.close());

describe('threads on cells', () => {
  it('starts a thread on a cell of a version, anchored to that version, with the body as typed', async () => {
    const body = 'Is **N = 9** right for this tunnel?\n\n<script>alert(1)</script>';
    const thread = await startThread(as['reviewer']!, body, analysisCell, v1, { anchor: { surface: 'upper', x: 0.42 } });
    expect(thread.origin).toMatchObject({ versionId: v1, versionNumber: 1, branchId, branchName: 'main' });
    expect(thread.anchor).toEqual({ surface: 'upper', x: 0.42 });
    expect(thread.onThisView).toBe(true);
    expect(thread.cellChanged).toBe(false);
    expect(thread.comments).toHaveLength(1);
    // Stored raw; the web app sanitises when it renders Markdown.
    expect(thread.comments[0]!.body).toBe(body);
    expect(thread.comments[0]!.author?.name).toBe(demoUser('reviewer').name);
    expect(thread.createdBy?.name).toBe(demoUser('reviewer').name);
  });

  it('shows a thread made on an older version on a later one, marked with its version and whether the cell changed', async () => {
    await startThread(as['reviewer']!, 'Flow cell: Reynolds number from the FL 370 case?', flowCell, v1);
    const later = await as['viewer']!.get(`${threadsUrl()}?versionId=${v2}`).expect(200);
    const onAnalysis = (later.body as Thread[]).find((x) => x.cellId === analysisCell)!;
    const onFlow = (later.body as Thread[]).find((x) => x.cellId === flowCell)!;
    expect(onAnalysis.origin.versionNumber).toBe(1);
    expect(onAnalysis.onThisView).toBe(false);
    // Version 2 changed the analysis cell's criteria and the flow cell's Reynolds number.
    expect(onAnalysis.cellChanged).toBe(true);
    expect(onFlow.cellChanged).toBe(true);
    const same = await as['viewer']!.get(`${threadsUrl()}?versionId=${v1}&cellId=${analysisCell}`).expect(200);
    expect((same.body as Thread[]).every((x) => x.cellId === analysisCell && x.cellChanged === false)).toBe(true);
  });

  it('tells an unchanged cell from a changed one: a pressure thread on v1 reads unchanged on v2 and on the draft', async () => {
    const thread = await startThread(as['engineer']!, 'Table from the invented panel run, 120 points.', pressureCell, v1);
    for (const q of [`versionId=${v2}`, `branchId=${branchId}`]) {
      const res = await as['engineer']!.get(`${threadsUrl()}?${q}`).expect(200);
      expect((res.body as Thread[]).find((x) => x.id === thread.id)!.cellChanged).toBe(false);
    }
  });

  it('starts a thread on the draft (no version) and compares it with versions', async () => {
    const thread = await startThread(as['lead']!, 'Draft: try a trip at 5 % on the lower side.', analysisCell, null);
    expect(thread.origin).toMatchObject({ versionId: null, versionNumber: null, branchId });
    expect(thread.onThisView).toBe(true);
    const onV1 = await as['lead']!.get(`${threadsUrl()}?versionId=${v1}`).expect(200);
    const seen = (onV1.body as Thread[]).find((x) => x.id === thread.id)!;
    // The draft holds version 2's cells, whose analysis differs from version 1's.
    expect(seen.cellChanged).toBe(true);
    expect(seen.onThisView).toBe(false);
  });

  it('refuses a thread on a cell the version does not hold, and bad input, naming the field', async () => {
    const stranger = randomUUID();
    const res = await as['reviewer']!.post(threadsUrl(), { cellId: stranger, versionId: v1, body: 'Where is this?' }).expect(400);
    expect(res.body).toMatchObject({ type: '/problems/invalid-input', field: 'cellId' });
    const empty = await as['reviewer']!.post(threadsUrl(), { cellId: analysisCell, versionId: v1, body: '   ' }).expect(400);
    expect(empty.body.field).toBe('body');
    const draftless = await as['reviewer']!.post(threadsUrl(), { cellId: analysisCell, versionId: null, body: 'x' }).expect(400);
    expect(draftless.body.field).toBe('branchId');
    const anchor = await as['reviewer']!.post(threadsUrl(), { cellId: analysisCell, versionId: v1, body: 'x', anchor: { surface: 'upper', x: 1.7 } }).expect(400);
    expect(anchor.body.field).toBe('anchor.x');
    await as['reviewer']!.post(threadsUrl(), { cellId: analysisCell, versionId: randomUUID(), body: 'x' }).expect(404);
  });

  it('keeps replies in order and lets only the author edit, keeping every earlier text', async () => {
    const thread = await startThread(as['reviewer']!, 'Which Mach number does the Cp come from?');
    const replied = await as['engineer']!.post(`/api/threads/${thread.id}/comments`, { body: 'M 0.72, the cruise case.' }).expect(201);
    expect((replied.body as Thread).comments.map((c) => c.author?.name)).toEqual([demoUser('reviewer').name, demoUser('engineer').name]);
    const [first, second] = (replied.body as Thread).comments;
    expect(first!.canEdit).toBe(false); // as the engineer sees it

    await as['engineer']!.patch(`/api/comments/${first!.id}`, { body: 'changed by someone else' }).expect(403);
    await as['lead']!.patch(`/api/comments/${first!.id}`, { body: 'changed by the lead' }).expect(403);
    const edited = await as['reviewer']!.patch(`/api/comments/${first!.id}`, { body: 'Which Mach number and altitude does the Cp come from?' }).expect(200);
    const now = (edited.body as Thread).comments[0]!;
    expect(now).toMatchObject({ body: 'Which Mach number and altitude does the Cp come from?', revisionCount: 2, canEdit: true });
    expect(now.editedAt).not.toBeNull();
    const history = await as['viewer']!.get(`/api/comments/${first!.id}/revisions`).expect(200);
    expect(history.body.map((r: { revision: number; body: string }) => [r.revision, r.body])).toEqual([
      [1, 'Which Mach number does the Cp come from?'],
      [2, 'Which Mach number and altitude does the Cp come from?'],
    ]);
    expect(second!.revisionCount).toBe(1);
    // The database refuses to rewrite a comment's text.
    await expect(t.database.pool.query('update comment_revisions set body = $1 where comment_id = $2', ['rewritten', first!.id])).rejects.toThrow(/immutable/);
  });
});

describe('resolve and reopen', () => {
  it('lets leads and the thread author resolve or reopen a thread on the draft, and nobody else', async () => {
    // A draft thread on a cell nobody is recorded as creating: its only author is the reviewer.
    const thread = await startThread(as['reviewer']!, 'The H–Re_x result sits far from the e^N one.', analysisCell, null);
    const path = `/api/threads/${thread.id}`;
    await as['engineer']!.post(`${path}/resolve`).expect(403);
    await as['viewer']!.post(`${path}/resolve`).expect(403);
    await as['admin']!.post(`${path}/resolve`).expect(403);
    await as['outsider']!.post(`${path}/resolve`).expect(404);
    const resolved = await as['reviewer']!.post(`${path}/resolve`).expect(200);
    expect(resolved.body).toMatchObject({ resolved: true, resolvedBy: { name: demoUser('reviewer').name } });
    await as['engineer']!.post(`${path}/reopen`).expect(403);
    const reopened = await as['lead']!.post(`${path}/reopen`).expect(200);
    expect(reopened.body).toMatchObject({ resolved: false, resolvedBy: null });
    await as['lead']!.post(`${path}/resolve`).expect(200);
    const seen = await as['engineer']!.get(path).expect(200);
    expect(seen.body).toMatchObject({ resolved: true, canResolve: false, resolvedBy: { name: demoUser('lead').name } });
  });

  it('lets the author of the version a thread is on resolve it: the engineer answers the reviewer and closes the point', async () => {
    const thread = await startThread(as['reviewer']!, `@${demoUser('engineer').name} is the trip at 5 % intended?`, analysisCell, v1);
    const seen = await as['engineer']!.get(`/api/threads/${thread.id}?versionId=${v1}`).expect(200);
    expect(seen.body.canResolve).toBe(true);
    await as['engineer']!.post(`/api/threads/${thread.id}/comments`, { body: 'Yes: it stands for the bug-debris strip.' }).expect(201);
    const resolved = await as['engineer']!.post(`/api/threads/${thread.id}/resolve`).expect(200);
    expect(resolved.body).toMatchObject({ resolved: true, resolvedBy: { name: demoUser('engineer').name } });
    // A viewer is never allowed, whatever they authored.
    expect((await as['viewer']!.get(`/api/threads/${thread.id}`).expect(200)).body.canResolve).toBe(false);
  });

  it('lets an engineer resolve a thread they started', async () => {
    const thread = await startThread(as['engineer']!, 'Note to self: rerun after the table update.', pressureCell, null);
    expect(thread.canResolve).toBe(true);
    await as['engineer']!.post(`/api/threads/${thread.id}/resolve`).expect(200);
  });
});

describe('role matrix', () => {
  // Reviewers comment and give verdicts but cannot edit cells; viewers read only; engineers and leads
  // comment and ask for reviews; a site admin who is not a member reads; a non-member sees nothing.
  const matrix = [
    ['lead', 200, 201, 201, 403],
    ['engineer', 200, 201, 201, 403],
    ['reviewer', 200, 201, 403, 201],
    ['viewer', 200, 403, 403, 403],
    ['admin', 200, 403, 403, 403],
    ['outsider', 404, 404, 404, 404],
  ] as const;

  it.each(matrix)('%s: read threads %i, comment %i, request review %i, give verdict %i', async (role, read, comment, requestReview, verdict) => {
    const me = as[role]!;
    await me.get(threadsUrl()).expect(read);
    await me.get(`/api/studies/${t.demo.studyId}/review`).expect(read);
    await me.get(`/api/versions/${v2}/review`).expect(read);
    await me.post(threadsUrl(), { cellId: analysisCell, versionId: v2, body: `A comment by the ${role}` }).expect(comment);
    await me.post(`/api/versions/${v2}/review-requests`, { reviewerIds: [await userId('reviewer')] }).expect(requestReview);
    await me.post(`/api/versions/${v2}/verdicts`, { verdict: 'changes_requested', summary: `Checked by the ${role}` }).expect(verdict);
  });

  it('lets a reviewer comment but not edit cells or save versions', async () => {
    const draft = await as['reviewer']!.get(`/api/branches/${branchId}/draft`).expect(200);
    const edit = await as['reviewer']!.put(`/api/branches/${branchId}/draft`, { baseRevision: draft.body.revision, cells: [] }).expect(403);
    expect(edit.body.detail).toMatch(/reviewer/);
    await as['reviewer']!.post(`/api/branches/${branchId}/versions`, { message: 'by the reviewer', expectedHeadVersionId: draft.body.basedOnVersionId }).expect(403);
    await as['viewer']!.put(`/api/branches/${branchId}/draft`, { baseRevision: draft.body.revision, cells: [] }).expect(403);
  });

  it('hides threads, comments and versions of a project from a non-member (404, never 403)', async () => {
    const thread = await startThread(as['reviewer']!, 'Visible to members only');
    const outsider = as['outsider']!;
    for (const res of [
      await outsider.get(`/api/threads/${thread.id}`),
      await outsider.post(`/api/threads/${thread.id}/comments`, { body: 'x' }),
      await outsider.patch(`/api/comments/${thread.comments[0]!.id}`, { body: 'x' }),
      await outsider.get(`/api/comments/${thread.comments[0]!.id}/revisions`),
      await outsider.get(`/api/versions/${v1}/review`),
      await outsider.get(`/api/threads/${randomUUID()}`),
    ]) {
      expect(res.status).toBe(404);
      expect(res.body.type).toBe('/problems/not-found');
    }
    // A malformed id names nothing, for anyone: refused for what it is (400, naming the parameter).
    const malformed = await outsider.get('/api/threads/not-a-uuid');
    expect(malformed.status).toBe(400);
    expect(malformed.body.field).toBe('threadId');
  });

  it('lets a viewer read threads but not reply', async () => {
    const thread = await startThread(as['reviewer']!, 'Viewers may read this');
    await as['viewer']!.get(`/api/threads/${thread.id}`).expect(200);
    const res = await as['viewer']!.post(`/api/threads/${thread.id}/comments`, { body: 'I would like to add…' }).expect(403);
    expect(res.body.detail).toMatch(/viewer/);
  });
});

describe('mentions, the inbox and notification preferences', () => {
  it('puts a mention in the inbox and an e-mail with a link straight to the cell in the outbox', async () => {
    const engineer = demoUser('engineer');
    const before = (await outboxFor(engineer.email)).length;
    const thread = await startThread(as['reviewer']!, `@${engineer.name} the laminar run ends at 0.38 c here; is the trip intended?`);
    const inbox = (await as['engineer']!.get('/api/inbox').expect(200)).body as Inbox;
    const entry = inbox.items.find((n) => n.kind === 'mention' && n.link.includes(thread.id))!;
    expect(entry).toMatchObject({ read: false, actor: { name: demoUser('reviewer').name }, study: { id: t.demo.studyId } });
    expect(entry.link).toBe(`/studies/${t.demo.studyId}?cell=${analysisCell}&thread=${thread.id}`);
    expect(entry.title).toContain('mentioned you on “Transition analysis”');
    const mail = await outboxFor(engineer.email);
    expect(mail).toHaveLength(before + 1);
    const last = mail[mail.length - 1]!;
    expect(last.text).toContain(`${testEnv.publicUrl}/studies/${t.demo.studyId}?cell=${analysisCell}`);
    expect(last.html).toContain(`href="${testEnv.publicUrl}/studies/${t.demo.studyId}?cell=${analysisCell}&amp;thread=${thread.id}"`);
    expect(last.subject).toContain(demoUser('reviewer').name);
  });

  it('notifies the thread author of a reply, and not the person replying', async () => {
    const thread = await startThread(as['reviewer']!, 'Michel and e^N disagree by 8 % chord.');
    const reviewerBefore = ((await as['reviewer']!.get('/api/inbox').expect(200)).body as Inbox).unreadCount;
    await as['engineer']!.post(`/api/threads/${thread.id}/comments`, { body: 'The Michel line is the empirical one; e^N governs here.' }).expect(201);
    const inbox = (await as['reviewer']!.get('/api/inbox').expect(200)).body as Inbox;
    expect(inbox.unreadCount).toBe(reviewerBefore + 1);
    expect(inbox.items[0]).toMatchObject({ kind: 'reply', actor: { name: demoUser('engineer').name } });
    const engineerInbox = (await as['engineer']!.get('/api/inbox').expect(200)).body as Inbox;
    expect(engineerInbox.items.some((n) => n.kind === 'reply' && n.link.includes(thread.id))).toBe(false);
  });

  it('mails a person mentioned for the first time in an edit, once', async () => {
    const lead = demoUser('lead');
    const thread = await startThread(as['reviewer']!, 'Needs a second look.');
    const before = (await outboxFor(lead.email)).length;
    await as['reviewer']!.patch(`/api/comments/${thread.comments[0]!.id}`, { body: `Needs a second look, @${lead.name}.` }).expect(200);
    await as['reviewer']!.patch(`/api/comments/${thread.comments[0]!.id}`, { body: `Needs a second look please, @${lead.name}.` }).expect(200);
    expect(await outboxFor(lead.email)).toHaveLength(before + 1);
  });

  it('marks entries read one by one and all at once; another person’s entry is not found', async () => {
    await startThread(as['reviewer']!, `@${demoUser('engineer').name} one more`);
    const inbox = (await as['engineer']!.get('/api/inbox?unread=true').expect(200)).body as Inbox;
    expect(inbox.unreadCount).toBeGreaterThan(1);
    expect(inbox.items.every((n) => !n.read)).toBe(true);
    const first = inbox.items[0]!;
    await as['reviewer']!.post(`/api/inbox/${first.id}/read`).expect(404);
    const after = await as['engineer']!.post(`/api/inbox/${first.id}/read`).expect(200);
    expect(after.body.unreadCount).toBe(inbox.unreadCount - 1);
    expect((await as['engineer']!.get('/api/inbox/unread-count').expect(200)).body.unreadCount).toBe(inbox.unreadCount - 1);
    await as['engineer']!.post('/api/inbox/read-all').expect(200, { unreadCount: 0 });
    const all = (await as['engineer']!.get('/api/inbox').expect(200)).body as Inbox;
    expect(all.items.find((n) => n.id === first.id)!.read).toBe(true);
    await as['engineer']!.get('/api/inbox?limit=0').expect(400);
  });

  it('marks read what the inbox holds about a thread the person opened', async () => {
    const thread = await startThread(as['reviewer']!, `@${demoUser('engineer').name} about the Granville line`);
    const before = ((await as['engineer']!.get('/api/inbox').expect(200)).body as Inbox).unreadCount;
    const res = await as['engineer']!.post('/api/inbox/read-about', { threadId: thread.id }).expect(200);
    expect(res.body.unreadCount).toBe(before - 1);
    const entry = ((await as['engineer']!.get('/api/inbox').expect(200)).body as Inbox).items.find((n) => n.link.includes(thread.id))!;
    expect(entry.read).toBe(true);
    await as['engineer']!.post('/api/inbox/read-about', {}).expect(400);
  });

  it('respects the preference: a kind turned off still reaches the inbox but sends no e-mail', async () => {
    const engineer = demoUser('engineer');
    expect((await as['engineer']!.get('/api/me/notification-prefs').expect(200)).body).toEqual({ mention: true, reviewRequest: true, reply: true, verdict: true });
    const saved = await as['engineer']!.put('/api/me/notification-prefs', { mention: false }).expect(200);
    expect(saved.body).toEqual({ mention: false, reviewRequest: true, reply: true, verdict: true });
    const before = (await outboxFor(engineer.email)).length;
    const unread = ((await as['engineer']!.get('/api/inbox').expect(200)).body as Inbox).unreadCount;
    await startThread(as['reviewer']!, `@${engineer.email} quiet mention`);
    expect(await outboxFor(engineer.email)).toHaveLength(before);
    expect(((await as['engineer']!.get('/api/inbox').expect(200)).body as Inbox).unreadCount).toBe(unread + 1);
    await as['engineer']!.put('/api/me/notification-prefs', { mention: true }).expect(200);
    await as['engineer']!.put('/api/me/notification-prefs', { sms: true }).expect(400);
  });

  it('does not notify a mention of someone outside the project', async () => {
    const outsider = demoUser('outsider');
    const before = (await outboxFor(outsider.email)).length;
    await startThread(as['reviewer']!, `@${outsider.name} can you look?`);
    expect(await outboxFor(outsider.email)).toHaveLength(before);
    expect(((await as['outsider']!.get('/api/inbox').expect(200)).body as Inbox).unreadCount).toBe(0);
  });
});

describe('review requests and verdicts', () => {
  it('asks named reviewers, who get it in their inbox and by e-mail; only reviewers can be asked', async () => {
    const reviewer = demoUser('reviewer');
    const before = (await outboxFor(reviewer.email)).length;
    const res = await as['engineer']!.post(`/api/versions/${v1}/review-requests`, { reviewerIds: [await userId('reviewer')], message: 'Cruise case ready.' }).expect(201);
    const review = res.body as VersionReviewDetail;
    expect(review.summary.state).toBe('requested');
    expect(review.summary.pendingReviewers.map((p) => p.name)).toEqual([reviewer.name]);
    expect(review.requests[0]).toMatchObject({ message: 'Cruise case ready.', answered: false, requestedBy: { name: demoUser('engineer').name } });
    expect(await outboxFor(reviewer.email)).toHaveLength(before + 1);
    const inbox = (await as['reviewer']!.get('/api/inbox').expect(200)).body as Inbox;
    expect(inbox.items[0]).toMatchObject({ kind: 'reviewRequest', link: `/studies/${t.demo.studyId}/versions/${v1}` });

    const wrong = await as['engineer']!.post(`/api/versions/${v1}/review-requests`, { reviewerIds: [await userId('reviewer'), await userId('viewer')] }).expect(400);
    expect(wrong.body.field).toBe('reviewerIds[1]');
    const stranger = await as['engineer']!.post(`/api/versions/${v1}/review-requests`, { reviewerIds: [await userId('outsider')] }).expect(400);
    expect(stranger.body.detail).toMatch(/not a member/);
    await as['engineer']!.post(`/api/versions/${v1}/review-requests`, { reviewerIds: [] }).expect(400);
  });

  it('records a verdict on that version; a newer version shows that the verdict applies to an older one', async () => {
    const study = `/api/studies/${t.demo.studyId}/review`;
    // The role matrix above left changes requested on v2; v1 has none yet.
    const approved = await as['reviewer']!.post(`/api/versions/${v1}/verdicts`, { verdict: 'approved', summary: 'Transition and drag consistent with the invented tunnel data.' }).expect(201);
    expect((approved.body as VersionReviewDetail).summary).toMatchObject({ state: 'approved', approvals: 1, pendingReviewers: [] });
    expect((approved.body as VersionReviewDetail).requests.every((r) => r.answered)).toBe(true);

    const v3 = await saveVersion(draftCells(3.1e7), v2);
    const review = (await as['viewer']!.get(study).expect(200)).body as StudyReview;
    const byNumber = new Map(review.versions.map((v) => [v.versionNumber, v]));
    expect(byNumber.get(1)).toMatchObject({ state: 'approved', earlierVerdict: null });
    expect(byNumber.get(2)!.state).toBe('changes_requested');
    // Version 3 has no verdict of its own: the nearest one is version 2's.
    expect(byNumber.get(3)).toMatchObject({ state: 'none', earlierVerdict: { versionNumber: 2, state: 'changes_requested', branchName: 'main' } });
    expect(review.branches[0]).toMatchObject({ branchName: 'main', headVersionId: v3, head: { versionNumber: 3, state: 'none' } });

    // A reviewer's newer verdict on a version replaces their earlier one; both stay on record.
    await as['reviewer']!.post(`/api/versions/${v2}/verdicts`, { verdict: 'approved', summary: 'Trip moved; fine now.' }).expect(201);
    const detail = (await as['engineer']!.get(`/api/versions/${v2}/review`).expect(200)).body as VersionReviewDetail;
    expect(detail.summary).toMatchObject({ state: 'approved', approvals: 1, changesRequested: 0 });
    expect(detail.verdicts.map((v) => [v.verdict, v.current])).toEqual([
      ['approved', true],
      ['changes_requested', false],
    ]);
    expect(detail.canGiveVerdict).toBe(false);
    expect(detail.canRequest).toBe(true);
    const after = (await as['viewer']!.get(study).expect(200)).body as StudyReview;
    expect(after.versions.find((v) => v.versionNumber === 3)!.earlierVerdict).toMatchObject({ versionNumber: 2, state: 'approved' });

    // The versions history carries each version's review state.
    const history = (await as['viewer']!.get(`/api/studies/${t.demo.studyId}/versions`).expect(200)).body as StudyHistory;
    const states = new Map(history.versions.map((v) => [v.number, v.review?.state ?? null]));
    expect([states.get(1), states.get(2), states.get(3)]).toEqual(['approved', 'approved', null]);
    expect(Date.parse(history.versions.find((v) => v.number === 2)!.review!.updatedAt)).toBeGreaterThan(Date.parse(history.versions.find((v) => v.number === 1)!.review!.updatedAt));
    await expect(t.database.pool.query('delete from verdicts')).rejects.toThrow(/immutable/);
  });

  it('tells the version author about a verdict', async () => {
    const inbox = (await as['engineer']!.get('/api/inbox').expect(200)).body as Inbox;
    expect(inbox.items.some((n) => n.kind === 'verdict' && n.title === 'Lotte Brandvik cleared version 2 (main)')).toBe(true);
  });

  it('asks for a summary with a verdict', async () => {
    const res = await as['reviewer']!.post(`/api/versions/${v1}/verdicts`, { verdict: 'approved', summary: '' }).expect(400);
    expect(res.body.field).toBe('summary');
    const kind = await as['reviewer']!.post(`/api/versions/${v1}/verdicts`, { verdict: 'fine', summary: 'x' }).expect(400);
    expect(kind.body.field).toBe('verdict');
  });
});

describe('the mail outbox', () => {
  let sink: Sink | null = null;
  const mailer = () => smtpMailer({ host: '127.0.0.1', port: smtpPort, from: t.config.MAIL_FROM });
  afterAll(async () => sink?.stop());

  it('backs off exponentially, with a cap', () => {
    const fixed = () => 0.5;
    expect([1, 2, 3, 4].map((n) => retryDelayMs(n, 1000, 60_000, fixed))).toEqual([1000, 2000, 4000, 8000]);
    expect(retryDelayMs(30, 1000, 60_000, fixed)).toBe(60_000);
  });

  it('keeps mail while the mail server is down and delivers it once when it is back', async () => {
    const db = t.database.db;
    const engineer = demoUser('engineer');
    const thread = await startThread(as['reviewer']!, `@${engineer.name} sink-down check: please confirm the trip location.`);
    // A first retry 1.2–2 s later: long enough that a loaded machine's pauses between the failed round
    // and the checks below do not make the row due again before they run.
    const sender = new OutboxSender(db, mailer(), logger, { baseDelayMs: 1_500, maxDelayMs: 3_000, leaseMs: 5_000, batchSize: 500 });

    // Nothing listens on the SMTP port: every due row fails and stays, with its error and a later try.
    const down = await sender.runOnce();
    expect(down.sent).toBe(0);
    expect(down.failed).toBeGreaterThan(0);
    const pending = await db.select().from(mailOutbox).where(isNull(mailOutbox.sentAt));
    expect(pending.length).toBe(down.failed);
    const mine = pending.find((row) => row.toEmail === engineer.email && row.text.includes(thread.id))!;
    expect(mine).toMatchObject({ attempts: 1 });
    expect(mine.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(mine.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());
    // Not due yet: a round right away sends nothing.
    expect(await sender.runOnce()).toEqual({ sent: 0, failed: 0 });

    sink = await startSink({ smtpPort });
    // Until every failed row is due again.
    const due = Math.max(...pending.map((row) => row.nextAttemptAt.getTime()));
    await new Promise((r) => setTimeout(r, Math.max(0, due - Date.now()) + 100));
    // Two senders at once, as two server processes would run them: each row is taken by one of them.
    const other = new OutboxSender(db, mailer(), logger, { baseDelayMs: 200, batchSize: 500 });
    const [a, b] = await Promise.all([sender.runOnce(), other.runOnce()]);
    expect(a.failed + b.failed).toBe(0);
    expect(a.sent + b.sent).toBe(pending.length);
    expect(await sender.runOnce()).toEqual({ sent: 0, failed: 0 });

    const received = sink.messages();
    const ids = received.map((m) => m.messageId);
    expect(new Set(ids).size).toBe(ids.length);
    const delivered = received.filter((m) => m.text.includes(thread.id));
    expect(delivered).toHaveLength(1);
    expect(delivered[0]).toMatchObject({ envelopeTo: [engineer.email], messageId: expect.stringMatching(new RegExp(`^<outbox-${mine.id}\\.`)) });
    expect(delivered[0]!.subject).toContain(`${demoUser('reviewer').name} mentioned you`);
    expect(delivered[0]!.text).toContain(`${testEnv.publicUrl}/studies/${t.demo.studyId}?cell=${analysisCell}&thread=${thread.id}`);
    const [row] = await db.select().from(mailOutbox).where(eq(mailOutbox.id, mine.id));
    expect(row!.sentAt).not.toBeNull();
    expect(row!.attempts).toBe(2);
  });

  it('runs as a loop that picks up new mail by itself', async () => {
    const sender = new OutboxSender(t.database.db, mailer(), logger, { pollMs: 50 });
    sender.start();
    try {
      const thread = await startThread(as['reviewer']!, `@${demoUser('lead').name} loop check`);
      const deadline = Date.now() + 10_000;
      while (!sink!.messages().some((m) => m.text.includes(thread.id)) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
      expect(sink!.messages().filter((m) => m.text.includes(thread.id))).toHaveLength(1);
    } finally {
      await sender.stop();
    }
  });
});

describe('the development mail page', () => {
  it('shows site admins what the sink received, outside production only', async () => {
    const sink = await startSink({ smtpPort: 0, httpPort: sinkHttpPort });
    try {
      await smtpMailer({ host: '127.0.0.1', port: sink.smtpPort, from: t.config.MAIL_FROM }).send({
        to: 'dev.arjunan@tamsk.example',
        subject: 'Sink page check — ΔCp',
        text: 'Hello',
        html: null,
        messageId: '<sink-page-check@laminote.invalid>',
      });
      const res = await as['admin']!.get('/api/dev/mail').expect(200);
      expect(res.body[0]).toMatchObject({ subject: 'Sink page check — ΔCp', envelopeTo: ['dev.arjunan@tamsk.example'], text: 'Hello' });
      await as['lead']!.get('/api/dev/mail').expect(404);
    } finally {
      await sink.stop();
    }
    const gone = await as['admin']!.get('/api/dev/mail').expect(502);
    expect(gone.body.type).toBe('/problems/mail-sink-unavailable');

    const production = express();
    production.use((req, _res, next) => {
      req.user = { id: randomUUID(), email: 'ines.caldera@tamsk.example', name: 'Ines Caldera', siteAdmin: true };
      next();
    });
    production.use(devMailRouter({ config: { ...t.config, NODE_ENV: 'production' } }));
    await request(production).get('/dev/mail').expect(404);
  });
});
