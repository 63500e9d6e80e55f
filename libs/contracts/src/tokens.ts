import { z } from 'zod';

/**
 * Personal API tokens for scripts (settings → API tokens). A token acts as its owner, with the owner's
 * roles, narrowed by its scope: `read` may only read; `run` may also edit drafts, upload tables and
 * run cells. Tokens cannot manage tokens, save versions, comment or give verdicts.
 */
export const TOKEN_SCOPES = ['read', 'run'] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];
export const TOKEN_SCOPE_LABELS: Record<TokenScope, string> = { read: 'Read', run: 'Read and run' };
export const TOKEN_MAX_DAYS = 365;
/** Every token starts with this, so a leaked one is easy to recognise (and to search for). */
export const TOKEN_PREFIX = 'lmn_';

/** POST /api/me/tokens */
export const createTokenSchema = z.object({
  name: z
    .string({ error: 'name is required' })
    .trim()
    .min(1, 'name must not be empty: say what the token is for')
    .max(80, 'name must be at most 80 characters')
    .refine((v) => !/[\u0000-\u001f\u007f]/.test(v), 'name must not contain control characters'),
  scope: z.enum(TOKEN_SCOPES, { error: 'scope must be "read" or "run"' }),
  expiresInDays: z
    .number({ error: 'expiresInDays must be a number of days' })
    .int('expiresInDays must be a whole number of days')
    .min(1, 'expiresInDays must be at least 1')
    .max(TOKEN_MAX_DAYS, `expiresInDays must be at most ${TOKEN_MAX_DAYS}`),
});
export type CreateToken = z.infer<typeof createTokenSchema>;

export const tokenSummarySchema = z.object({
  id: z.string().uuid(),
  name: z.string(),
  scope: z.enum(TOKEN_SCOPES),
  /** The token's first characters, to recognise it by. */
  prefix: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
  revokedAt: z.string().nullable(),
  lastUsedAt: z.string().nullable(),
  state: z.enum(['active', 'expired', 'revoked']),
});
export type TokenSummary = z.infer<typeof tokenSummarySchema>;

/** The answer to creating a token: the only time the token itself is shown. */
export const createdTokenSchema = tokenSummarySchema.extend({ token: z.string() });
export type CreatedToken = z.infer<typeof createdTokenSchema>;
