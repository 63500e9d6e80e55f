import { and, eq, sql } from 'drizzle-orm';
import type { Tx } from '../db/client';
import { users } from '../db/schema';
import { audit } from '../audit/audit';
import type { SessionUser } from './types';

export interface Identity {
  issuer: string;
  subject: string;
  email: string;
  name: string;
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
      throw new Error('email already bound to another identity');
    }
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
