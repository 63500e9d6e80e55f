import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AddMember, CreateProject, Member, Project, UpdateMember, UpdateProject } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';
import { checked } from '../core/checked';

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
    return this.http.get(`${this.base}/projects`).pipe(checked('projects', 'the projects'));
  }

  /** Site admins only. */
  create(body: CreateProject): Observable<Project> {
    return this.http.post(`${this.base}/projects`, body).pipe(checked('project', 'a project'));
  }

  get(projectId: string): Observable<Project> {
    return this.http.get(this.project(projectId)).pipe(checked('project', 'a project'));
  }

  update(projectId: string, body: UpdateProject): Observable<Project> {
    return this.http.patch(this.project(projectId), body).pipe(checked('project', 'a project'));
  }

  members(projectId: string): Observable<Member[]> {
    return this.http.get(`${this.project(projectId)}/members`).pipe(checked('members', 'the members'));
  }

  addMember(projectId: string, body: AddMember): Observable<Member> {
    return this.http.post(`${this.project(projectId)}/members`, body).pipe(checked('member', 'a member'));
  }

  updateMember(projectId: string, userId: string, body: UpdateMember): Observable<Member> {
    return this.http.patch(`${this.project(projectId)}/members/${encodeURIComponent(userId)}`, body).pipe(checked('member', 'a member'));
  }

  removeMember(projectId: string, userId: string): Observable<void> {
    return this.http.delete<void>(`${this.project(projectId)}/members/${encodeURIComponent(userId)}`);
  }
}
