import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  CommentRevision,
  CreateThread,
  GiveVerdict,
  RequestReview,
  StudyReview,
  Thread,
  VersionReviewDetail,
} from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';
import { checked } from '../core/checked';

/** What a person is looking at while they comment: a saved version, or a branch's draft. */
export type ReviewView = { readonly versionId: string } | { readonly branchId: string };

export function viewParams(view: ReviewView): Record<string, string> {
  return 'versionId' in view ? { versionId: view.versionId } : { branchId: view.branchId };
}

export function viewKey(studyId: string, view: ReviewView): string {
  return `${studyId}|${'versionId' in view ? `v:${view.versionId}` : `b:${view.branchId}`}`;
}

/**
 * Review: comment threads on cells, review requests and verdicts on versions. Thread answers are told
 * relative to the view passed (whether the cell changed since the thread was started).
 */
@Injectable({ providedIn: 'root' })
export class ReviewApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  private thread(threadId: string): string {
    return `${this.base}/threads/${encodeURIComponent(threadId)}`;
  }

  threads(studyId: string, view: ReviewView): Observable<Thread[]> {
    return this.http.get(`${this.base}/studies/${encodeURIComponent(studyId)}/threads`, { params: viewParams(view) }).pipe(checked('threads', 'the comment threads of a study'));
  }

  startThread(studyId: string, body: CreateThread, view: ReviewView): Observable<Thread> {
    return this.http.post(`${this.base}/studies/${encodeURIComponent(studyId)}/threads`, body, { params: viewParams(view) }).pipe(checked('thread', 'a new thread'));
  }

  reply(threadId: string, body: string, view: ReviewView): Observable<Thread> {
    return this.http.post(`${this.thread(threadId)}/comments`, { body }, { params: viewParams(view) }).pipe(checked('thread', 'a thread after a reply'));
  }

  setResolved(threadId: string, resolved: boolean, view: ReviewView): Observable<Thread> {
    return this.http.post(`${this.thread(threadId)}/${resolved ? 'resolve' : 'reopen'}`, {}, { params: viewParams(view) }).pipe(checked('thread', 'a resolved or reopened thread'));
  }

  editComment(commentId: string, body: string, view: ReviewView): Observable<Thread> {
    return this.http.patch(`${this.base}/comments/${encodeURIComponent(commentId)}`, { body }, { params: viewParams(view) }).pipe(checked('thread', 'a thread after an edit'));
  }

  revisions(commentId: string): Observable<CommentRevision[]> {
    return this.http.get(`${this.base}/comments/${encodeURIComponent(commentId)}/revisions`).pipe(checked('commentRevisions', 'the earlier texts of a comment'));
  }

  studyReview(studyId: string): Observable<StudyReview> {
    return this.http.get(`${this.base}/studies/${encodeURIComponent(studyId)}/review`).pipe(checked('studyReview', 'the review state of a study'));
  }

  versionReview(versionId: string): Observable<VersionReviewDetail> {
    return this.http.get(`${this.base}/versions/${encodeURIComponent(versionId)}/review`).pipe(checked('versionReview', 'the review of a version'));
  }

  requestReview(versionId: string, body: RequestReview): Observable<VersionReviewDetail> {
    return this.http.post(`${this.base}/versions/${encodeURIComponent(versionId)}/review-requests`, body).pipe(checked('versionReview', 'a review request'));
  }

  giveVerdict(versionId: string, body: GiveVerdict): Observable<VersionReviewDetail> {
    return this.http.post(`${this.base}/versions/${encodeURIComponent(versionId)}/verdicts`, body).pipe(checked('versionReview', 'a verdict'));
  }
}
