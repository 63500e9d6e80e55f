import type { IncomingMessage } from 'node:http';
import type request from 'supertest';
import { can, type ProjectAction, type ProjectRole } from '@laminote/contracts';
import { routeTable, type RouteEntry } from '../../server/src/http/edge';
import type { TestApp } from './app';
import type { SignedIn } from './sign-in';

/**
 * The API's routes as the mounted app has them (server/src/http/edge.ts reads the Express routers), and
 * who may use each: the role matrix and the hostile-input tests walk every route of this table, so a
 * route added anywhere fails them until it has an access rule here and a sample id for its parameters.
 */
export type Caller = 'anonymous' | 'outsider' | 'viewer' | 'reviewer' | 'engineer' | 'lead' | 'admin';
export const CALLERS: readonly Caller[] = ['anonymous', 'outsider', 'viewer', 'reviewer', 'engineer', 'lead', 'admin'];

/**
 * Who may use a route:
 * - `{ project: action }`: a member whose role allows the action (libs/contracts roles.ts), or a site
 *   admin where the matrix lets admins; a member without it gets 403, a non-member 404;
 * - `signedIn`: anyone signed in, about their own things (their profile, inbox, settings);
 * - `siteAdmin`: site admins only (others 403);
 * - `siteAdminHidden`: site admins only, and to anyone else the route does not exist (404);
 * - `{ ownedBy: caller }`: only the person it belongs to (an inbox entry); to anyone else it does not exist (404);
 * - `public`: no sign-in (the sign-in routes); `signOut`: public, but a state change, so without a
 *   session (and its anti-forgery token) it answers 403.
 */
export type AccessRule = { project: ProjectAction } | { ownedBy: Caller } | 'signedIn' | 'siteAdmin' | 'siteAdminHidden' | 'public' | 'signOut';

export const ACCESS_RULES: Readonly<Record<string, AccessRule>> = {
  'GET /auth/login': 'public',
  'GET /auth/callback': 'public',
  'POST /auth/logout': 'signOut',
  'GET /api/me': 'signedIn',
  'GET /api/me/notification-prefs': 'signedIn',
  'GET /api/me/tokens': 'signedIn',
  'POST /api/me/tokens': 'signedIn',
  'DELETE /api/me/tokens/:tokenId': { ownedBy: 'engineer' },
  'PUT /api/me/notification-prefs': 'signedIn',
  'GET /api/inbox': 'signedIn',
  'GET /api/inbox/unread-count': 'signedIn',
  'POST /api/inbox/read-all': 'signedIn',
  'POST /api/inbox/read-about': 'signedIn',
  'POST /api/inbox/:notificationId/read': { ownedBy: 'engineer' },
  'GET /api/methods/validation': 'signedIn',
  'GET /api/openapi.json': 'signedIn',
  'GET /api/projects': 'signedIn',
  'POST /api/projects': 'siteAdmin',
  'GET /api/dev/mail': 'siteAdminHidden',
  'GET /api/projects/:projectId': { project: 'read' },
  'PATCH /api/projects/:projectId': { project: 'manageMembers' },
  'GET /api/projects/:projectId/members': { project: 'read' },
  'POST /api/projects/:projectId/members': { project: 'manageMembers' },
  'PATCH /api/projects/:projectId/members/:userId': { project: 'manageMembers' },
  'DELETE /api/projects/:projectId/members/:userId': { project: 'manageMembers' },
  'GET /api/projects/:projectId/studies': { project: 'read' },
  'POST /api/projects/:projectId/studies': { project: 'editStudy' },
  'POST /api/projects/:projectId/studies/import': { project: 'editStudy' },
  'GET /api/studies/:studyId': { project: 'read' },
  'PATCH /api/studies/:studyId': { project: 'editStudy' },
  'GET /api/studies/:studyId/branches': { project: 'read' },
  'GET /api/studies/:studyId/opening': { project: 'read' },
  'GET /api/studies/:studyId/versions': { project: 'read' },
  'POST /api/studies/:studyId/baseline': { project: 'markBaseline' },
  'GET /api/studies/:studyId/threads': { project: 'read' },
  'POST /api/studies/:studyId/threads': { project: 'comment' },
  'GET /api/studies/:studyId/review': { project: 'read' },
  'POST /api/studies/:studyId/uploads': { project: 'editStudy' },
  'GET /api/uploads/:uploadId/content': { project: 'read' },
  'GET /api/branches/:branchId/draft': { project: 'read' },
  'PUT /api/branches/:branchId/draft': { project: 'editStudy' },
  'POST /api/branches/:branchId/run': { project: 'runCells' },
  'GET /api/branches/:branchId/cells/:cellId/export': { project: 'read' },
  'GET /api/branches/:branchId/versions': { project: 'read' },
  'GET /api/branches/:branchId/events': { project: 'runCells' },
  'GET /api/branches/:branchId/export': { project: 'read' },
  'POST /api/branches/:branchId/versions': { project: 'saveVersion' },
  'POST /api/branches/:branchId/draft/restore': { project: 'editStudy' },
  'PATCH /api/branches/:branchId': { project: 'branch' },
  'GET /api/versions/:versionId': { project: 'read' },
  'GET /api/versions/:versionId/export': { project: 'read' },
  'GET /api/versions/:versionId/report.html': { project: 'read' },
  'GET /api/versions/:versionId/report.pdf': { project: 'read' },
  'POST /api/versions/:versionId/branches': { project: 'branch' },
  'GET /api/versions/:versionId/review': { project: 'read' },
  'POST /api/versions/:versionId/review-requests': { project: 'requestReview' },
  'POST /api/versions/:versionId/verdicts': { project: 'giveVerdict' },
  'GET /api/compare': 'signedIn',
  'GET /api/compare/report.html': 'signedIn',
  'GET /api/compare/report.pdf': 'signedIn',
  'GET /api/threads/:threadId': { project: 'read' },
  'POST /api/threads/:threadId/comments': { project: 'comment' },
  'POST /api/threads/:threadId/resolve': { project: 'comment' },
  'POST /api/threads/:threadId/reopen': { project: 'comment' },
  'PATCH /api/comments/:commentId': { project: 'comment' },
  'GET /api/comments/:commentId/revisions': { project: 'read' },
  'GET /api/jobs/:jobId': { project: 'read' },
  'DELETE /api/jobs/:jobId': { project: 'runCells' },
};

