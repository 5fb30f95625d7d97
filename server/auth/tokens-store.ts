/** Account link tokens (invitations, password resets): rows of account_tokens, by the token's hash. */
import { and, desc, eq, gt, inArray, isNull } from 'drizzle-orm';
import { accountTokens } from '../../db/schema/accounts';
import { db, type Conn, type Tx } from '../db';

export type TokenPurpose = 'invite' | 'reset';
export type TokenRow = typeof accountTokens.$inferSelect;

export async function insertToken(
  values: { userId: number; purpose: TokenPurpose; tokenHash: string; expiresAt: Date; createdBy: number | null },
  tx: Conn = db,
): Promise<void> {
  await tx.insert(accountTokens).values(values);
}

/** Revokes the open tokens of that purpose; returns how many there were. */
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

const usableWhere = (tokenHash: string, purpose: TokenPurpose) =>
  and(
    eq(accountTokens.tokenHash, tokenHash),
    eq(accountTokens.purpose, purpose),
    isNull(accountTokens.usedAt),
    isNull(accountTokens.revokedAt),
    gt(accountTokens.expiresAt, new Date()),
  );

/** The row of a still good (unused, unrevoked, unexpired) token. */
export async function usableTokenRow(tokenHash: string, purpose: TokenPurpose, tx: Conn = db): Promise<TokenRow | undefined> {
  const [row] = await tx.select().from(accountTokens).where(usableWhere(tokenHash, purpose));
  return row;
}

/** The same, locked for the rest of the transaction. */
export async function lockUsableTokenRow(tokenHash: string, purpose: TokenPurpose, tx: Tx): Promise<TokenRow | undefined> {
  const [row] = await tx.select().from(accountTokens).where(usableWhere(tokenHash, purpose)).for('update');
  return row;
}

export async function markUsed(tokenId: number, tx: Conn = db): Promise<void> {
  await tx.update(accountTokens).set({ usedAt: new Date() }).where(eq(accountTokens.id, tokenId));
}

/** The newest invitation token of each given account (for the accounts table). */
export async function latestInvites(userIds: number[], tx: Conn = db): Promise<Map<number, TokenRow>> {
  const latest = new Map<number, TokenRow>();
  if (!userIds.length) return latest;
  const rows = await tx
    .select()
    .from(accountTokens)
    .where(and(inArray(accountTokens.userId, userIds), eq(accountTokens.purpose, 'invite')))
    .orderBy(desc(accountTokens.id));
  for (const row of rows) if (!latest.has(row.userId)) latest.set(row.userId, row);
  return latest;
}
