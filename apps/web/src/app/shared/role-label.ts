import type { ProjectRole } from '@laminote/contracts';

export const ROLE_LABELS: Readonly<Record<ProjectRole, string>> = {
  lead: 'Lead',
  engineer: 'Engineer',
  reviewer: 'Reviewer',
  viewer: 'Viewer',
};

/** A site admin who is not a member sees a project with role `null`. */
export function roleLabel(role: ProjectRole | null, siteAdmin: boolean): string {
  if (role) return ROLE_LABELS[role];
  return siteAdmin ? 'Site admin' : 'No role';
}
