import { and, asc, count, desc, eq, inArray, isNotNull, isNull, gt, or, sql } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { roomShares, rooms, ties } from '../../db/schema/rooms';
import {
  participantLinks,
  surveyNominations,
  surveyResponses,
  workshopFacilitators,
  workshopParticipants,
  workshops,
} from '../../db/schema/workshops';
import type { Facilitator, ParticipantRow, WorkshopSummary } from '../../shared/api/workshops';
import { db, type Conn, type Tx } from '../db';
import { firstOf } from '../../shared/checked';

/** Data access for the facilitator side of workshops. */
export type WorkshopRow = typeof workshops.$inferSelect;
export type ParticipantDbRow = typeof workshopParticipants.$inferSelect;

/** The workshop if the user owns it or co-facilitates it. */
export async function workshopForUser(userId: number, workshopId: number, tx: Conn = db) {
  const [row] = await tx
    .select({ workshop: workshops, coUser: workshopFacilitators.userId })
    .from(workshops)
    .leftJoin(workshopFacilitators, and(eq(workshopFacilitators.workshopId, workshops.id), eq(workshopFacilitators.userId, userId)))
    .where(eq(workshops.id, workshopId));
  if (!row) return undefined;
  if (row.workshop.ownerId !== userId && row.coUser === null) return undefined;
  return { workshop: row.workshop, owner: row.workshop.ownerId === userId };
}

export async function listWorkshops(userId: number): Promise<WorkshopSummary[]> {
  const co = db.select({ id: workshopFacilitators.workshopId }).from(workshopFacilitators).where(eq(workshopFacilitators.userId, userId));
  const rows = await db
    .select({ w: workshops, roomName: rooms.name })
    .from(workshops)
    .leftJoin(rooms, eq(rooms.id, workshops.roomId))
    .where(or(eq(workshops.ownerId, userId), inArray(workshops.id, co)))
    .orderBy(desc(workshops.sessionDate), desc(workshops.id));
  const ids = rows.map((r) => r.w.id);
  const counts = await participantCounts(ids);
  return rows.map(({ w, roomName }) => ({
    id: w.id,
    title: w.title,
    sessionDate: w.sessionDate,
    status: w.status,
    roomId: w.roomId,
    roomName: roomName ?? null,
    participants: counts.get(w.id)?.participants ?? 0,
    answered: counts.get(w.id)?.answered ?? 0,
    owner: w.ownerId === userId,
  }));
}

export async function participantCounts(workshopIds: number[]) {
  const out = new Map<number, { participants: number; answered: number; consented: number; updatedAt: Date | null }>();
  if (!workshopIds.length) return out;
  const rows = await db
    .select({
      workshopId: workshopParticipants.workshopId,
      participants: count(workshopParticipants.id),
      answered: sql<number>`sum(case when ${surveyResponses.submittedAt} is not null then 1 else 0 end)`,
      consented: count(surveyResponses.participantId),
      updatedAt: sql<string | null>`max(${surveyResponses.submittedAt})`,
    })
    .from(workshopParticipants)
    .leftJoin(surveyResponses, eq(surveyResponses.participantId, workshopParticipants.id))
    .where(inArray(workshopParticipants.workshopId, workshopIds))
    .groupBy(workshopParticipants.workshopId);
  for (const r of rows) {
    out.set(r.workshopId, {
      participants: Number(r.participants),
      answered: Number(r.answered ?? 0),
      consented: Number(r.consented),
      updatedAt: r.updatedAt ? new Date(`${String(r.updatedAt).replace(' ', 'T')}Z`) : null,
    });
  }
  return out;
}

export async function facilitatorsOf(w: WorkshopRow): Promise<Facilitator[]> {
  const [owner] = await db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.id, w.ownerId));
  const co = await db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(workshopFacilitators)
    .innerJoin(users, eq(users.id, workshopFacilitators.userId))
    .where(eq(workshopFacilitators.workshopId, w.id))
    .orderBy(asc(users.name));
  return [...(owner ? [{ ...owner, owner: true }] : []), ...co.map((c) => ({ ...c, owner: false }))];
}

