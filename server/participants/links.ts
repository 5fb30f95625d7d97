import { randomBytes } from 'node:crypto';
import { and, eq, gt, inArray, isNull } from 'drizzle-orm';
import { participantLinks, workshopParticipants, workshops } from '../../db/schema/workshops';
import { hashToken, TOKEN_PATTERN } from '../auth/tokens';
import { publicUrl } from '../config';
import { db, type Tx } from '../db';

/**
 * Personal participant links. A token is 32 random bytes from the operating system's CSPRNG
 * (256 bits; the OWASP Session Management Cheat Sheet asks for at least 64 bits of entropy,
 * our brief for 128). Only its SHA-256 is stored, so a copy of the database gives no working
 * link; the clear token exists only in the answer that issued it.
 */
type Conn = Tx | typeof db;
export type LinkChannel = 'email' | 'sheet' | 'join';
const DAY_MS = 24 * 3600 * 1000;

export const newToken = () => randomBytes(32).toString('base64url');
export const participantUrl = (token: string) => `${publicUrl().replace(/\/+$/, '')}/p/${token}`;
export const joinUrl = (code: string) => `${publicUrl().replace(/\/+$/, '')}/p/join/${code}`;

/** Issues a fresh link; with `replace`, the participant's earlier links stop working. */
export async function issueLink(
  tx: Conn,
  participantId: number,
  channel: LinkChannel,
  days: number,
  replace: boolean,
): Promise<{ token: string; expiresAt: Date }> {
  if (replace) await revokeLinks(tx, [participantId]);
  const token = newToken();
  const expiresAt = new Date(Date.now() + days * DAY_MS);
  await tx.insert(participantLinks).values({ participantId, tokenHash: hashToken(token), channel, expiresAt });
  return { token, expiresAt };
}

export async function revokeLinks(tx: Conn, participantIds: number[]): Promise<number> {
  if (!participantIds.length) return 0;
  const [result] = await tx
    .update(participantLinks)
    .set({ revokedAt: new Date() })
    .where(and(inArray(participantLinks.participantId, participantIds), isNull(participantLinks.revokedAt)));
  return (result as { affectedRows?: number }).affectedRows ?? 0;
}

export interface LinkHolder {
  linkId: number;
  participantId: number;
  participantName: string;
  personId: string | null;
  workshopId: number;
}

/** The participant behind a usable (well-formed, known, unrevoked, unexpired) token, else undefined. */
export async function findLinkHolder(token: string): Promise<LinkHolder | undefined> {
  if (!TOKEN_PATTERN.test(token)) return undefined;
  const [row] = await db
    .select({
      linkId: participantLinks.id,
      participantId: workshopParticipants.id,
      participantName: workshopParticipants.name,
      personId: workshopParticipants.personId,
      workshopId: workshops.id,
    })
    .from(participantLinks)
    .innerJoin(workshopParticipants, eq(workshopParticipants.id, participantLinks.participantId))
    .innerJoin(workshops, eq(workshops.id, workshopParticipants.workshopId))
    .where(
      and(eq(participantLinks.tokenHash, hashToken(token)), isNull(participantLinks.revokedAt), gt(participantLinks.expiresAt, new Date())),
    );
  if (!row) return undefined;
  await db.update(participantLinks).set({ lastUsedAt: new Date() }).where(eq(participantLinks.id, row.linkId));
  return row;
}

/** The workshop behind a usable join code (the projector QR code), else undefined. */
export async function findJoinWorkshop(code: string): Promise<number | undefined> {
  if (!TOKEN_PATTERN.test(code)) return undefined;
  const [row] = await db
    .select({ id: workshops.id })
    .from(workshops)
    .where(and(eq(workshops.joinCodeHash, hashToken(code)), gt(workshops.joinCodeExpiresAt, new Date())));
  return row?.id;
}

/** A fresh join code (the earlier one stops working). */
export async function issueJoinCode(tx: Conn, workshopId: number, days: number): Promise<{ code: string; expiresAt: Date }> {
  const code = newToken();
  const expiresAt = new Date(Date.now() + days * DAY_MS);
  await tx
    .update(workshops)
    .set({ joinCodeHash: hashToken(code), joinCodeExpiresAt: expiresAt })
    .where(eq(workshops.id, workshopId));
  return { code, expiresAt };
}
