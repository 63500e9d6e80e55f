import { and, asc, eq, inArray } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import {
  can,
  type ProjectAccess,
  type ReviewRequest,
  type ReviewState,
  type ReviewSummary,
  type StudyReview,
  type Verdict,
  type VerdictKind,
  type VersionReviewDetail,
} from '@laminote/contracts';
import { audit } from '../audit/audit';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { branches, memberships, reviewRequests, users, verdicts, versions } from '../db/schema';
import { badRequest } from '../http/problem';
import { excerpt, notify } from './notify';
import type { StudyRef } from './threads';

/**
 * Review requests and verdicts on versions. Verdicts are immutable; a reviewer's newest verdict on a
 * version is the one that counts, the earlier ones stay on record.
 */
interface VersionRow {
  id: string;
  number: number;
  branchId: string;
  branchName: string;
  parentVersionId: string | null;
  authorId: string | null;
}

interface RequestRow {
  id: string;
  versionId: string;
  reviewerId: string;
  reviewerName: string;
  requestedBy: string | null;
  requesterName: string | null;
  message: string;
  createdAt: Date;
}

interface VerdictRow {
  id: string;
  versionId: string;
  reviewerId: string;
  reviewerName: string;
  verdict: VerdictKind;
  summary: string;
  createdAt: Date;
}

const reviewer = alias(users, 'reviewer');
const requester = alias(users, 'requester');

async function loadVersions(tx: Tx, where: { studyId?: string; versionId?: string }): Promise<VersionRow[]> {
  return tx
    .select({
      id: versions.id,
      number: versions.number,
      branchId: versions.branchId,
      branchName: branches.name,
      parentVersionId: versions.parentVersionId,
      authorId: versions.authorId,
    })
    .from(versions)
    .innerJoin(branches, eq(branches.id, versions.branchId))
    .where(where.versionId ? eq(versions.id, where.versionId) : eq(versions.studyId, where.studyId!));
}

async function loadRequests(tx: Tx, versionIds: string[]): Promise<RequestRow[]> {
  if (versionIds.length === 0) return [];
  return tx
    .select({
      id: reviewRequests.id,
      versionId: reviewRequests.versionId,
      reviewerId: reviewRequests.reviewerId,
      reviewerName: reviewer.name,
      requestedBy: reviewRequests.requestedBy,
      requesterName: requester.name,
      message: reviewRequests.message,
      createdAt: reviewRequests.createdAt,
    })
    .from(reviewRequests)
    .innerJoin(reviewer, eq(reviewer.id, reviewRequests.reviewerId))
    .leftJoin(requester, eq(requester.id, reviewRequests.requestedBy))
    .where(inArray(reviewRequests.versionId, versionIds))
    .orderBy(asc(reviewRequests.createdAt));
}

async function loadVerdicts(tx: Tx, versionIds: string[]): Promise<VerdictRow[]> {
  if (versionIds.length === 0) return [];
  return tx
    .select({
      id: verdicts.id,
      versionId: verdicts.versionId,
      reviewerId: verdicts.reviewerId,
      reviewerName: reviewer.name,
      verdict: verdicts.verdict,
      summary: verdicts.summary,
      createdAt: verdicts.createdAt,
    })
    .from(verdicts)
    .innerJoin(reviewer, eq(reviewer.id, verdicts.reviewerId))
    .where(inArray(verdicts.versionId, versionIds))
    .orderBy(asc(verdicts.createdAt), asc(verdicts.id));
}

/** Per version: the newest verdict of each reviewer (the ones that count). */
function currentVerdicts(rows: VerdictRow[]): Map<string, Map<string, VerdictRow>> {
  const out = new Map<string, Map<string, VerdictRow>>();
  for (const row of rows) {
    const perReviewer = out.get(row.versionId) ?? new Map<string, VerdictRow>();
    perReviewer.set(row.reviewerId, row);
    out.set(row.versionId, perReviewer);
  }
  return out;
}

/** The state of one version from its requests and current verdicts (any "changes requested" wins). */
export function reviewState(requestCount: number, current: readonly VerdictKind[]): ReviewState {
  if (current.includes('changes_requested')) return 'changes_requested';
  if (current.includes('approved')) return 'approved';
  return requestCount > 0 ? 'requested' : 'none';
}

