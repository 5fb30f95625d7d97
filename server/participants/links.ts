import { randomBytes } from 'node:crypto';
import { hashToken, TOKEN_PATTERN } from '../auth/tokens';
import { publicUrl } from '../config';
import { db, type Conn } from '../db';
import { openToken, sealToken } from './link-seal';
import {
  insertLinks,
  linkHolderByHash,
  liveLinksOf,
  revokeLinkByHash,
  revokeLinksOf,
  setJoinCode,
  touchLink,
  workshopByJoinHash,
  type LinkHolder,
} from './links-store';

export type { LinkHolder } from './links-store';

/**
 * Personal participant links. A token is 32 random bytes from the operating system's CSPRNG
 * (256 bits; the OWASP Session Management Cheat Sheet asks for at least 64 bits of entropy,
 * our brief for 128). Links are looked up by the token's SHA-256, so the hash column alone gives
 * no working link. A participant keeps one link: printing a sheet or e-mailing again shows the
 * same live link (from its sealed copy, see link-seal.ts); only an explicit reissue or revoke by
 * the facilitator ends it.
 */
export type LinkChannel = 'email' | 'sheet' | 'join';
const DAY_MS = 24 * 3600 * 1000;

export const newToken = () => randomBytes(32).toString('base64url');
export const participantUrl = (token: string) => `${publicUrl().replace(/\/+$/, '')}/p/${token}`;
export const joinUrl = (code: string) => `${publicUrl().replace(/\/+$/, '')}/p/join/${code}`;

export interface ShownLink {
  participantId: number;
  token: string;
  expiresAt: Date;
  /** True when this call issued the link (nobody has seen it yet). */
  fresh: boolean;
}

/** Issues a fresh link for each participant (their earlier links stay as they are). */
export async function issueLinks(
  participantIds: number[],
  channel: LinkChannel,
  days: number,
  tx: Conn = db,
): Promise<Map<number, ShownLink>> {
  const out = new Map<number, ShownLink>();
  if (!participantIds.length) return out;
  const expiresAt = new Date(Date.now() + days * DAY_MS);
  const rows = participantIds.map((participantId) => {
    const token = newToken();
    out.set(participantId, { participantId, token, expiresAt, fresh: true });
    return { participantId, tokenHash: hashToken(token), tokenSealed: sealToken(token), channel, expiresAt };
  });
  await insertLinks(rows, tx);
  return out;
}

/**
 * Each participant's live link, reused when one can be shown again (the newest-expiring live
 * link with a sealed copy that opens), otherwise a new one. Never revokes anything.
 */
export async function linksFor(
  participantIds: number[],
  channel: LinkChannel,
  days: number,
  tx: Conn = db,
): Promise<Map<number, ShownLink>> {
  const out = new Map<number, ShownLink>();
  if (!participantIds.length) return out;
  const live = await liveLinksOf(participantIds, tx);
  for (const row of live) {
    if (out.has(row.participantId)) continue;
    const token = openToken(row.sealed);
    if (token) out.set(row.participantId, { participantId: row.participantId, token, expiresAt: row.expiresAt, fresh: false });
  }
  const missing = participantIds.filter((id) => !out.has(id));
  for (const [id, link] of await issueLinks(missing, channel, days, tx)) out.set(id, link);
  return out;
}

/** The explicit, confirmed action: end the chosen people's links and give each a new one. */
export async function reissueLinks(participantIds: number[], days: number, tx: Conn = db): Promise<Map<number, ShownLink>> {
  await revokeLinks(participantIds, tx);
  return issueLinks(participantIds, 'sheet', days, tx);
}

/** Ends one link by its token (an e-mail that never left: nobody holds that link). */
export async function revokeToken(token: string, tx: Conn = db): Promise<void> {
  await revokeLinkByHash(hashToken(token), tx);
}

export async function revokeLinks(participantIds: number[], tx: Conn = db): Promise<number> {
  if (!participantIds.length) return 0;
  return revokeLinksOf(participantIds, tx);
}

/** The participant behind a usable (well-formed, known, unrevoked, unexpired) token, else undefined. */
export async function findLinkHolder(token: string): Promise<LinkHolder | undefined> {
  if (!TOKEN_PATTERN.test(token)) return undefined;
  const row = await linkHolderByHash(hashToken(token));
  if (!row) return undefined;
  await touchLink(row.linkId);
  return row;
}

/** The workshop behind a usable join code (the projector QR code), else undefined. */
export async function findJoinWorkshop(code: string): Promise<number | undefined> {
  if (!TOKEN_PATTERN.test(code)) return undefined;
  return workshopByJoinHash(hashToken(code));
}

/** A fresh join code (the earlier one stops working). */
export async function issueJoinCode(workshopId: number, days: number, tx: Conn = db): Promise<{ code: string; expiresAt: Date }> {
  const code = newToken();
  const expiresAt = new Date(Date.now() + days * DAY_MS);
  await setJoinCode(workshopId, hashToken(code), expiresAt, tx);
  return { code, expiresAt };
}