export const routeKey = (r: Pick<RouteEntry, 'method' | 'path'>) => `${r.method} ${r.path}`;

/** The app's routes that the matrix walks: the API and the sign-in routes (not the web app's pages). */
export function apiRoutes(t: TestApp): RouteEntry[] {
  return routeTable(t.app).filter((r) => r.path.startsWith('/api/') || r.path.startsWith('/auth/'));
}

/** What a caller should get from a route, given that the request itself is acceptable. */
export type Expected = 'allowed' | 401 | 403 | 404;

export function expectedFor(rule: AccessRule, caller: Caller, path: string): Expected {
  if (rule === 'public') return 'allowed';
  if (rule === 'signOut') return caller === 'anonymous' ? 403 : 'allowed';
  if (caller === 'anonymous') return path.startsWith('/api/') ? 401 : 'allowed';
  if (rule === 'signedIn') return 'allowed';
  if (rule === 'siteAdmin') return caller === 'admin' ? 'allowed' : 403;
  if (rule === 'siteAdminHidden') return caller === 'admin' ? 'allowed' : 404;
  if ('ownedBy' in rule) return caller === rule.ownedBy ? 'allowed' : 404;
  if (caller === 'outsider') return 404;
  // The site admin of the demo is not a member of its projects: the matrix's admin column applies.
  const access = caller === 'admin' ? { role: null, siteAdmin: true } : { role: caller as ProjectRole, siteAdmin: false };
  return can(access, rule.project) ? 'allowed' : 403;
}

