import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';
import { config } from '../config';

/**
 * A participant keeps one link for the whole workshop, so the facilitator must be able to show
 * it again (a reprinted sheet, a second e-mail). The token is still looked up by its SHA-256
 * only; beside the hash we keep a sealed copy: AES-256-GCM (NIST SP 800-38D) with a 96-bit
 * random nonce and a 128-bit tag, under a key derived from LINK_SECRET with HKDF-SHA256
 * (RFC 5869). A copy of the database without the environment gives no working link, and a
 * tampered copy fails to open instead of showing a wrong link. Format: `v1.` + base64url of
 * nonce (12 bytes) | tag (16 bytes) | ciphertext.
 */
const VERSION = 'v1.';
let cachedKey: { secret: string; key: Buffer } | undefined;

function key(): Buffer {
  if (cachedKey?.secret !== config.LINK_SECRET) {
    const derived = Buffer.from(hkdfSync('sha256', config.LINK_SECRET, 'ripplehall', 'participant-link-seal v1', 32));
    cachedKey = { secret: config.LINK_SECRET, key: derived };
  }
  return cachedKey.key;
}

export function sealToken(token: string): string {
  const nonce = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', key(), nonce);
  const body = Buffer.concat([cipher.update(token, 'utf8'), cipher.final()]);
  return VERSION + Buffer.concat([nonce, cipher.getAuthTag(), body]).toString('base64url');
}

/** The token, or undefined when the copy was sealed under another key or was altered. */
export function openToken(sealed: string | null): string | undefined {
  if (!sealed?.startsWith(VERSION)) return undefined;
  const raw = Buffer.from(sealed.slice(VERSION.length), 'base64url');
  if (raw.length < 29) return undefined;
  try {
    const decipher = createDecipheriv('aes-256-gcm', key(), raw.subarray(0, 12));
    decipher.setAuthTag(raw.subarray(12, 28));
    return Buffer.concat([decipher.update(raw.subarray(28)), decipher.final()]).toString('utf8');
  } catch {
    return undefined;
  }
}
