/** Data access for plans (Drizzle). Lists never load the snapshot or the per-person results. */
import { and, desc, eq, getTableColumns, inArray, ne, sql } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { planBounds } from '../../db/schema/plan-bounds';
import { jobs, plans, rehearsals } from '../../db/schema/plans';
import { rooms } from '../../db/schema/rooms';
import { db, type Conn, type Tx } from '../db';
import type { SearchResume } from '../../shared/engine/index';
import type { BoundKey } from './bound-key';
import { firstOf } from '../../shared/checked';

export type PlanRow = typeof plans.$inferSelect;
export type NewPlan = typeof plans.$inferInsert;
/** A plan row without its two large columns. */
export type PlanListRow = Omit<PlanRow, 'snapshot' | 'results'> & { createdByName: string };

const { snapshot: _snapshot, results: _results, ...listColumns } = getTableColumns(plans);

export async function insertPlan(values: NewPlan, tx: Conn = db): Promise<number> {
  const { id } = firstOf(await tx.insert(plans).values(values).$returningId(), 'new plan id');
  return id;
}

export async function updatePlan(id: number, patch: Partial<NewPlan>, tx: Conn = db): Promise<void> {
  await tx.update(plans).set(patch).where(eq(plans.id, id));
}

export async function findPlan(id: number, tx: Conn = db): Promise<(PlanRow & { createdByName: string }) | undefined> {
  const [row] = await tx
    .select({ plan: plans, createdByName: users.name })
    .from(plans)
    .innerJoin(users, eq(users.id, plans.createdBy))
    .where(eq(plans.id, id));
  return row ? { ...row.plan, createdByName: row.createdByName } : undefined;
}

export async function listPlans(roomId: number): Promise<PlanListRow[]> {
  const rows = await db
    .select({ ...listColumns, createdByName: users.name })
    .from(plans)
    .innerJoin(users, eq(users.id, plans.createdBy))
    .where(eq(plans.roomId, roomId))
    .orderBy(desc(plans.createdAt), desc(plans.id));
  return rows;
}

export async function roomVersion(roomId: number, tx: Conn = db): Promise<number | undefined> {
  const [row] = await tx.select({ version: rooms.version, name: rooms.name }).from(rooms).where(eq(rooms.id, roomId));
  return row?.version;
}

export async function roomName(roomId: number): Promise<string> {
  const [row] = await db.select({ name: rooms.name }).from(rooms).where(eq(rooms.id, roomId));
  return row?.name ?? '';
}

/** Marks one plan as the room's chosen plan (or unmarks it). */
export async function setChosen(planId: number, roomId: number, chosen: boolean): Promise<void> {
  await db.transaction(async (tx) => {
    if (chosen)
      await tx
        .update(plans)
        .set({ chosen: false })
        .where(and(eq(plans.roomId, roomId), ne(plans.id, planId)));
    await tx.update(plans).set({ chosen }).where(eq(plans.id, planId));
  });
}

export async function deletePlan(id: number): Promise<void> {
  await db.delete(plans).where(eq(plans.id, id));
}

/** Open jobs of a plan and of its rehearsals (to cancel before deleting). */
export async function openJobsOfPlan(planId: number) {
  const own = await db
    .select()
    .from(jobs)
    .where(and(eq(jobs.planId, planId), inArray(jobs.status, ['queued', 'running'])));
  const viaRehearsals = await db
    .select({ job: jobs })
    .from(rehearsals)
    .innerJoin(jobs, eq(jobs.id, rehearsals.jobId))
    .where(and(eq(rehearsals.planId, planId), inArray(jobs.status, ['queued', 'running'])));
  return [...own, ...viaRehearsals.map((r) => r.job)];
}

export type BoundRow = typeof planBounds.$inferSelect;

export interface BoundFacts {
  lowerBound: number;
  lowerSource: string;
  bestTotal: number | null;
  bestStarters: number[] | null;
}

/**
 * Merges what one computation proved into its key's row in one statement (safe under concurrent
 * plans): the lower bound only rises, the best total only falls. MariaDB evaluates the
 * assignments left to right, so the source and the starters are compared before their values move.
 */