export async function participantRows(workshopId: number): Promise<ParticipantRow[]> {
  const people = await db
    .select({ p: workshopParticipants, submittedAt: surveyResponses.submittedAt })
    .from(workshopParticipants)
    .leftJoin(surveyResponses, eq(surveyResponses.participantId, workshopParticipants.id))
    .where(eq(workshopParticipants.workshopId, workshopId))
    .orderBy(asc(workshopParticipants.name));
  const ids = people.map((r) => r.p.id);
  const links = ids.length
    ? await db
        .select({
          participantId: participantLinks.participantId,
          active: sql<number>`sum(case when ${participantLinks.revokedAt} is null and ${participantLinks.expiresAt} > now(3) then 1 else 0 end)`,
          lastUsed: sql<string | null>`max(${participantLinks.lastUsedAt})`,
          liveUntil: sql<
            string | null
          >`max(case when ${participantLinks.revokedAt} is null and ${participantLinks.expiresAt} > now(3) then ${participantLinks.expiresAt} end)`,
        })
        .from(participantLinks)
        .where(inArray(participantLinks.participantId, ids))
        .groupBy(participantLinks.participantId)
    : [];
  const byId = new Map(links.map((l) => [l.participantId, l]));
  return people.map(({ p, submittedAt }) => ({
    id: p.id,
    name: p.name,
    email: p.email,
    personId: p.personId,
    claimed: p.claimedAt !== null,
    answered: submittedAt !== null,
    answeredAt: submittedAt?.toISOString() ?? null,
    activeLinks: Number(byId.get(p.id)?.active ?? 0),
    lastLinkUse: isoOf(byId.get(p.id)?.lastUsed),
    linkExpiresAt: isoOf(byId.get(p.id)?.liveUntil),
  }));
}

/** A DATETIME read back through sql`` (a 'YYYY-MM-DD HH:MM:SS.fff' string in UTC) as ISO 8601. */
const isoOf = (raw: string | Date | null | undefined): string | null =>
  raw ? (raw instanceof Date ? raw : new Date(`${String(raw).replace(' ', 'T')}Z`)).toISOString() : null;

export async function participantsById(workshopId: number, ids?: number[], tx: Conn = db): Promise<ParticipantDbRow[]> {
  const where = ids
    ? and(eq(workshopParticipants.workshopId, workshopId), inArray(workshopParticipants.id, ids.length ? ids : [0]))
    : eq(workshopParticipants.workshopId, workshopId);
  return tx.select().from(workshopParticipants).where(where).orderBy(asc(workshopParticipants.name));
}

export async function insertParticipants(
  workshopId: number,
  list: { name: string; email: string | null; personId: string | null }[],
  tx: Conn = db,
): Promise<number> {
  if (!list.length) return 0;
  await tx.insert(workshopParticipants).values(list.map((p) => ({ workshopId, ...p })));
  return list.length;
}

/** Every nomination of the workshop, as participant ids. */
export async function nominationsOf(workshopId: number, tx: Conn = db) {
  return tx
    .select({ from: surveyNominations.participantId, to: surveyNominations.nomineeId, level: surveyNominations.level })
    .from(surveyNominations)
    .innerJoin(workshopParticipants, eq(workshopParticipants.id, surveyNominations.participantId))
    .where(eq(workshopParticipants.workshopId, workshopId));
}

export async function answeredIds(workshopId: number, tx: Conn = db): Promise<Set<number>> {
  const rows = await tx
    .select({ id: surveyResponses.participantId })
    .from(surveyResponses)
    .innerJoin(workshopParticipants, eq(workshopParticipants.id, surveyResponses.participantId))
    .where(and(eq(workshopParticipants.workshopId, workshopId), isNotNull(surveyResponses.submittedAt)));
  return new Set(rows.map((r) => r.id));
}

export async function activeLinkCount(participantId: number): Promise<number> {
  const [row] = await db
    .select({ n: count() })
    .from(participantLinks)
    .where(
      and(
        eq(participantLinks.participantId, participantId),
        isNull(participantLinks.revokedAt),
        gt(participantLinks.expiresAt, new Date()),
      ),
    );
  return Number(row?.n ?? 0);
}

