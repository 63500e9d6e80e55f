import { bigint, index, integer, pgTable, text, timestamp, uniqueIndex, uuid, varchar } from 'drizzle-orm/pg-core';
import { users } from './identity';

/**
 * Personal API tokens for scripts. The token itself is shown once at creation and never stored: only
 * its SHA-256 (a random 256-bit secret needs no slow hash) and a short prefix to recognise it by.
 * Rows are kept after revocation or expiry, so the list and the audit log can still name them.
 */
export const apiTokens = pgTable(
  'api_tokens',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    /** `read`: GET only; `run`: also edit drafts, upload tables and run cells. */
    scope: text('scope', { enum: ['read', 'run'] }).notNull(),
    tokenHash: text('token_hash').notNull(),
    /** The first characters of the token, shown in the list. */
    prefix: text('prefix').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
  },
  (t) => [uniqueIndex('api_tokens_hash_key').on(t.tokenHash), index('api_tokens_user_idx').on(t.userId)],
);

/**
 * Request budgets (sign-in attempts per client address, requests per API token), shared by every app
 * server on the database so N servers do not give N budgets. The layout is the one rate-limiter-flexible's
 * PostgreSQL store reads and writes: `key` (its prefix and the caller), the points used in the current
 * window, and when that window ends (ms since the epoch). Expired rows are pruned by the retention job.
 */
export const rateLimits = pgTable('rate_limits', {
  key: varchar('key', { length: 255 }).primaryKey(),
  points: integer('points').notNull().default(0),
  expire: bigint('expire', { mode: 'number' }),
});
