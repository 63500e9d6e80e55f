import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  BranchOverview,
  Comparison,
  CreateBranch,
  RestoreDraft,
  RestoreResult,
  SaveVersion,
  StudyHistory,
  UpdateBranch,
  VersionDetail,
  VersionSummary,
} from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';

/** Versions of a study: history, saving, restoring, branching, the baseline and comparison. */
@Injectable({ providedIn: 'root' })
export class VersionApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  private branch(branchId: string): string {
    return `${this.base}/branches/${encodeURIComponent(branchId)}`;
  }

  /** Every branch of the study with its history, and every version, newest first. */
  history(studyId: string): Observable<StudyHistory> {
    return this.http.get<StudyHistory>(`${this.base}/studies/${encodeURIComponent(studyId)}/versions`);
  }

  version(versionId: string): Observable<VersionDetail> {
    return this.http.get<VersionDetail>(`${this.base}/versions/${encodeURIComponent(versionId)}`);
  }

  /** Saves the branch's draft as a version; a head other than `expectedHeadVersionId` answers 409 (`SaveConflict`). */
  save(branchId: string, body: SaveVersion): Observable<VersionSummary> {
    return this.http.post<VersionSummary>(`${this.branch(branchId)}/versions`, body);
  }

  restore(branchId: string, body: RestoreDraft): Observable<RestoreResult> {
    return this.http.post<RestoreResult>(`${this.branch(branchId)}/draft/restore`, body);
  }

  createBranch(versionId: string, body: CreateBranch): Observable<BranchOverview> {
    return this.http.post<BranchOverview>(`${this.base}/versions/${encodeURIComponent(versionId)}/branches`, body);
  }

  updateBranch(branchId: string, body: UpdateBranch): Observable<BranchOverview> {
    return this.http.patch<BranchOverview>(this.branch(branchId), body);
  }

  markBaseline(studyId: string, versionId: string | null): Observable<StudyHistory> {
    return this.http.post<StudyHistory>(`${this.base}/studies/${encodeURIComponent(studyId)}/baseline`, { versionId });
  }

  compare(a: string, b: string): Observable<Comparison> {
    return this.http.get<Comparison>(`${this.base}/compare`, { params: { a, b } });
  }

  /** Where a version's report is: opened by the browser itself (a file to keep or send, not JSON). */
  reportUrl(versionId: string, format: 'html' | 'pdf', download = false): string {
    return `${this.base}/versions/${encodeURIComponent(versionId)}/report.${format}${download ? '?download=1' : ''}`;
  }
}
