import type { EnvironmentProviders, Provider } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import type { Me, Member, Problem, Project, Study } from '@laminote/contracts';
import { routes } from '../app/app-routes';
import { Auth } from '../app/core/auth';
import { provideLaminoteHttp } from '../app/core/http';
import { PageNavigation } from '../app/core/page-navigation';

/** Records the full-page navigations the app asks for instead of leaving the test page. */
export class RecordingPageNavigation {
  readonly visited: string[] = [];
  assign(url: string): void {
    this.visited.push(url);
  }
}

/** The app's real HTTP setup and routes, with the network replaced by HttpTestingController. */
export function provideTestApp(): (Provider | EnvironmentProviders)[] {
  return [
    provideLaminoteHttp(),
    provideHttpClientTesting(),
    provideRouter(routes, withComponentInputBinding()),
    { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
    { provide: PageNavigation, useClass: RecordingPageNavigation },
  ];
}

export function pageNavigation(): RecordingPageNavigation {
  return TestBed.inject(PageNavigation) as unknown as RecordingPageNavigation;
}

// Invented demo people and projects (Tamsk Aerodynamics, Larkspur T-62), as in the seeded scenario.
export const PROJECT_ID = '7d1b3c52-41a8-4e0c-9a57-3f1f6b2c9e10';
export const OTHER_PROJECT_ID = '2a9e6f0d-5c3b-4d7e-8f12-6b0c4a1e3d55';
export const STUDY_ID = 'c3f5a7e9-0b2d-4f6a-8c1e-3a5b7d9f1e20';

export function me(overrides: { siteAdmin?: boolean; name?: string } = {}): Me {
  return {
    user: {
      id: '5e0c1a2b-3d4f-4a6b-8c9d-0e1f2a3b4c5d',
      email: 'ines.varga@tamsk.example',
      name: overrides.name ?? 'Ines Varga',
      siteAdmin: overrides.siteAdmin ?? false,
    },
    memberships: [{ projectId: PROJECT_ID, projectName: 'Larkspur T-62 wing', role: 'engineer' }],
  };
}

export function project(overrides: Partial<Project> = {}): Project {
  return {
    id: PROJECT_ID,
    name: 'Larkspur T-62 wing',
    description: 'Natural-laminar-flow wing of the invented Larkspur T-62 business jet.',
    role: 'engineer',
    settings: { engineersMayBranch: false },
    studyCount: 2,
    memberCount: 5,
    createdAt: '2026-03-02T09:00:00.000Z',
    ...overrides,
  };
}

export function study(overrides: Partial<Study> = {}): Study {
  return {
    id: STUDY_ID,
    projectId: PROJECT_ID,
    title: 'Cruise upper surface, M 0.78',
    description: 'Invented Cp distribution at cruise.',
    archived: false,
    createdBy: { id: '5e0c1a2b-3d4f-4a6b-8c9d-0e1f2a3b4c5d', name: 'Ines Varga' },
    createdAt: '2026-03-03T10:00:00.000Z',
    updatedAt: '2026-03-04T11:30:00.000Z',
    ...overrides,
  };
}

export function member(overrides: Partial<Member> = {}): Member {
  return {
    userId: '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d',
    email: 'oskar.lind@tamsk.example',
    name: 'Oskar Lind',
    role: 'lead',
    hasSignedIn: true,
    addedAt: '2026-03-02T09:00:00.000Z',
    ...overrides,
  };
}

export function problem(status: number, title: string, extra: Partial<Problem> = {}): Problem {
  return { type: `https://laminote.example/problems/${status}`, title, status, ...extra };
}

/** Answers a request with a problem+json body, as the server does. */
export function problemResponse(status: number, statusText: string) {
  return { status, statusText, headers: { 'content-type': 'application/problem+json' } };
}

/** Starts the app's auth state as the given person, through the real `/api/me` call. */
export async function signInAs(person: Me): Promise<void> {
  const loading = TestBed.inject(Auth).load();
  TestBed.inject(HttpTestingController).expectOne('/api/me').flush(person);
  await loading;
}

export async function signedOut(): Promise<void> {
  const loading = TestBed.inject(Auth).load();
  TestBed.inject(HttpTestingController)
    .expectOne('/api/me')
    .flush(problem(401, 'Sign in first'), problemResponse(401, 'Unauthorized'));
  await loading;
}