/** Ids of real things in the seeded demo for each path parameter; a parameter missing here fails the suites. */
export async function sampleIds(t: TestApp, as: Partial<Record<Caller, SignedIn>>): Promise<Record<string, string>> {
  const one = async (sql: string, params: unknown[] = []): Promise<string> => {
    const { rows } = await t.database.pool.query<{ id: string }>(sql, params);
    if (!rows[0]) throw new Error(`the seeded demo has nothing for: ${sql}`);
    return rows[0].id;
  };
  const { projectId, studyId } = t.demo;
  const lead = as.lead!;
  // A person added for these tests, so removing a member removes nobody the other callers need.
  const guest = await lead.post(`/api/projects/${projectId}/members`, { email: 'matrix.guest@tamsk.example', role: 'viewer' });
  const userId = guest.status === 201 ? (guest.body.userId as string) : await one(`select id from users where email = 'matrix.guest@tamsk.example'`);
  const upload = await as.engineer!.agent
    .post(`/api/studies/${studyId}/uploads`)
    .set('x-xsrf-token', as.engineer!.csrf)
    .attach('file', Buffer.from('x cp\n0 1\n0.5 -0.3\n1 0.1\n'), 'matrix.txt');
  if (upload.status !== 201) throw new Error(`upload for the matrix failed: ${upload.status} ${JSON.stringify(upload.body)}`);
  const branchId = await one('select id from branches where study_id = $1 order by created_at limit 1', [studyId]);
  const cellId = await one('select id from cells where study_id = $1 order by created_at limit 1', [studyId]);
  // A version of the demo's draft, and a thread on it that mentions the engineer (a notification).
  const saved = await as.engineer!.post(`/api/branches/${branchId}/versions`, { message: 'Matrix baseline (invented data)', expectedHeadVersionId: null });
  if (saved.status !== 201) throw new Error(`saving a version for the matrix failed: ${saved.status} ${JSON.stringify(saved.body)}`);
  const versionId = await one('select id from versions where study_id = $1 order by created_at limit 1', [studyId]);
  const engineerEmail = (await as.engineer!.get('/api/me')).body.user.email as string;
  const thread = await as.reviewer!.post(`/api/studies/${studyId}/threads`, { cellId, versionId, body: `@${engineerEmail} please check the trip` });
  if (thread.status !== 201) throw new Error(`starting a thread for the matrix failed: ${thread.status} ${JSON.stringify(thread.body)}`);
  const ids: Record<string, string> = {
    projectId,
    studyId,
    userId,
    uploadId: upload.body.uploadId as string,
    branchId,
    versionId,
    cellId,
    threadId: await one('select id from comment_threads where study_id = $1 order by created_at limit 1', [studyId]),
    commentId: await one('select c.id from comments c join comment_threads t on t.id = c.thread_id where t.study_id = $1 order by c.created_at limit 1', [studyId]),
    // The engineer's: the thread above mentions them.
    notificationId: await one(`select n.id from notifications n join users u on u.id = n.user_id where u.email = $1 order by n.created_at limit 1`, [engineerEmail]),
  };
  // The engineer's personal API token, for the routes that list and revoke them.
  const token = await as.engineer!.post('/api/me/tokens', { name: 'Matrix script', scope: 'read', expiresInDays: 7 });
  if (token.status === 201) ids['tokenId'] = (token.body.token?.id ?? token.body.id) as string;
  // A run is a job: one to look at and cancel.
  const run = await as.engineer!.post(`/api/branches/${branchId}/run`, {});
  if (run.status !== 202 && run.status !== 200) throw new Error(`starting a run for the matrix failed: ${run.status} ${JSON.stringify(run.body)}`);
  if (typeof run.body.jobId === 'string') ids['jobId'] = run.body.jobId;
  return ids;
}

/** Routes that answer with a stream of events (server-sent events) rather than one body. */
export const isStream = (path: string) => path.endsWith('/events');

/**
 * Sends a request; for an event stream, which stays open, takes the status (and an error's body) and
 * closes it.
 */
export function sendOnce(req: request.Test, stream: boolean): Promise<request.Response> {
  if (!stream) return req.redirects(0);
  return req.buffer(false).parse((res, done) => {
    const incoming = res as unknown as IncomingMessage;
    if ((incoming.statusCode ?? 0) < 400) {
      done(null, null);
      incoming.destroy();
      return;
    }
    let text = '';
    incoming.on('data', (chunk: Buffer) => (text += chunk.toString()));
    incoming.on('end', () => done(null, JSON.parse(text || 'null')));
  });
}

/** The route's path with its parameters filled from `ids` (or `override` for one of them). */
export function fillPath(route: RouteEntry, ids: Record<string, string>, override?: { param: string; value: string }): string {
  return route.path.replace(/:(\w+)/g, (_all, name: string) => {
    if (override?.param === name) return override.value;
    const id = ids[name];
    if (id === undefined) throw new Error(`no sample id for :${name} (${routeKey(route)}): add one in tests/support/routes.ts sampleIds`);
    return id;
  });
}