/**
 * Takes the workshop's row lock first in every transaction that changes its participants' links
 * or claims (sheets, e-mails, reset-claim, revoke): they queue on one row in one order instead of
 * deadlocking on each other's link rows.
 */
export async function lockWorkshop(workshopId: number, tx: Tx): Promise<void> {
  await tx.select({ id: workshops.id }).from(workshops).where(eq(workshops.id, workshopId)).for('update');
}

export type NewWorkshop = typeof workshops.$inferInsert;

export async function insertWorkshop(values: NewWorkshop, tx: Conn = db): Promise<number> {
  const { id } = firstOf(await tx.insert(workshops).values(values).$returningId(), 'new workshop id');
  return id;
}

export async function updateWorkshop(workshopId: number, patch: Partial<NewWorkshop>, tx: Conn = db): Promise<void> {
  if (Object.keys(patch).length) await tx.update(workshops).set(patch).where(eq(workshops.id, workshopId));
}

export async function deleteWorkshop(workshopId: number, tx: Conn = db): Promise<void> {
  await tx.delete(workshops).where(eq(workshops.id, workshopId));
}

export async function roomNameOf(roomId: number | null, tx: Conn = db): Promise<string | null> {
  if (roomId === null) return null;
  const [row] = await tx.select({ name: rooms.name }).from(rooms).where(eq(rooms.id, roomId));
  return row?.name ?? null;
}

/** Rows a DELETE or UPDATE changed (mysql2's ResultSetHeader). */
const affected = (result: unknown): number => (result as { affectedRows?: number }).affectedRows ?? 0;

/** Adds a co-facilitator (adding one twice is a no-op). */
export async function insertFacilitator(workshopId: number, userId: number, tx: Conn = db): Promise<void> {
  await tx.insert(workshopFacilitators).values({ workshopId, userId }).onDuplicateKeyUpdate({ set: { userId } });
}

/** Whether a row was removed (false: that user does not co-facilitate this workshop). */
export async function deleteFacilitator(workshopId: number, userId: number, tx: Conn = db): Promise<boolean> {
  const [result] = await tx
    .delete(workshopFacilitators)
    .where(and(eq(workshopFacilitators.workshopId, workshopId), eq(workshopFacilitators.userId, userId)));
  return affected(result) > 0;
}

/** Whether a row was removed (false: no such participant in this workshop). */
export async function deleteParticipant(workshopId: number, participantId: number, tx: Conn = db): Promise<boolean> {
  const [result] = await tx
    .delete(workshopParticipants)
    .where(and(eq(workshopParticipants.workshopId, workshopId), eq(workshopParticipants.id, participantId)));
  return affected(result) > 0;
}

export async function clearClaim(participantId: number, tx: Conn = db): Promise<void> {
  await tx.update(workshopParticipants).set({ claimedAt: null }).where(eq(workshopParticipants.id, participantId));
}

/** The role of the share `userId` holds on the room directly, if any. */
export async function directShareRole(roomId: number, userId: number, tx: Conn = db): Promise<'editor' | 'viewer' | null> {
  const [share] = await tx
    .select({ role: roomShares.role })
    .from(roomShares)
    .where(and(eq(roomShares.roomId, roomId), eq(roomShares.userId, userId)));
  return share?.role ?? null;
}

export async function facilitatorUserIds(workshopId: number, tx: Conn = db): Promise<number[]> {
  const rows = await tx
    .select({ userId: workshopFacilitators.userId })
    .from(workshopFacilitators)
    .where(eq(workshopFacilitators.workshopId, workshopId));
  return rows.map((r) => r.userId);
}

/** Records which person of the room stands for the participant (the row built or matched for them). */
export async function setParticipantPerson(participantId: number, personId: number, tx: Conn = db): Promise<void> {
  await tx
    .update(workshopParticipants)
    .set({ personId: String(personId) })
    .where(eq(workshopParticipants.id, participantId));
}

/** Removes the room's ties between survey people, before the survey's answers are written again. */
export async function deleteTiesAmong(roomId: number, personIds: number[], tx: Conn = db): Promise<void> {
  if (!personIds.length) return;
  await tx.delete(ties).where(and(eq(ties.roomId, roomId), inArray(ties.sourceId, personIds), inArray(ties.targetId, personIds)));
}
