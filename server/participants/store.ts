import { and, asc, eq, gt, inArray, isNull } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import {
  participantLinks,
  surveyNominations,
  surveyResponses,
  workshopFacilitators,
  workshopParticipants,
  workshops,
} from '../../db/schema/workshops';
import type { Nomination } from '../../shared/api/workshops';
import { db, type Conn, type Tx } from '../db';

/** Data access for what a participant link may read and write: its own answers, the list of names. */
export type WorkshopRow = typeof workshops.$inferSelect;

export async function workshopById(id: number, tx: Conn = db): Promise<WorkshopRow | undefined> {
  const [row] = await tx.select().from(workshops).where(eq(workshops.id, id));
  return row;
}

/** The workshop's status, with its row locked until the transaction ends. */
export async function lockedStatus(id: number, tx: Tx): Promise<WorkshopRow['status'] | undefined> {
  const [row] = await tx.select({ status: workshops.status }).from(workshops).where(eq(workshops.id, id)).for('update');
  return row?.status;
}

export async function namesOf(workshopId: number, tx: Conn = db) {
  return tx
    .select({ id: workshopParticipants.id, name: workshopParticipants.name, claimedAt: workshopParticipants.claimedAt })
    .from(workshopParticipants)
    .where(eq(workshopParticipants.workshopId, workshopId))
    .orderBy(asc(workshopParticipants.name));
}

export async function facilitatorNames(workshop: WorkshopRow): Promise<string[]> {
  const rows = await db
    .select({ id: users.id, name: users.name })
    .from(workshopFacilitators)
    .innerJoin(users, eq(users.id, workshopFacilitators.userId))
    .where(eq(workshopFacilitators.workshopId, workshop.id));
  const [owner] = await db.select({ name: users.name }).from(users).where(eq(users.id, workshop.ownerId));
  return [owner?.name ?? 'The facilitator', ...rows.map((r) => r.name)];
}

export interface StoredAnswers {
  consentedAt: Date | null;
  version: number;
  submittedAt: Date | null;
  nominations: Nomination[];
}

export async function answersOf(participantId: number, tx: Conn = db): Promise<StoredAnswers> {
  return readAnswers(participantId, false, tx);
}

/** The stored answers with the response row locked for the rest of the transaction. */
export async function lockAnswersOf(participantId: number, tx: Tx): Promise<StoredAnswers> {
  return readAnswers(participantId, true, tx);
}

async function readAnswers(participantId: number, lock: boolean, tx: Conn): Promise<StoredAnswers> {
  const query = tx.select().from(surveyResponses).where(eq(surveyResponses.participantId, participantId));
  const [row] = lock ? await query.for('update') : await query;
  const noms = await tx
    .select({ participantId: surveyNominations.nomineeId, level: surveyNominations.level })
    .from(surveyNominations)
    .where(eq(surveyNominations.participantId, participantId))
    .orderBy(asc(surveyNominations.nomineeId));
  return {
    consentedAt: row?.consentedAt ?? null,
    version: row?.version ?? 0,
    submittedAt: row?.submittedAt ?? null,
    nominations: noms.map((n) => ({ participantId: n.participantId, level: n.level })),
  };
}

export async function recordConsent(participantId: number): Promise<void> {
  await db
    .insert(surveyResponses)
    .values({ participantId, consentedAt: new Date(), version: 0 })
    .onDuplicateKeyUpdate({ set: { consentedAt: new Date() } });
}

export async function saveAnswers(participantId: number, version: number, nominations: Nomination[], tx: Tx): Promise<void> {
  await tx.delete(surveyNominations).where(eq(surveyNominations.participantId, participantId));
  if (nominations.length) {
    await tx.insert(surveyNominations).values(nominations.map((n) => ({ participantId, nomineeId: n.participantId, level: n.level })));
  }
  await tx.update(surveyResponses).set({ version, submittedAt: new Date() }).where(eq(surveyResponses.participantId, participantId));
}

/** Atomically claims an unclaimed name; false when someone was faster. */
export async function claimName(workshopId: number, participantId: number, tx: Conn = db): Promise<boolean> {
  const [result] = await tx
    .update(workshopParticipants)
    .set({ claimedAt: new Date() })
    .where(
      and(
        eq(workshopParticipants.id, participantId),
        eq(workshopParticipants.workshopId, workshopId),
        isNull(workshopParticipants.claimedAt),
      ),
    );
  return ((result as { affectedRows?: number }).affectedRows ?? 0) === 1;
}

export async function participantsIn(workshopId: number, ids: number[], tx: Conn = db): Promise<Set<number>> {
  if (!ids.length) return new Set();
  const rows = await tx
    .select({ id: workshopParticipants.id })
    .from(workshopParticipants)
    .where(and(eq(workshopParticipants.workshopId, workshopId), inArray(workshopParticipants.id, ids)));
  return new Set(rows.map((r) => r.id));
}

/** Participants who already hold a working personal link (e-mailed, printed or claimed). */
export async function withActiveLinks(workshopId: number, tx: Conn = db): Promise<Set<number>> {
  const rows = await tx
    .selectDistinct({ id: participantLinks.participantId })
    .from(participantLinks)
    .innerJoin(workshopParticipants, eq(workshopParticipants.id, participantLinks.participantId))
    .where(
      and(eq(workshopParticipants.workshopId, workshopId), isNull(participantLinks.revokedAt), gt(participantLinks.expiresAt, new Date())),
    );
  return new Set(rows.map((r) => r.id));
}
