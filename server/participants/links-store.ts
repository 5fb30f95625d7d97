/** Participant links and join codes: rows of participant_links and the workshop's join code, by the token's hash. */
import { and, desc, eq, gt, inArray, isNull } from 'drizzle-orm';
import { participantLinks, workshopParticipants, workshops } from '../../db/schema/workshops';
import { db, type Conn } from '../db';

export type NewLinkRow = typeof participantLinks.$inferInsert;

export async function insertLinks(rows: NewLinkRow[], tx: Conn = db): Promise<void> {
  await tx.insert(participantLinks).values(rows);
}

/** The live (unrevoked, unexpired) links of these participants, the latest-expiring first. */
export async function liveLinksOf(
  participantIds: number[],
  tx: Conn = db,
): Promise<{ participantId: number; sealed: string | null; expiresAt: Date }[]> {
  return tx
    .select({ participantId: participantLinks.participantId, sealed: participantLinks.tokenSealed, expiresAt: participantLinks.expiresAt })
    .from(participantLinks)
    .where(
      and(
        inArray(participantLinks.participantId, participantIds),
        isNull(participantLinks.revokedAt),
        gt(participantLinks.expiresAt, new Date()),
      ),
    )
    .orderBy(desc(participantLinks.expiresAt));
}

export async function revokeLinkByHash(tokenHash: string, tx: Conn = db): Promise<void> {
  await tx.update(participantLinks).set({ revokedAt: new Date() }).where(eq(participantLinks.tokenHash, tokenHash));
}

/** Revokes the open links of these participants; returns how many there were. */
export async function revokeLinksOf(participantIds: number[], tx: Conn = db): Promise<number> {
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

/** The participant behind a usable (known, unrevoked, unexpired) link hash. */
export async function linkHolderByHash(tokenHash: string, tx: Conn = db): Promise<LinkHolder | undefined> {
  const [row] = await tx
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
    .where(and(eq(participantLinks.tokenHash, tokenHash), isNull(participantLinks.revokedAt), gt(participantLinks.expiresAt, new Date())));
  return row;
}

export async function touchLink(linkId: number, tx: Conn = db): Promise<void> {
  await tx.update(participantLinks).set({ lastUsedAt: new Date() }).where(eq(participantLinks.id, linkId));
}

/** The workshop whose unexpired join code has this hash. */
export async function workshopByJoinHash(codeHash: string, tx: Conn = db): Promise<number | undefined> {
  const [row] = await tx
    .select({ id: workshops.id })
    .from(workshops)
    .where(and(eq(workshops.joinCodeHash, codeHash), gt(workshops.joinCodeExpiresAt, new Date())));
  return row?.id;
}

export async function setJoinCode(workshopId: number, codeHash: string, expiresAt: Date, tx: Conn = db): Promise<void> {
  await tx.update(workshops).set({ joinCodeHash: codeHash, joinCodeExpiresAt: expiresAt }).where(eq(workshops.id, workshopId));
}
