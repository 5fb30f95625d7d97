import { randomBytes, scrypt as scryptCb, timingSafeEqual } from 'node:crypto';
import { promisify } from 'node:util';

/**
 * scrypt at OWASP's Password Storage Cheat Sheet parameters (N=2^17, r=8, p=1; 2024 revision).
 * Stored as scrypt$N$r$p$salt$hash (base64url), so parameters can be raised later and old
 * hashes still verify.
 */
const scrypt = promisify(scryptCb) as (pw: string, salt: Buffer, len: number, opts: object) => Promise<Buffer>;
export const SCRYPT_PARAMS = { N: 2 ** 17, r: 8, p: 1, keyLength: 32 } as const;
const maxmem = (N: number, r: number) => 128 * N * r * 2;

export async function hashPassword(password: string): Promise<string> {
  const { N, r, p, keyLength } = SCRYPT_PARAMS;
  const salt = randomBytes(16);
  const key = await scrypt(password, salt, keyLength, { N, r, p, maxmem: maxmem(N, r) });
  return `scrypt$${N}$${r}$${p}$${salt.toString('base64url')}$${key.toString('base64url')}`;
}

/** scrypt$N$r$p$salt$hash, split at '$'. */
type StoredFields = [tag: string, n: string, r: string, p: string, salt: string, hash: string];
const hasSixFields = (parts: string[]): parts is StoredFields => parts.length === 6;

export async function verifyPassword(password: string, stored: string | null | undefined): Promise<boolean> {
  const parts = (stored ?? '').split('$');
  if (!hasSixFields(parts) || parts[0] !== 'scrypt') {
    // Spend the same time as a real check, so timing does not reveal unknown accounts.
    await hashPassword(password);
    return false;
  }
  const [, nText, rText, pText, saltText, hashText] = parts;
  const [N, r, p] = [Number(nText), Number(rText), Number(pText)];
  const salt = Buffer.from(saltText, 'base64url');
  const expected = Buffer.from(hashText, 'base64url');
  const key = await scrypt(password, salt, expected.length, { N, r, p, maxmem: maxmem(N, r) });
  return timingSafeEqual(key, expected);
}

export { PASSWORD_MAX, PASSWORD_MIN } from '../../shared/api/accounts';
