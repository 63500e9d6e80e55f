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
import { checked } from '../core/checked';

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
    return this.http.get(`${this.base}/studies/${encodeURIComponent(studyId)}/versions`).pipe(checked('studyHistory', 'a study history'));
  }

  version(versionId: string): Observable<VersionDetail> {
    return this.http.get(`${this.base}/versions/${encodeURIComponent(versionId)}`).pipe(checked('versionDetail', 'a version'));
  }

  /** Saves the branch's draft as a version; a head other than `expectedHeadVersionId` answers 409 (`SaveConflict`). */
  save(branchId: string, body: SaveVersion): Observable<VersionSummary> {
    return this.http.post(`${this.branch(branchId)}/versions`, body).pipe(checked('versionSummary', 'a saved version'));
  }

  restore(branchId: string, body: RestoreDraft): Observable<RestoreResult> {
    return this.http.post(`${this.branch(branchId)}/draft/restore`, body).pipe(checked('restoreResult', 'a restore'));
  }

  createBranch(versionId: string, body: CreateBranch): Observable<BranchOverview> {
    return this.http.post(`${this.base}/versions/${encodeURIComponent(versionId)}/branches`, body).pipe(checked('branchOverview', 'a branch'));
  }

  updateBranch(branchId: string, body: UpdateBranch): Observable<BranchOverview> {
    return this.http.patch(this.branch(branchId), body).pipe(checked('branchOverview', 'a branch'));
  }

  markBaseline(studyId: string, versionId: string | null): Observable<StudyHistory> {
    return this.http.post(`${this.base}/studies/${encodeURIComponent(studyId)}/baseline`, { versionId }).pipe(checked('studyHistory', 'a study history'));
  }

  compare(a: string, b: string): Observable<Comparison> {
    return this.http.get(`${this.base}/compare`, { params: { a, b } }).pipe(checked('comparison', 'a comparison'));
  }

  /** Where the report of A against B is (one self-contained HTML file, or a PDF), opened by the browser itself. */
  compareReportUrl(a: string, b: string, format: 'html' | 'pdf' = 'html', download = false): string {
    return `${this.base}/compare/report.${format}?a=${encodeURIComponent(a)}&b=${encodeURIComponent(b)}${download ? '&download=1' : ''}`;
  }

  /** Where a version's whole study downloads from: one document that `aero study` recomputes, or another Laminote imports. */
  studyExportUrl(versionId: string): string {
    return `${this.base}/versions/${encodeURIComponent(versionId)}/export`;
  }

  /** Where a version's report is: opened by the browser itself (a file to keep or send, not JSON). */
  reportUrl(versionId: string, format: 'html' | 'pdf', download = false): string {
    return `${this.base}/versions/${encodeURIComponent(versionId)}/report.${format}${download ? '?download=1' : ''}`;
  }
}
