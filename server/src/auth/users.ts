import { and, eq, sql } from 'drizzle-orm';
import type { Tx } from '../db/client';
import { users } from '../db/schema';
import { audit } from '../audit/audit';
import type { SessionUser } from './types';

export interface Identity {
  issuer: string;
  subject: string;
  email: string;
  /** Whether the provider says the e-mail address is the person's (the `email_verified` claim). */
  emailVerified: boolean;
  name: string;
}

/** A first sign-in would take over a person added by e-mail, but the provider has not verified the address. */
export class UnverifiedEmailError extends Error {
  constructor() {
    super('Your identity provider has not verified your e-mail address, so Laminote cannot match you to the person a project lead added. Verify the address with your provider, then sign in again.');
  }
}

/** The e-mail address is already someone else's sign-in. */
export class EmailTakenError extends Error {
  constructor() {
    super('This e-mail address already belongs to another sign-in. Ask a site admin.');
  }
}

/**
 * Create or update the user behind a sign-in. A person added to a project by e-mail before they ever
 * signed in is bound to their identity here, by e-mail, on their first sign-in.
 */
export async function upsertUserFromIdentity(tx: Tx, identity: Identity): Promise<SessionUser> {
  const email = identity.email.trim().toLowerCase();
  const [bySubject] = await tx
    .select()
    .from(users)
    .where(and(eq(users.issuer, identity.issuer), eq(users.subject, identity.subject)));
  const existing = bySubject ?? (await tx.select().from(users).where(eq(users.email, email)))[0];
  if (existing) {
    if (existing.subject && existing.subject !== identity.subject && !bySubject) {
      // The e-mail belongs to another identity: refuse rather than merge two people.
      throw new EmailTakenError();
    }
    // Binding a pre-added person to whoever signs in with that address needs the provider's word that
    // the address is theirs; otherwise anyone could register the address at a lax provider.
    if (!bySubject && !identity.emailVerified) throw new UnverifiedEmailError();
    const [row] = await tx
      .update(users)
      .set({ issuer: identity.issuer, subject: identity.subject, email, name: identity.name || existing.name, lastSignInAt: sql`now()` })
      .where(eq(users.id, existing.id))
      .returning();
    await audit(tx, { actorId: row!.id, action: 'user.signIn', targetType: 'user', targetId: row!.id });
    return toSessionUser(row!);
  }
  const [row] = await tx
    .insert(users)
    .values({ issuer: identity.issuer, subject: identity.subject, email, name: identity.name || email, lastSignInAt: sql`now()` })
    .returning();
  await audit(tx, { actorId: row!.id, action: 'user.create', targetType: 'user', targetId: row!.id, detail: { email } });
  return toSessionUser(row!);
}

export async function findSessionUser(tx: Tx, id: string): Promise<SessionUser | null> {
  const [row] = await tx.select().from(users).where(eq(users.id, id));
  return row ? toSessionUser(row) : null;
}

function toSessionUser(row: typeof users.$inferSelect): SessionUser {
  return { id: row.id, email: row.email, name: row.name, siteAdmin: row.siteAdmin };
}
