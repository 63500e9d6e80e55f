import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AddMember, CreateProject, Member, Project, UpdateMember, UpdateProject } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';

/** Projects and their members. */
@Injectable({ providedIn: 'root' })
export class ProjectApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  private project(projectId: string): string {
    return `${this.base}/projects/${encodeURIComponent(projectId)}`;
  }

  /** The caller's projects with their role in each (a site admin sees all of them). */
  list(): Observable<Project[]> {
    return this.http.get<Project[]>(`${this.base}/projects`);
  }

  /** Site admins only. */
  create(body: CreateProject): Observable<Project> {
    return this.http.post<Project>(`${this.base}/projects`, body);
  }

  get(projectId: string): Observable<Project> {
    return this.http.get<Project>(this.project(projectId));
  }

  update(projectId: string, body: UpdateProject): Observable<Project> {
    return this.http.patch<Project>(this.project(projectId), body);
  }

  members(projectId: string): Observable<Member[]> {
    return this.http.get<Member[]>(`${this.project(projectId)}/members`);
  }

  addMember(projectId: string, body: AddMember): Observable<Member> {
    return this.http.post<Member>(`${this.project(projectId)}/members`, body);
  }

  updateMember(projectId: string, userId: string, body: UpdateMember): Observable<Member> {
    return this.http.patch<Member>(`${this.project(projectId)}/members/${encodeURIComponent(userId)}`, body);
  }

  removeMember(projectId: string, userId: string): Observable<void> {
    return this.http.delete<void>(`${this.project(projectId)}/members/${encodeURIComponent(userId)}`);
  }
}
