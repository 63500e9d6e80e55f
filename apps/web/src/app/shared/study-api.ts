import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CreateStudy, Study, UpdateStudy } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';

/** Studies: the notebooks inside a project. */
@Injectable({ providedIn: 'root' })
export class StudyApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  /** A project's active studies, or with `archived: true` its archived ones. */
  list(projectId: string, options: { archived: boolean }): Observable<Study[]> {
    return this.http.get<Study[]>(`${this.base}/projects/${encodeURIComponent(projectId)}/studies`, {
      params: { archived: String(options.archived) },
    });
  }

  create(projectId: string, body: CreateStudy): Observable<Study> {
    return this.http.post<Study>(`${this.base}/projects/${encodeURIComponent(projectId)}/studies`, body);
  }

  get(studyId: string): Observable<Study> {
    return this.http.get<Study>(`${this.base}/studies/${encodeURIComponent(studyId)}`);
  }

  /** Rename, describe, archive or restore. */
  update(studyId: string, body: UpdateStudy): Observable<Study> {
    return this.http.patch<Study>(`${this.base}/studies/${encodeURIComponent(studyId)}`, body);
  }
}
