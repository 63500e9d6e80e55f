import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CreateStudy, ImportStudy, ImportStudyResult, Study, UpdateStudy } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';
import { checked } from '../core/checked';

/** Studies: the notebooks inside a project. */
@Injectable({ providedIn: 'root' })
export class StudyApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  /** A project's active studies, or with `archived: true` its archived ones. */
  list(projectId: string, options: { archived: boolean }): Observable<Study[]> {
    return this.http.get(`${this.base}/projects/${encodeURIComponent(projectId)}/studies`, {
      params: { archived: String(options.archived) },
    }).pipe(checked('studies', 'the studies of a project'));
  }

  create(projectId: string, body: CreateStudy): Observable<Study> {
    return this.http.post(`${this.base}/projects/${encodeURIComponent(projectId)}/studies`, body).pipe(checked('study', 'a new study'));
  }

  get(studyId: string): Observable<Study> {
    return this.http.get(`${this.base}/studies/${encodeURIComponent(studyId)}`).pipe(checked('study', 'a study'));
  }

  /** A study export (from here or another Laminote) made a new study in this project. */
  importStudy(projectId: string, body: ImportStudy): Observable<ImportStudyResult> {
    return this.http.post(`${this.base}/projects/${encodeURIComponent(projectId)}/studies/import`, body).pipe(checked('importedStudy', 'an imported study'));
  }

  /** Rename, describe, archive or restore. */
  update(studyId: string, body: UpdateStudy): Observable<Study> {
    return this.http.patch(`${this.base}/studies/${encodeURIComponent(studyId)}`, body).pipe(checked('study', 'a changed study'));
  }
}