function summarise(versionRows: VersionRow[], requests: RequestRow[], verdictRows: VerdictRow[]): Map<string, ReviewSummary> {
  const current = currentVerdicts(verdictRows);
  const own = new Map<string, Omit<ReviewSummary, 'earlierVerdict'>>();
  for (const v of versionRows) {
    const mine = [...(current.get(v.id)?.values() ?? [])];
    const asked = requests.filter((r) => r.versionId === v.id);
    const answeredBy = new Set(verdictRows.filter((x) => x.versionId === v.id).map((x) => x.reviewerId));
    const pending = new Map<string, string>();
    for (const r of asked) if (!answeredBy.has(r.reviewerId)) pending.set(r.reviewerId, r.reviewerName);
    own.set(v.id, {
      versionId: v.id,
      versionNumber: v.number,
      branchId: v.branchId,
      state: reviewState(asked.length, mine.map((m) => m.verdict)),
      approvals: mine.filter((m) => m.verdict === 'approved').length,
      changesRequested: mine.filter((m) => m.verdict === 'changes_requested').length,
      pendingReviewers: [...pending].map(([id, name]) => ({ id, name })),
    });
  }
  const byId = new Map(versionRows.map((v) => [v.id, v]));
  const out = new Map<string, ReviewSummary>();
  for (const v of versionRows) {
    const summary = own.get(v.id)!;
    let earlierVerdict: ReviewSummary['earlierVerdict'] = null;
    if (summary.approvals + summary.changesRequested === 0) {
      // Follow parents (along the branch, then into the branch it was made from) to the nearest verdict.
      const seen = new Set<string>([v.id]);
      let parentId = v.parentVersionId;
      while (parentId && !seen.has(parentId)) {
        seen.add(parentId);
        const parent = own.get(parentId);
        const parentRow = byId.get(parentId);
        if (!parent || !parentRow) break;
        if (parent.approvals + parent.changesRequested > 0) {
          earlierVerdict = { versionId: parent.versionId, versionNumber: parent.versionNumber, branchName: parentRow.branchName, state: parent.state };
          break;
        }
        parentId = parentRow.parentVersionId;
      }
    }
    out.set(v.id, { ...summary, earlierVerdict });
  }
  return out;
}

export async function studyReview(tx: Tx, studyId: string): Promise<StudyReview> {
  const versionRows = await loadVersions(tx, { studyId });
  const ids = versionRows.map((v) => v.id);
  const summaries = summarise(versionRows, await loadRequests(tx, ids), await loadVerdicts(tx, ids));
  const branchRows = await tx
    .select({ id: branches.id, name: branches.name, headVersionId: branches.headVersionId })
    .from(branches)
    .where(eq(branches.studyId, studyId))
    .orderBy(asc(branches.createdAt));
  return {
    versions: versionRows.sort((a, b) => a.branchName.localeCompare(b.branchName) || b.number - a.number).map((v) => summaries.get(v.id)!),
    branches: branchRows.map((b) => ({
      branchId: b.id,
      branchName: b.name,
      headVersionId: b.headVersionId,
      head: b.headVersionId ? (summaries.get(b.headVersionId) ?? null) : null,
    })),
  };
}

export async function versionReview(tx: Tx, access: ProjectAccess, studyId: string, versionId: string): Promise<VersionReviewDetail> {
  // Parents are needed for "an earlier version's verdict", so the whole study is summarised.
  const versionRows = await loadVersions(tx, { studyId });
  const ids = versionRows.map((v) => v.id);
  const requests = await loadRequests(tx, ids);
  const verdictRows = await loadVerdicts(tx, ids);
  const summary = summarise(versionRows, requests, verdictRows).get(versionId)!;
  const current = currentVerdicts(verdictRows).get(versionId) ?? new Map<string, VerdictRow>();
  const mine = verdictRows.filter((v) => v.versionId === versionId);
  return {
    summary,
    requests: requests
      .filter((r) => r.versionId === versionId)
      .map(
        (r): ReviewRequest => ({
          id: r.id,
          versionId: r.versionId,
          reviewer: { id: r.reviewerId, name: r.reviewerName },
          requestedBy: r.requestedBy ? { id: r.requestedBy, name: r.requesterName ?? '' } : null,
          message: r.message,
          createdAt: r.createdAt.toISOString(),
          answered: mine.some((v) => v.reviewerId === r.reviewerId && v.createdAt >= r.createdAt),
        }),
      ),
    verdicts: mine
      .map(
        (v): Verdict => ({
          id: v.id,
          versionId: v.versionId,
          reviewer: { id: v.reviewerId, name: v.reviewerName },
          verdict: v.verdict,
          summary: v.summary,
          createdAt: v.createdAt.toISOString(),
          current: current.get(v.reviewerId)?.id === v.id,
        }),
      )
      .reverse(),
    canRequest: can(access, 'requestReview'),
    canGiveVerdict: can(access, 'giveVerdict'),
  };
}

