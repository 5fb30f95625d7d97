import { createHash, randomBytes } from 'node:crypto';
import { db, type Conn, type Tx } from '../db';
import { insertToken, lockUsableTokenRow, revokeTokens, usableTokenRow, type TokenPurpose, type TokenRow } from './tokens-store';

export { latestInvites, markUsed, revokeTokens, type TokenPurpose, type TokenRow } from './tokens-store';

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
  await insertToken({ userId, purpose, tokenHash: hashToken(token), expiresAt, createdBy }, tx);
  return { token, expiresAt };
}

/** The token row if the link is still good (unused, unrevoked, unexpired). */
export async function findUsableToken(token: string, purpose: TokenPurpose, tx: Conn = db): Promise<TokenRow | undefined> {
  if (!TOKEN_PATTERN.test(token)) return undefined;
  return usableTokenRow(hashToken(token), purpose, tx);
}

/** The token row if the link is still good, locked for the rest of the transaction. */
export async function lockUsableToken(token: string, purpose: TokenPurpose, tx: Tx): Promise<TokenRow | undefined> {
  if (!TOKEN_PATTERN.test(token)) return undefined;
  return lockUsableTokenRow(hashToken(token), purpose, tx);
}
