/** Data access for rehearsals (Drizzle); status lives on the job row. */
import { and, desc, eq, getTableColumns, gte, lt, sql, type SQL } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { jobs, plans, rehearsals } from '../../db/schema/plans';
import { people } from '../../db/schema/rooms';
import { db, type Conn } from '../db';
import type { JobStatus } from '../../shared/api/plans';
import { firstOf } from '../../shared/checked';

export type RehearsalRow = typeof rehearsals.$inferSelect;
export type NewRehearsal = typeof rehearsals.$inferInsert;
export type JobRow = typeof jobs.$inferSelect;

export interface RehearsalListRow {
  rehearsal: Omit<RehearsalRow, 'results' | 'samples'>;
  job: JobRow;
  planName: string;
  createdByName: string;
  /** 1 for the room's first rehearsal, 2 for its second... (its rank among the room's rehearsals). */
  number: number;
}

/** The rehearsal's rank within its room: counted, so every room starts at 1 (no extra column). */
const roomNumber = sql<number>`(select count(*) from rehearsals r2 where r2.room_id = ${rehearsals.roomId} and r2.id <= ${rehearsals.id})`;

export async function insertRehearsal(values: NewRehearsal, tx: Conn = db): Promise<number> {
  const { id } = firstOf(await tx.insert(rehearsals).values(values).$returningId(), 'new rehearsal id');
  return id;
}

export async function updateRehearsal(id: number, patch: Partial<NewRehearsal>, tx: Conn = db): Promise<void> {
  await tx.update(rehearsals).set(patch).where(eq(rehearsals.id, id));
}

export async function findRehearsal(id: number): Promise<(RehearsalListRow & { rehearsal: RehearsalRow }) | undefined> {
  const [row] = await db
    .select({ rehearsal: rehearsals, job: jobs, planName: plans.name, createdByName: users.name, number: roomNumber })
    .from(rehearsals)
    .innerJoin(jobs, eq(jobs.id, rehearsals.jobId))
    .innerJoin(plans, eq(plans.id, rehearsals.planId))
    .innerJoin(users, eq(users.id, rehearsals.createdBy))
    .where(eq(rehearsals.id, id));
  return row;
}

export async function findRehearsalByJob(jobId: number, tx: Conn = db): Promise<RehearsalRow | undefined> {
  const [row] = await tx.select().from(rehearsals).where(eq(rehearsals.jobId, jobId));
  return row;
}

export interface RehearsalFilter {
  planId?: number;
  status?: JobStatus;
  from?: Date;
  to?: Date;
}

export async function listRehearsals(roomId: number, f: RehearsalFilter): Promise<RehearsalListRow[]> {
  const where: SQL[] = [eq(rehearsals.roomId, roomId)];
  if (f.planId) where.push(eq(rehearsals.planId, f.planId));
  if (f.status) where.push(eq(jobs.status, f.status));
  if (f.from) where.push(gte(rehearsals.createdAt, f.from));
  if (f.to) where.push(lt(rehearsals.createdAt, f.to));
  const { results: _r, samples: _s, ...cols } = getTableColumns(rehearsals);
  return db
    .select({ rehearsal: cols, job: jobs, planName: plans.name, createdByName: users.name, number: roomNumber })
    .from(rehearsals)
    .innerJoin(jobs, eq(jobs.id, rehearsals.jobId))
    .innerJoin(plans, eq(plans.id, rehearsals.planId))
    .innerJoin(users, eq(users.id, rehearsals.createdBy))
    .where(and(...where))
    .orderBy(desc(rehearsals.createdAt), desc(rehearsals.id))
    .limit(500);
}

export async function deleteRehearsal(id: number): Promise<void> {
  await db.delete(rehearsals).where(eq(rehearsals.id, id));
}

/** Where each person of a room sits on its map (the replay draws the room as the editor shows it). */
export async function personPositions(roomId: number): Promise<{ id: number; x: number | null; y: number | null }[]> {
  return db.select({ id: people.id, x: people.x, y: people.y }).from(people).where(eq(people.roomId, roomId));
}
