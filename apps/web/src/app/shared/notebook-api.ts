import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Draft, RunQueued, RunRequest, RunResponse, SaveDraft, StudyOpening, UploadResponse } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';
import { checked } from '../core/checked';

export type ExportFormat = 'csv' | 'json';

/** A study's notebook: branches, the branch draft (autosave), runs, uploads and result exports. */
@Injectable({ providedIn: 'root' })
export class NotebookApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  private branch(branchId: string): string {
    return `${this.base}/branches/${encodeURIComponent(branchId)}`;
  }

  /**
   * The study, its branches and the draft of the branch it opens on (`branch` by id or name, else main),
   * in one read. The address is written out here as early-reads.js writes it, so its early answer fits.
   */
  opening(studyId: string, branch?: string): Observable<StudyOpening> {
    const query = branch ? `?branch=${encodeURIComponent(branch)}` : '';
    return this.http.get(`${this.base}/studies/${encodeURIComponent(studyId)}/opening${query}`).pipe(checked('studyOpening', 'a study as it opens'));
  }

  draft(branchId: string): Observable<Draft> {
    return this.http.get(`${this.branch(branchId)}/draft`).pipe(checked('draft', 'a draft'));
  }

  /** Saves the whole cell stack on top of `baseRevision`; a stale base answers 409 with the server's draft. */
  saveDraft(branchId: string, body: SaveDraft): Observable<Draft> {
    return this.http.put(`${this.branch(branchId)}/draft`, body).pipe(checked('draft', 'a saved draft'));
  }

  /**
   * Runs the named cells (and what they need), or the whole study in dependency order: the draft with
   * what ran when it was done at once, or the job that was queued (follow it with JobsApi).
   */
  run(branchId: string, body: RunRequest): Observable<RunResponse | RunQueued> {
    return this.http.post(`${this.branch(branchId)}/run`, body).pipe(checked('runAnswer', 'the answer to a run'));
  }

  upload(studyId: string, file: File): Observable<UploadResponse> {
    const form = new FormData();
    form.append('file', file, file.name);
    return this.http.post(`${this.base}/studies/${encodeURIComponent(studyId)}/uploads`, form).pipe(checked('uploadedTable', 'an upload'));
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
