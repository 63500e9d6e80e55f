/**
 * Who may do what in a project, in plain data. Zod-free on purpose, so the web app's first screen can
 * hide what a person cannot do without loading the schemas (`@laminote/contracts/access`); the schemas
 * of roles and settings are in `roles.ts`.
 */

/** A member's role in a project. Site admin is a flag on the user, not a role. */
export const PROJECT_ROLES = ['lead', 'engineer', 'reviewer', 'viewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

/** What a caller may do in a project. The server enforces these; the web app only hides what it cannot do. */
export type ProjectAction =
  | 'read'
  | 'editStudy'
  | 'runCells'
  | 'saveVersion'
  | 'branch'
  | 'markBaseline'
  | 'manageMembers'
  | 'manageSettings'
  | 'comment'
  | 'giveVerdict'
  | 'requestReview';

const MATRIX: Record<ProjectAction, readonly ProjectRole[]> = {
  read: ['lead', 'engineer', 'reviewer', 'viewer'],
  editStudy: ['lead', 'engineer'],
  runCells: ['lead', 'engineer'],
  saveVersion: ['lead', 'engineer'],
  // Engineers may also branch when the project's settings allow it; see `canBranch`.
  branch: ['lead'],
  markBaseline: ['lead'],
  manageMembers: ['lead'],
  manageSettings: ['lead'],
  comment: ['lead', 'engineer', 'reviewer'],
  giveVerdict: ['reviewer'],
  requestReview: ['lead', 'engineer'],
};

export interface ProjectSettings {
  /** When true, engineers may branch design variants as well as leads. */
  engineersMayBranch: boolean;
}

export const DEFAULT_PROJECT_SETTINGS: ProjectSettings = { engineersMayBranch: false };

/**
 * The effective access a caller has in a project: their membership role, or for a site admin who is not a
 * member, read access plus member and settings management (admins run projects; they do not edit designs).
 */
export interface ProjectAccess {
  role: ProjectRole | null;
  siteAdmin: boolean;
  settings?: ProjectSettings;
}

export function can(access: ProjectAccess, action: ProjectAction): boolean {
  if (access.role && MATRIX[action].includes(access.role)) return true;
  if (action === 'branch' && access.role === 'engineer' && access.settings?.engineersMayBranch) return true;
  if (access.siteAdmin) return action === 'read' || action === 'manageMembers' || action === 'manageSettings';
  return false;
}