export async function mergeBound(key: BoundKey, facts: BoundFacts, tx: Conn = db): Promise<void> {
  const starters = facts.bestStarters ? JSON.stringify(facts.bestStarters) : null;
  await tx.execute(sql`
    INSERT INTO plan_bounds (room_id, room_version, k, constraints_key, lower_bound, lower_source, best_total, best_starters)
    VALUES (${key.roomId}, ${key.roomVersion}, ${key.k}, ${key.constraintsKey}, ${facts.lowerBound}, ${facts.lowerSource},
            ${facts.bestTotal}, ${starters})
    ON DUPLICATE KEY UPDATE
      lower_source = IF(VALUES(lower_bound) > lower_bound, VALUES(lower_source), lower_source),
      lower_bound = GREATEST(lower_bound, VALUES(lower_bound)),
      best_starters = IF(VALUES(best_total) IS NOT NULL AND (best_total IS NULL OR VALUES(best_total) < best_total),
                         VALUES(best_starters), best_starters),
      best_total = IF(VALUES(best_total) IS NOT NULL AND (best_total IS NULL OR VALUES(best_total) < best_total),
                      VALUES(best_total), best_total)`);
}

/** The one bound row of a key (room, room version, k, constraints). */
function boundKeyIs(key: BoundKey) {
  return and(
    eq(planBounds.roomId, key.roomId),
    eq(planBounds.roomVersion, key.roomVersion),
    eq(planBounds.k, key.k),
    eq(planBounds.constraintsKey, key.constraintsKey),
  );
}

export async function findBound(key: BoundKey, tx: Conn = db): Promise<BoundRow | undefined> {
  const [row] = await tx.select().from(planBounds).where(boundKeyIs(key));
  return row;
}

/** Every bound row of a room (the plan list joins them in memory). */
export async function boundsOfRoom(roomId: number): Promise<BoundRow[]> {
  return db.select().from(planBounds).where(eq(planBounds.roomId, roomId));
}

/**
 * Keeps the saved search of a key (its row exists: the computation's bound was merged first). A
 * state that has decided fewer k-sets than the stored one (a search started afresh beside a
 * resumed one) does not replace it.
 */
export async function saveSearchState(key: BoundKey, state: SearchResume, tx: Conn = db): Promise<void> {
  const text = JSON.stringify(state);
  await tx.execute(sql`
    UPDATE plan_bounds
    SET search_state = IF(search_state IS NULL OR JSON_VALUE(search_state, '$.closed') + 0 <= ${state.closed}, ${text}, search_state)
    WHERE room_id = ${key.roomId} AND room_version = ${key.roomVersion} AND k = ${key.k} AND constraints_key = ${key.constraintsKey}`);
}

/** The bound row of a key, locked until the transaction ends (one background proof per key). */
export async function lockBound(key: BoundKey, tx: Tx): Promise<BoundRow | undefined> {
  const [row] = await tx.select().from(planBounds).where(boundKeyIs(key)).for('update');
  return row;
}

/** The columns that name a plan's problem (its bound key): room, room version, k, constraints, no-show chance. */
const problemColumns = {
  roomId: plans.roomId,
  roomVersion: plans.roomVersion,
  k: plans.k,
  mustBrief: plans.mustBrief,
  cannotBrief: plans.cannotBrief,
  noShow: plans.noShow,
};

/** Open background proofs of a room, with the key columns of their plans. */
export async function openProofsOfRoom(roomId: number, tx: Conn = db) {
  return tx
    .select({
      job: jobs,
      plan: problemColumns,
    })
    .from(jobs)
    .innerJoin(plans, eq(plans.id, jobs.planId))
    .where(and(eq(jobs.roomId, roomId), eq(jobs.kind, 'proof'), inArray(jobs.status, ['queued', 'running'])));
}

/** Finished plans of a room with the key columns and totals (to find a faster plan of the same problem). */
export async function readyPlansOfRoom(roomId: number) {
  return db
    .select({
      id: plans.id,
      ...problemColumns,
      total: plans.total,
    })
    .from(plans)
    .where(and(eq(plans.roomId, roomId), eq(plans.status, 'ready')));
}
