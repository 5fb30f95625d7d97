import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, gt, inArray, isNull } from 'drizzle-orm';
import { accountTokens } from '../../db/schema/accounts';
import { db, type Conn, type Tx } from '../db';

export type TokenPurpose = 'invite' | 'reset';

/**
 * Single-use e-mail link tokens. 32 random bytes (256 bits, well above the 128 bits the OWASP
 * Forgot Password Cheat Sheet asks for); only the SHA-256 of the token is stored, so a copy
 * of the database cannot be turned into working links.
 */
export const hashToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

/** Tokens are base64url of 32 bytes: 43 characters. Anything else is rejected before a lookup. */
export const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

/** Revokes the open tokens of that purpose, then issues a fresh one. Returns the clear token. */
export async function issueToken(
  userId: number,
  purpose: TokenPurpose,
  lifetimeMs: number,
  createdBy: number | null,
  tx: Conn = db,
): Promise<{ token: string; expiresAt: Date }> {
  await revokeTokens(userId, purpose, tx);
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + lifetimeMs);
  await tx.insert(accountTokens).values({ userId, purpose, tokenHash: hashToken(token), expiresAt, createdBy });
  return { token, expiresAt };
}

export async function revokeTokens(userId: number, purpose: TokenPurpose, tx: Conn = db): Promise<number> {
  const [result] = await tx
    .update(accountTokens)
    .set({ revokedAt: new Date() })
    .where(
      and(
        eq(accountTokens.userId, userId),
        eq(accountTokens.purpose, purpose),
        isNull(accountTokens.usedAt),
        isNull(accountTokens.revokedAt),
      ),
    );
  return (result as { affectedRows?: number }).affectedRows ?? 0;
}

export type TokenRow = typeof accountTokens.$inferSelect;

/** The token row if the link is still good (unused, unrevoked, unexpired). */
export async function findUsableToken(token: string, purpose: TokenPurpose, tx: Conn = db): Promise<TokenRow | undefined> {
  return usableToken(token, purpose, false, tx);
}

/** The token row if the link is still good, locked for the rest of the transaction. */
export async function lockUsableToken(token: string, purpose: TokenPurpose, tx: Tx): Promise<TokenRow | undefined> {
  return usableToken(token, purpose, true, tx);
}

async function usableToken(token: string, purpose: TokenPurpose, lock: boolean, tx: Conn): Promise<TokenRow | undefined> {
  if (!TOKEN_PATTERN.test(token)) return undefined;
  const query = tx
    .select()
    .from(accountTokens)
    .where(
      and(
        eq(accountTokens.tokenHash, hashToken(token)),
        eq(accountTokens.purpose, purpose),
        isNull(accountTokens.usedAt),
        isNull(accountTokens.revokedAt),
        gt(accountTokens.expiresAt, new Date()),
      ),
    );
  const [row] = lock ? await query.for('update') : await query;
  return row;
}

export async function markUsed(tokenId: number, tx: Conn = db): Promise<void> {
  await tx.update(accountTokens).set({ usedAt: new Date() }).where(eq(accountTokens.id, tokenId));
}

/** The newest invitation token of each given account (for the accounts table). */
export async function latestInvites(userIds: number[]): Promise<Map<number, TokenRow>> {
  const latest = new Map<number, TokenRow>();
  if (!userIds.length) return latest;
  const rows = await db
    .select()
    .from(accountTokens)
    .where(and(inArray(accountTokens.userId, userIds), eq(accountTokens.purpose, 'invite')))
    .orderBy(desc(accountTokens.id));
  for (const row of rows) if (!latest.has(row.userId)) latest.set(row.userId, row);
  return latest;
}