function versionLink(studyId: string, versionId: string): string {
  return `/studies/${studyId}/versions/${versionId}`;
}

export async function requestReview(
  tx: Tx,
  publicUrl: string,
  actor: SessionUser,
  study: StudyRef,
  versionId: string,
  input: { reviewerIds: string[]; message: string },
): Promise<void> {
  const [version] = await loadVersions(tx, { versionId });
  if (!version) throw badRequest('no such version');
  const reviewerIds = [...new Set(input.reviewerIds)];
  const roles = await tx
    .select({ userId: memberships.userId, role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.projectId, study.projectId), inArray(memberships.userId, reviewerIds)));
  reviewerIds.forEach((id) => {
    const role = roles.find((r) => r.userId === id)?.role;
    if (!role) throw badRequest(`reviewerIds[${input.reviewerIds.indexOf(id)}]: not a member of this project`, `reviewerIds[${input.reviewerIds.indexOf(id)}]`);
    if (!can({ role, siteAdmin: false }, 'giveVerdict')) {
      throw badRequest(`reviewerIds[${input.reviewerIds.indexOf(id)}]: a ${role} cannot give verdicts; ask a reviewer`, `reviewerIds[${input.reviewerIds.indexOf(id)}]`);
    }
  });
  await tx.insert(reviewRequests).values(reviewerIds.map((reviewerId) => ({ versionId, reviewerId, requestedBy: actor.id, message: input.message })));
  await notify(tx, publicUrl, {
    kind: 'reviewRequest',
    recipientIds: reviewerIds,
    actor,
    projectId: study.projectId,
    study,
    title: `${actor.name} asks you to review version ${version.number} (${version.branchName})`,
    excerpt: excerpt(input.message),
    link: versionLink(study.id, versionId),
    refs: { versionId, versionNumber: version.number },
  });
  await audit(tx, { actorId: actor.id, projectId: study.projectId, action: 'review.request', targetType: 'version', targetId: versionId, detail: { reviewerIds } });
}

export async function giveVerdict(
  tx: Tx,
  publicUrl: string,
  actor: SessionUser,
  study: StudyRef,
  versionId: string,
  input: { verdict: VerdictKind; summary: string },
): Promise<void> {
  const [version] = await loadVersions(tx, { versionId });
  if (!version) throw badRequest('no such version');
  const [row] = await tx.insert(verdicts).values({ versionId, reviewerId: actor.id, verdict: input.verdict, summary: input.summary }).returning();
  const askedBy = await tx.selectDistinct({ id: reviewRequests.requestedBy }).from(reviewRequests).where(eq(reviewRequests.versionId, versionId));
  const memberIds = new Set((await tx.select({ id: memberships.userId }).from(memberships).where(eq(memberships.projectId, study.projectId))).map((m) => m.id));
  await notify(tx, publicUrl, {
    kind: 'verdict',
    recipientIds: [version.authorId, ...askedBy.map((a) => a.id)].filter((id): id is string => id !== null && memberIds.has(id)),
    actor,
    projectId: study.projectId,
    study,
    title: verdictTitle(actor.name, input.verdict, `version ${version.number} (${version.branchName})`),
    excerpt: excerpt(input.summary),
    link: versionLink(study.id, versionId),
    refs: { versionId, versionNumber: version.number, verdict: input.verdict },
  });
  await audit(tx, { actorId: actor.id, projectId: study.projectId, action: 'review.verdict', targetType: 'version', targetId: versionId, detail: { verdict: input.verdict, verdictId: row!.id } });
}

/** The version and its study, to check access first. */
export async function versionStudy(tx: Tx, versionId: string): Promise<{ studyId: string } | null> {
  const [row] = await tx.select({ studyId: versions.studyId }).from(versions).where(eq(versions.id, versionId));
  return row ?? null;
}

/** The inbox and e-mail line of a verdict, in Laminote's review words (the web app's verdict-words). */
function verdictTitle(reviewer: string, verdict: VerdictKind, version: string): string {
  return verdict === 'approved' ? `${reviewer} cleared ${version}` : `${reviewer} sent ${version} back for rework`;
}
