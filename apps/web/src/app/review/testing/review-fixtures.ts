import type { Comment, Member, Thread } from '@laminote/contracts';
import { STUDY_ID } from '../../../testing/test-app';

// Invented people of the demo scenario (Tamsk Aerodynamics), as the API returns them.
export const REVIEWER_ID = '4c1f2e3d-5a6b-4c7d-8e9f-0a1b2c3d4e5f';
export const ENGINEER_ID = '5e0c1a2b-3d4f-4a6b-8c9d-0e1f2a3b4c5d';
export const BRANCH_ID = '1b2c3d4e-5f60-4718-89ab-cdef01234567';
export const VERSION_ID = '2c3d4e5f-6071-4829-9abc-def012345678';
export const CELL_ID = '3d4e5f60-7182-493a-abcd-ef0123456789';
export const THREAD_ID = '4e5f6071-8293-4a4b-bcde-f01234567890';

export const MEMBERS: Member[] = [
  { userId: ENGINEER_ID, email: 'dev.arjunan@tamsk.example', name: 'Dev Arjunan', role: 'engineer', hasSignedIn: true, addedAt: '2026-03-02T09:00:00.000Z' },
  { userId: REVIEWER_ID, email: 'lotte.brandvik@tamsk.example', name: 'Lotte Brandvik', role: 'reviewer', hasSignedIn: true, addedAt: '2026-03-02T09:00:00.000Z' },
  { userId: '6a7b8c9d-0e1f-4a2b-8c3d-4e5f6a7b8c9d', email: 'mara.okonkwo@tamsk.example', name: 'Mara Okonkwo', role: 'lead', hasSignedIn: true, addedAt: '2026-03-02T09:00:00.000Z' },
  { userId: '7b8c9d0e-1f2a-4b3c-9d4e-5f6a7b8c9d0e', email: 'pim.vasquez@tamsk.example', name: 'Pim Vasquez', role: 'viewer', hasSignedIn: true, addedAt: '2026-03-02T09:00:00.000Z' },
];

export function comment(overrides: Partial<Comment> = {}): Comment {
  return {
    id: 'a0b1c2d3-e4f5-4a6b-8c7d-9e0f1a2b3c4d',
    threadId: THREAD_ID,
    author: { id: REVIEWER_ID, name: 'Lotte Brandvik' },
    body: 'Is N_crit 9 right for cruise?',
    createdAt: '2026-03-05T10:00:00.000Z',
    editedAt: null,
    revisionCount: 1,
    canEdit: false,
    ...overrides,
  };
}

export function thread(overrides: Partial<Thread> = {}): Thread {
  return {
    id: THREAD_ID,
    studyId: STUDY_ID,
    cellId: CELL_ID,
    origin: { versionId: VERSION_ID, versionNumber: 1, branchId: BRANCH_ID, branchName: 'main' },
    anchor: null,
    resolved: false,
    resolvedAt: null,
    resolvedBy: null,
    createdBy: { id: REVIEWER_ID, name: 'Lotte Brandvik' },
    createdAt: '2026-03-05T10:00:00.000Z',
    comments: [comment()],
    onThisView: true,
    cellChanged: false,
    canResolve: false,
    ...overrides,
  };
}
