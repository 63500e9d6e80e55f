import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq } from 'drizzle-orm';
import { TOKEN_PREFIX, type CreateToken, type CreatedToken, type TokenSummary } from '@laminote/contracts';
import { audit } from '../audit/audit';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { apiTokens, users } from '../db/schema';
import { notFound } from '../http/problem';

type TokenRow = typeof apiTokens.$inferSelect;

export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

function toSummary(row: TokenRow, now = new Date()): TokenSummary {
  return {
    id: row.id,
    name: row.name,
    scope: row.scope,
    prefix: row.prefix,
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
    revokedAt: row.revokedAt?.toISOString() ?? null,
    lastUsedAt: row.lastUsedAt?.toISOString() ?? null,
    state: row.revokedAt ? 'revoked' : row.expiresAt <= now ? 'expired' : 'active',
  };
}

export async function listTokens(tx: Tx, user: SessionUser): Promise<TokenSummary[]> {
  const rows = await tx.select().from(apiTokens).where(eq(apiTokens.userId, user.id)).orderBy(desc(apiTokens.createdAt));
  return rows.map((r) => toSummary(r));
}

export async function createToken(tx: Tx, user: SessionUser, input: CreateToken): Promise<CreatedToken> {
  // 256 random bits: guessing is hopeless, so a plain SHA-256 is a sound way to store it.
  const token = `${TOKEN_PREFIX}${randomBytes(32).toString('base64url')}`;
  const expiresAt = new Date(Date.now() + input.expiresInDays * 86_400_000);
  const [row] = await tx
    .insert(apiTokens)
    .values({ userId: user.id, name: input.name, scope: input.scope, tokenHash: hashToken(token), prefix: token.slice(0, TOKEN_PREFIX.length + 6), expiresAt })
    .returning();
  await audit(tx, { actorId: user.id, action: 'api_token.create', targetType: 'api_token', targetId: row!.id, detail: { name: input.name, scope: input.scope, expiresAt: expiresAt.toISOString() } });
  return { ...toSummary(row!), token };
}

export async function revokeToken(tx: Tx, user: SessionUser, tokenId: string): Promise<TokenSummary> {
  const [row] = await tx.select().from(apiTokens).where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, user.id)));
  if (!row) throw notFound('token');
  if (row.revokedAt) return toSummary(row);
  const [revoked] = await tx.update(apiTokens).set({ revokedAt: new Date() }).where(eq(apiTokens.id, tokenId)).returning();
  await audit(tx, { actorId: user.id, action: 'api_token.revoke', targetType: 'api_token', targetId: tokenId, detail: { name: row.name } });
  return toSummary(revoked!);
}

/** The token's row and its owner, when the token is known, not revoked and not expired. */
export async function findActiveToken(tx: Tx, token: string): Promise<{ token: TokenRow; user: SessionUser } | null> {
  const [row] = await tx
    .select({ token: apiTokens, user: { id: users.id, email: users.email, name: users.name, siteAdmin: users.siteAdmin } })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(eq(apiTokens.tokenHash, hashToken(token)));
  if (!row || row.token.revokedAt || row.token.expiresAt <= new Date()) return null;
  return row;
}

export async function markUsed(tx: Tx, tokenId: string): Promise<void> {
  await tx.update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, tokenId));
}
