import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Branch, Draft, RunRequest, RunResponse, SaveDraft, UploadResponse } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';

export type ExportFormat = 'csv' | 'json';

/** A study's notebook: branches, the branch draft (autosave), runs, uploads and result exports. */
@Injectable({ providedIn: 'root' })
export class NotebookApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  private branch(branchId: string): string {
    return `${this.base}/branches/${encodeURIComponent(branchId)}`;
  }

  branches(studyId: string): Observable<Branch[]> {
    return this.http.get<Branch[]>(`${this.base}/studies/${encodeURIComponent(studyId)}/branches`);
  }

  draft(branchId: string): Observable<Draft> {
    return this.http.get<Draft>(`${this.branch(branchId)}/draft`);
  }

  /** Saves the whole cell stack on top of `baseRevision`; a stale base answers 409 with the server's draft. */
  saveDraft(branchId: string, body: SaveDraft): Observable<Draft> {
    return this.http.put<Draft>(`${this.branch(branchId)}/draft`, body);
  }

  /** Runs the named cells (and what they need), or the whole study in dependency order. */
  run(branchId: string, body: RunRequest): Observable<RunResponse> {
    return this.http.post<RunResponse>(`${this.branch(branchId)}/run`, body);
  }

  upload(studyId: string, file: File): Observable<UploadResponse> {
    const form = new FormData();
    form.append('file', file, file.name);
    return this.http.post<UploadResponse>(`${this.base}/studies/${encodeURIComponent(studyId)}/uploads`, form);
  }

  /** Where a cell's result downloads from (a plain GET, so a link can fetch it with the session cookie). */
  exportUrl(branchId: string, cellId: string, format: ExportFormat): string {
    return `${this.branch(branchId)}/cells/${encodeURIComponent(cellId)}/export?format=${format}`;
  }

  /** Where the whole study of a branch's draft downloads from: one document that `aero study` recomputes. */
  studyExportUrl(branchId: string): string {
    return `${this.branch(branchId)}/export`;
  }
}
