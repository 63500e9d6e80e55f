import { sql } from 'drizzle-orm';
import { boolean, index, jsonb, json, pgTable, text, timestamp, uniqueIndex, uuid, varchar } from 'drizzle-orm/pg-core';

/**
 * People. A user is created at first sign-in (issuer + subject from the identity provider), or earlier
 * when a lead adds them to a project by e-mail; the first sign-in with that e-mail binds the subject.
 */
export const users = pgTable(
  'users',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    issuer: text('issuer'),
    subject: text('subject'),
    email: text('email').notNull(),
    name: text('name').notNull().default(''),
    siteAdmin: boolean('site_admin').notNull().default(false),
    /** Which notifications reach this person by e-mail, by kind; absent kinds are on. */
    notificationPrefs: jsonb('notification_prefs').$type<Record<string, boolean>>().notNull().default({}),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    lastSignInAt: timestamp('last_sign_in_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('users_email_key').on(t.email),
    uniqueIndex('users_issuer_subject_key').on(t.issuer, t.subject).where(sql`${t.subject} is not null`),
  ],
);

/** Server-side sessions, in the table layout connect-pg-simple reads and writes. */
export const sessions = pgTable(
  'session',
  {
    sid: varchar('sid').primaryKey(),
    sess: json('sess').notNull(),
    expire: timestamp('expire', { precision: 6 }).notNull(),
  },
  (t) => [index('session_expire_idx').on(t.expire)],
);
