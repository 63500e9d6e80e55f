import { z } from 'zod';
import {
  addMemberSchema,
  branchSchema,
  createProjectSchema,
  createStudySchema,
  logoutSchema,
  memberSchema,
  meSchema,
  problemSchema,
  projectSchema,
  studySchema,
  updateMemberSchema,
  updateProjectSchema,
  updateStudySchema,
} from './api';
import { jobSchema, runQueuedSchema } from './jobs';
import { validationReportSchema } from './methods';
import { draftSchema, runRequestSchema, runResponseSchema, saveDraftSchema, studyOpeningQuerySchema, studyOpeningSchema, uploadResponseSchema } from './notebook';
import {
  commentRevisionSchema,
  commentTextSchema,
  createThreadSchema,
  giveVerdictSchema,
  inboxQuerySchema,
  inboxSchema,
  notificationPrefsSchema,
  readAboutSchema,
  requestReviewSchema,
  sinkMessageSchema,
  studyReviewSchema,
  threadQuerySchema,
  threadSchema,
  unreadCountSchema,
  updateNotificationPrefsSchema,
  versionReviewDetailSchema,
} from './review';
import { importStudyResultSchema, importStudySchema, studyDocumentSchema } from './study-document';
import { createdTokenSchema, createTokenSchema, tokenSummarySchema } from './tokens';
import {
  branchOverviewSchema,
  compareQuerySchema,
  comparisonSchema,
  createBranchSchema,
  markBaselineSchema,
  restoreDraftSchema,
  restoreResultSchema,
  saveVersionSchema,
  studyHistorySchema,
  updateBranchSchema,
  versionDetailSchema,
  versionSummarySchema,
} from './versions';

/**
 * The API's description, one entry per route: the server makes its OpenAPI 3.1 document from this
 * list (GET /api/openapi.json) and a test holds it against the routes the app really mounts, both
 * ways. A route added without an entry here, or an entry whose route is gone, fails that test.
 */
export type HttpMethod = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/** A JSON body or answer described by a named contract schema. */
export interface NamedSchema {
  name: string;
  schema: z.ZodType;
}

/** An answer that is not JSON (a file, a stream, a redirect). */
export interface OtherContent {
  contentType: string;
  description: string;
}

export interface ApiOperation {
  method: HttpMethod;
  /** Express style, e.g. `/api/versions/:versionId`. */
  path: string;
  tag: string;
  summary: string;
  query?: NamedSchema;
  body?: NamedSchema | OtherContent;
  /** Success status and what it carries; `null` for an empty answer. */
  status: number;
  response: NamedSchema | OtherContent | null;
  /** A second answer, 202 Accepted, when the work goes on as a job. */
  accepted?: NamedSchema;
  /** Reached by a personal API token of this scope (or not at all). */
  token: 'read' | 'run' | 'none';
}

const named = (name: string, schema: z.ZodType): NamedSchema => ({ name, schema });
const list = (name: string, schema: z.ZodType): NamedSchema => ({ name: `${name}List`, schema: z.array(schema) });
const unreadCount = named('UnreadCount', unreadCountSchema);
const csv = { contentType: 'text/csv', description: 'The cell’s result as CSV (or JSON with ?format=json).' };

const op = (method: HttpMethod, path: string, tag: string, summary: string, rest: Partial<ApiOperation> = {}): ApiOperation => ({
  method,
  path,
  tag,
  summary,
  status: 200,
  response: null,
  token: method === 'GET' ? 'read' : 'none',
  ...rest,
});

