import { z } from 'zod';
import { PROJECT_ROLES, type ProjectSettings } from './access';

export * from './access';

export const projectRoleSchema = z.enum(PROJECT_ROLES);

export const projectSettingsSchema = z.object({ engineersMayBranch: z.boolean() }) satisfies z.ZodType<ProjectSettings>;
