import { z } from 'zod';
import { safeText } from './text';
import { projectRoleSchema, projectSettingsSchema } from './roles';

/**
 * Request and response shapes of the foundation API (`/api/me`, projects, members, studies).
 * Every error answers `application/problem+json` (RFC 9457) as `Problem`.
 */

export const problemSchema = z.object({
  type: z.string(),
  title: z.string(),
  status: z.number().int(),
  detail: z.string().optional(),
  /** For bad input: where it is wrong, e.g. `email`, `cells[2].inputs.reynolds`, `pressureTable line 7`. */
  field: z.string().optional(),
  errors: z.array(z.object({ field: z.string(), message: z.string() })).optional(),
});
export type Problem = z.infer<typeof problemSchema>;

const isoDate = z.string();
const id = z.string().uuid();

export const userSchema = z.object({
  id,
  email: z.string(),
  name: z.string(),
  siteAdmin: z.boolean(),
});
export type User = z.infer<typeof userSchema>;

export const membershipSummarySchema = z.object({
  projectId: id,
  projectName: z.string(),
  role: projectRoleSchema,
});
export type MembershipSummary = z.infer<typeof membershipSummarySchema>;

/** GET /api/me */
export const meSchema = z.object({
  user: userSchema,
  memberships: z.array(membershipSummarySchema),
});
export type Me = z.infer<typeof meSchema>;

/** GET /api/projects (the caller's projects; a site admin sees all, with role null where not a member) */
export const projectSchema = z.object({
  id,
  name: z.string(),
  description: z.string(),
  role: projectRoleSchema.nullable(),
  settings: projectSettingsSchema,
  studyCount: z.number().int(),
  memberCount: z.number().int(),
  createdAt: isoDate,
});
export type Project = z.infer<typeof projectSchema>;

const name = (field: string, max: number) =>
  safeText(field)
    .trim()
    .min(1, `${field} must not be empty`)
    .max(max, `${field} must be at most ${max} characters`);

/** POST /api/projects (site admins) */
export const createProjectSchema = z.object({
  name: name('name', 120),
  description: safeText('description').max(2000, 'description must be at most 2000 characters').default(''),
  leadEmail: safeText('leadEmail').trim().toLowerCase().email('leadEmail must be an e-mail address'),
});
export type CreateProject = z.input<typeof createProjectSchema>;

/** PATCH /api/projects/:projectId (leads, site admins) */
export const updateProjectSchema = z.object({
  name: name('name', 120).optional(),
  description: safeText('description').max(2000, 'description must be at most 2000 characters').optional(),
  settings: projectSettingsSchema.partial().optional(),
});
export type UpdateProject = z.input<typeof updateProjectSchema>;

/** GET /api/projects/:projectId/members */
export const memberSchema = z.object({
  userId: id,
  email: z.string(),
  name: z.string(),
  role: projectRoleSchema,
  /** False until the person first signs in. */
  hasSignedIn: z.boolean(),
  addedAt: isoDate,
});
export type Member = z.infer<typeof memberSchema>;

/** POST /api/projects/:projectId/members (leads) */
export const addMemberSchema = z.object({
  email: safeText('email').trim().toLowerCase().email('email must be an e-mail address'),
  role: projectRoleSchema,
  name: safeText('name').trim().max(120).optional(),
});
export type AddMember = z.input<typeof addMemberSchema>;

/** PATCH /api/projects/:projectId/members/:userId (leads) */
export const updateMemberSchema = z.object({ role: projectRoleSchema });
export type UpdateMember = z.infer<typeof updateMemberSchema>;

/** GET /api/projects/:projectId/studies, GET /api/studies/:studyId */
export const studySchema = z.object({
  id,
  projectId: id,
  title: z.string(),
  description: z.string(),
  archived: z.boolean(),
  createdBy: z.object({ id, name: z.string() }).nullable(),
  createdAt: isoDate,
  updatedAt: isoDate,
});
export type Study = z.infer<typeof studySchema>;

/** POST /api/projects/:projectId/studies (engineers, leads) */
export const createStudySchema = z.object({
  title: name('title', 200),
  description: safeText('description').max(4000, 'description must be at most 4000 characters').default(''),
});
export type CreateStudy = z.input<typeof createStudySchema>;

/** PATCH /api/studies/:studyId (engineers, leads): rename, describe, archive or restore */
export const updateStudySchema = z
  .object({
    title: name('title', 200).optional(),
    description: safeText('description').max(4000, 'description must be at most 4000 characters').optional(),
    archived: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'nothing to change: give title, description or archived' });
export type UpdateStudy = z.input<typeof updateStudySchema>;

/** POST /auth/logout answers where the browser goes next (the provider's end-session page). */
export const logoutSchema = z.object({ redirectTo: z.string() });
export type Logout = z.infer<typeof logoutSchema>;

/** GET /api/studies/:studyId/branches */
export const branchSchema = z.object({
  id,
  studyId: id,
  name: z.string(),
  purpose: z.string(),
  forkedFromVersionId: id.nullable(),
  headVersionId: id.nullable(),
  /** The head version's number on its branch (null before the first version). */
  headNumber: z.number().int().nullable().optional(),
  archived: z.boolean(),
  createdBy: z.object({ id, name: z.string() }).nullable(),
  createdAt: isoDate,
});
export type Branch = z.infer<typeof branchSchema>;