export const API_OPERATIONS: readonly ApiOperation[] = [
  // Sign-in (browser only)
  op('GET', '/auth/login', 'Sign-in', 'Start OpenID Connect sign-in (authorization code with PKCE); redirects to the provider', { status: 302, response: { contentType: 'text/plain', description: 'Redirect to the identity provider.' }, token: 'none' }),
  op('GET', '/auth/callback', 'Sign-in', 'The provider’s answer; starts the session and redirects back', { status: 302, response: { contentType: 'text/plain', description: 'Redirect into the app.' }, token: 'none' }),
  op('POST', '/auth/logout', 'Sign-in', 'End the session; answers where the browser goes next', { response: named('Logout', logoutSchema) }),
  op('GET', '/healthz', 'Service', 'Whether the server and its database answer', { response: named('Health', z.object({ status: z.literal('ok') })), token: 'none' }),

  op('GET', '/api/me', 'People', 'The caller and their project memberships', { response: named('Me', meSchema) }),
  op('GET', '/api/me/notification-prefs', 'People', 'Which notifications reach the caller by e-mail', { response: named('NotificationPrefs', notificationPrefsSchema) }),
  op('PUT', '/api/me/notification-prefs', 'People', 'Change which notifications reach the caller by e-mail', { body: named('UpdateNotificationPrefs', updateNotificationPrefsSchema), response: named('NotificationPrefs', notificationPrefsSchema) }),
  op('GET', '/api/me/tokens', 'API tokens', 'The caller’s personal API tokens (signed in only)', { response: list('TokenSummary', tokenSummarySchema), token: 'none' }),
  op('POST', '/api/me/tokens', 'API tokens', 'Make a personal API token; the only answer that shows the token', { body: named('CreateToken', createTokenSchema), status: 201, response: named('CreatedToken', createdTokenSchema) }),
  op('DELETE', '/api/me/tokens/:tokenId', 'API tokens', 'Revoke a token at once', { response: named('TokenSummary', tokenSummarySchema) }),

  op('GET', '/api/projects', 'Projects', 'Projects the caller is a member of (every project for a site admin)', { response: list('Project', projectSchema) }),
  op('POST', '/api/projects', 'Projects', 'Create a project (site admins)', { body: named('CreateProject', createProjectSchema), status: 201, response: named('Project', projectSchema) }),
  op('GET', '/api/projects/:projectId', 'Projects', 'A project', { response: named('Project', projectSchema) }),
  op('PATCH', '/api/projects/:projectId', 'Projects', 'Rename a project or change its settings (leads)', { body: named('UpdateProject', updateProjectSchema), response: named('Project', projectSchema) }),
  op('GET', '/api/projects/:projectId/members', 'Projects', 'A project’s members and their roles', { response: list('Member', memberSchema) }),
  op('POST', '/api/projects/:projectId/members', 'Projects', 'Add a member by e-mail (leads)', { body: named('AddMember', addMemberSchema), status: 201, response: named('Member', memberSchema) }),
  op('PATCH', '/api/projects/:projectId/members/:userId', 'Projects', 'Change a member’s role (leads)', { body: named('UpdateMember', updateMemberSchema), response: named('Member', memberSchema) }),
  op('DELETE', '/api/projects/:projectId/members/:userId', 'Projects', 'Remove a member (leads)', { status: 204 }),
  op('GET', '/api/projects/:projectId/studies', 'Studies', 'A project’s studies', { response: list('Study', studySchema) }),
  op('POST', '/api/projects/:projectId/studies', 'Studies', 'Create a study with its main branch', { body: named('CreateStudy', createStudySchema), status: 201, response: named('Study', studySchema) }),

  op('POST', '/api/projects/:projectId/studies/import', 'Studies', 'Make a study from a study export (GET …/export, from here or another Laminote): cells, inputs and outputs', { body: named('ImportStudy', importStudySchema), status: 201, response: named('ImportStudyResult', importStudyResultSchema) }),

  op('GET', '/api/studies/:studyId', 'Studies', 'A study', { response: named('Study', studySchema) }),
  op('PATCH', '/api/studies/:studyId', 'Studies', 'Rename, describe or archive a study', { body: named('UpdateStudy', updateStudySchema), response: named('Study', studySchema) }),
  op('GET', '/api/studies/:studyId/branches', 'Studies', 'A study’s branches', { response: list('Branch', branchSchema) }),
  op('GET', '/api/studies/:studyId/opening', 'Studies', 'A study, its branches and the draft of the branch it opens on (?branch= by id or name, else main), in one read', {
    query: named('StudyOpeningQuery', studyOpeningQuerySchema),
    response: named('StudyOpening', studyOpeningSchema),
  }),
  op('GET', '/api/studies/:studyId/versions', 'Versions', 'A study’s branches and every version, newest first', { response: named('StudyHistory', studyHistorySchema) }),
  op('POST', '/api/studies/:studyId/baseline', 'Versions', 'Mark (or clear) the baseline version (leads)', { body: named('MarkBaseline', markBaselineSchema), response: named('StudyHistory', studyHistorySchema) }),
  op('POST', '/api/studies/:studyId/uploads', 'Notebook', 'Upload a pressure table file (multipart, field “file”)', { body: { contentType: 'multipart/form-data', description: 'The file in the field “file”.' }, status: 201, response: named('UploadResponse', uploadResponseSchema), token: 'run' }),
  op('GET', '/api/studies/:studyId/threads', 'Review', 'Comment threads on the study’s cells', { query: named('ThreadQuery', threadQuerySchema), response: list('Thread', threadSchema) }),
  op('POST', '/api/studies/:studyId/threads', 'Review', 'Start a comment thread on a cell', { body: named('CreateThread', createThreadSchema), status: 201, response: named('Thread', threadSchema) }),
  op('GET', '/api/studies/:studyId/review', 'Review', 'Every version’s review state and each branch head’s', { response: named('StudyReview', studyReviewSchema) }),
  op('GET', '/api/uploads/:uploadId/content', 'Notebook', 'An uploaded file, as a download', { response: { contentType: 'application/octet-stream', description: 'The file as uploaded; its SHA-256 in x-content-sha256.' } }),

  op('GET', '/api/branches/:branchId/draft', 'Notebook', 'A branch’s working draft: cells, inputs, run state and outputs', { response: named('Draft', draftSchema) }),
  op('PUT', '/api/branches/:branchId/draft', 'Notebook', 'Save the draft’s cells (autosave); 409 when based on an older revision', { body: named('SaveDraft', saveDraftSchema), response: named('Draft', draftSchema), token: 'run' }),
  op('POST', '/api/branches/:branchId/run', 'Notebook', 'Run the draft’s stale cells (or the named ones)', { body: named('RunRequest', runRequestSchema), response: named('RunResponse', runResponseSchema), accepted: named('RunQueued', runQueuedSchema), token: 'run' }),
  op('GET', '/api/branches/:branchId/events', 'Notebook', 'Server-sent events: run progress and outputs as they land', { response: { contentType: 'text/event-stream', description: 'One event per change (job progress, a landed output).' } }),
  op('GET', '/api/branches/:branchId/export', 'Notebook', 'The draft as one study document (cells, inputs, outputs)', { response: named('StudyDocument', studyDocumentSchema) }),
  op('GET', '/api/branches/:branchId/cells/:cellId/export', 'Notebook', 'One cell’s result as CSV or JSON', { response: csv }),
  op('POST', '/api/branches/:branchId/draft/restore', 'Versions', 'Put a version’s cells into the draft', { body: named('RestoreDraft', restoreDraftSchema), response: named('RestoreResult', restoreResultSchema) }),
  op('GET', '/api/branches/:branchId/versions', 'Versions', 'A branch’s versions, newest first', { response: list('VersionSummary', versionSummarySchema) }),
  op('POST', '/api/branches/:branchId/versions', 'Versions', 'Save the draft as a new version; 409 when the branch head moved', { body: named('SaveVersion', saveVersionSchema), status: 201, response: named('VersionSummary', versionSummarySchema) }),
  op('PATCH', '/api/branches/:branchId', 'Versions', 'Rename, describe, archive or restore a branch', { body: named('UpdateBranch', updateBranchSchema), response: named('BranchOverview', branchOverviewSchema) }),

  op('GET', '/api/versions/:versionId', 'Versions', 'A saved version with its cells and their stored outputs', { response: named('VersionDetail', versionDetailSchema) }),
  op('GET', '/api/versions/:versionId/export', 'Versions', 'A version as one study document', { response: named('StudyDocument', studyDocumentSchema) }),
  op('GET', '/api/versions/:versionId/report.html', 'Reports', 'The version’s report as one self-contained HTML file (?download=1 to save it)', { response: { contentType: 'text/html', description: 'Every cell’s inputs and results, plots as SVG, review state and verdicts, warnings, the caution, engine version and output keys.' } }),
  op('GET', '/api/versions/:versionId/report.pdf', 'Reports', 'The same report as PDF (?download=1 to save it)', { response: { contentType: 'application/pdf', description: 'The report, made on the server.' } }),
  op('POST', '/api/versions/:versionId/branches', 'Versions', 'Branch a design variant from a version', { body: named('CreateBranch', createBranchSchema), status: 201, response: named('BranchOverview', branchOverviewSchema) }),
  op('GET', '/api/versions/:versionId/review', 'Review', 'A version’s review: requests, verdicts and state', { response: named('VersionReviewDetail', versionReviewDetailSchema) }),
  op('POST', '/api/versions/:versionId/review-requests', 'Review', 'Send a version for review to named reviewers', { body: named('RequestReview', requestReviewSchema), status: 201, response: named('VersionReviewDetail', versionReviewDetailSchema) }),
  op('POST', '/api/versions/:versionId/verdicts', 'Review', 'Give a verdict on a version (reviewers)', { body: named('GiveVerdict', giveVerdictSchema), status: 201, response: named('VersionReviewDetail', versionReviewDetailSchema) }),
  op('GET', '/api/compare', 'Versions', 'Compare two versions cell by cell (?a=&b=)', { query: named('CompareQuery', compareQuerySchema), response: named('Comparison', comparisonSchema) }),
  op('GET', '/api/compare/report.html', 'Reports', 'The comparison of two versions as one self-contained HTML file (?a=&b=, ?download=1 to save it)', { query: named('CompareQuery', compareQuerySchema), response: { contentType: 'text/html', description: 'What changed cell by cell, transition and drag of A against B with overlay plots as SVG, warnings and the caution.' } }),
  op('GET', '/api/compare/report.pdf', 'Reports', 'The comparison of two versions as PDF, the same content as its HTML report (?a=&b=, ?download=1 to save it)', { query: named('CompareQuery', compareQuerySchema), response: { contentType: 'application/pdf', description: 'What changed cell by cell, transition and drag of A against B with overlay plots drawn as vectors, warnings and the caution; made on the server without network access.' } }),

  op('GET', '/api/threads/:threadId', 'Review', 'A thread with its comments', { response: named('Thread', threadSchema) }),
  op('POST', '/api/threads/:threadId/comments', 'Review', 'Reply in a thread', { body: named('CommentText', commentTextSchema), status: 201, response: named('Thread', threadSchema) }),
  op('POST', '/api/threads/:threadId/resolve', 'Review', 'Resolve a thread', { response: named('Thread', threadSchema) }),
  op('POST', '/api/threads/:threadId/reopen', 'Review', 'Reopen a thread', { response: named('Thread', threadSchema) }),
  op('PATCH', '/api/comments/:commentId', 'Review', 'Edit one’s own comment (earlier text is kept)', { body: named('CommentText', commentTextSchema), response: named('Thread', threadSchema) }),
  op('GET', '/api/comments/:commentId/revisions', 'Review', 'A comment’s earlier texts', { response: list('CommentRevision', commentRevisionSchema) }),

  op('GET', '/api/inbox', 'Inbox', 'The caller’s notifications, newest first', { query: named('InboxQuery', inboxQuerySchema), response: named('Inbox', inboxSchema) }),
  op('GET', '/api/inbox/unread-count', 'Inbox', 'How many notifications are unread', { response: unreadCount }),
  op('POST', '/api/inbox/read-all', 'Inbox', 'Mark every notification read', { response: unreadCount }),
  op('POST', '/api/inbox/read-about', 'Inbox', 'Mark read what is about a thread or version just opened', { body: named('ReadAbout', readAboutSchema), response: unreadCount }),
  op('POST', '/api/inbox/:notificationId/read', 'Inbox', 'Mark one notification read', { response: unreadCount }),

  op('GET', '/api/jobs/:jobId', 'Notebook', 'A run job: state and progress cell by cell', { response: named('Job', jobSchema) }),
  op('DELETE', '/api/jobs/:jobId', 'Notebook', 'Cancel a run job', { response: named('Job', jobSchema), token: 'run' }),

  op('GET', '/api/methods/validation', 'Methods', 'Run the engine’s shared reference cases: reference, value, tolerance, pass or fail, source', { response: named('ValidationReport', validationReportSchema) }),
  op('GET', '/api/openapi.json', 'Service', 'This description, as OpenAPI 3.1', { response: { contentType: 'application/json', description: 'The OpenAPI 3.1 document.' } }),
  op('GET', '/api/dev/mail', 'Service', 'What the development mail sink received (site admins, outside production)', { response: list('SinkMessage', sinkMessageSchema) }),
];

/** Problems (RFC 9457) every route may answer. */
export const PROBLEM_SCHEMA: NamedSchema = named('Problem', problemSchema);
