/** Rooms data access (Drizzle on MariaDB: select / join only, bulk inserts in chunks). */
import { and, asc, desc, eq, gte, inArray, like, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import type { ListParams, Page } from '../../shared/api/lists';
import type { PersonDto, RoomSettings, TieDto, TieListItem } from '../../shared/api/rooms';
import { firstOf, itemAt } from '../../shared/checked';
import { people, rooms, ties } from '../../db/schema/rooms';
import { db, type Conn, type Tx } from '../db';
import type { RoomRow } from './access';

const CHUNK = 1000;

/** A LIKE pattern matching the text anywhere, with the wildcards in it escaped. */
export const contains = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

export interface PersonRowInput {
  key: string;
  name: string;
  group: string | null;
  email: string | null;
  x: number | null;
  y: number | null;
  pinned: boolean;
  /** From an org-chart import: the manager's person key. */
  managerKey?: string | null;
}

export interface TieRowInput {
  source: number; // index into the people list
  target: number;
  strength: number;
}

export async function insertRoom(
  values: { ownerId: number; name: string; description: string; settings: RoomSettings },
  tx: Conn = db,
): Promise<number> {
  const inserted = await tx
    .insert(rooms)
    .values({ ownerId: values.ownerId, name: values.name, description: values.description, ...values.settings })
    .$returningId();
  return firstOf(inserted, 'new room id').id;
}

/** Inserts people and ties (by index into `personRows`); returns the new person ids in order. */
export async function insertContent(
  roomId: number,
  personRows: PersonRowInput[],
  tieRows: TieRowInput[],
  firstOrder: number,
  tx: Conn = db,
): Promise<number[]> {
  const ids: number[] = [];
  let firstId: number | undefined;
  for (let at = 0; at < personRows.length; at += CHUNK) {
    const rows = personRows.slice(at, at + CHUNK).map((p, i) => ({
      roomId,
      personKey: p.key,
      name: p.name,
      groupName: p.group,
      email: p.email,
      x: p.x,
      y: p.y,
      pinned: p.pinned,
      managerKey: p.managerKey ?? null,
      orderIndex: firstOrder + at + i,
    }));
    const got = await tx.insert(people).values(rows).$returningId();
    firstId ??= got[0]?.id;
  }
  if (firstId !== undefined) ids.push(...(await newIdsByKey(roomId, firstId, personRows, tx)));
  for (let at = 0; at < tieRows.length; at += CHUNK) {
    const rows = tieRows.slice(at, at + CHUNK).map((t) => ({
      roomId,
      sourceId: itemAt(ids, t.source, 'tie source person'),
      targetId: itemAt(ids, t.target, 'tie target person'),
      strength: t.strength,
    }));
    await tx.insert(ties).values(rows);
  }
  await refreshCounts(roomId, tx);
  return ids;
}

export async function clearContent(roomId: number, tx: Conn = db): Promise<void> {
  await tx.delete(ties).where(eq(ties.roomId, roomId));
  await tx.delete(people).where(eq(people.roomId, roomId));
  await refreshCounts(roomId, tx);
}

/** Locks the room row for the rest of the transaction (serialises edits of one room). */
export async function lockRoom(roomId: number, tx: Tx): Promise<RoomRow | undefined> {
  const [row] = await tx.select().from(rooms).where(eq(rooms.id, roomId)).for('update');
  return row;
}

/*
 * Every content change bumps the version (bumpVersion, updateRoomFields) and every bulk write goes
 * through insertContent / clearContent: those are where the stored counts are brought up to date,
 * inside the same transaction, so a list reads them instead of counting a room's rows each time.
 */
const counted = {
  peopleCount: sql`(SELECT COUNT(*) FROM ${people} WHERE ${people.roomId} = ${rooms.id})`,
  tiesCount: sql`(SELECT COUNT(*) FROM ${ties} WHERE ${ties.roomId} = ${rooms.id})`,
};

export async function refreshCounts(roomId: number, tx: Conn = db): Promise<void> {
  await tx.update(rooms).set(counted).where(eq(rooms.id, roomId));
}

export async function bumpVersion(roomId: number, tx: Conn = db): Promise<void> {
  await tx
    .update(rooms)
    .set({ version: sql`${rooms.version} + 1`, ...counted })
    .where(eq(rooms.id, roomId));
}

export async function touchRoom(roomId: number, tx: Conn = db): Promise<void> {
  await tx
    .update(rooms)
    .set({ updatedAt: sql`CURRENT_TIMESTAMP(3)` })
    .where(eq(rooms.id, roomId));
}

export async function updateRoomFields(roomId: number, set: Partial<typeof rooms.$inferInsert>, tx: Conn = db): Promise<void> {
  await tx
    .update(rooms)
    .set({ ...set, version: sql`${rooms.version} + 1`, ...counted })
    .where(eq(rooms.id, roomId));
}

/** Notes the org-chart headers of a room just created from one (not a content change: no version bump). */
export async function setOrgChart(roomId: number, saved: string | null, tx: Conn = db): Promise<void> {
  await tx.update(rooms).set({ orgChart: saved }).where(eq(rooms.id, roomId));
}

export async function deleteRoom(roomId: number, tx: Conn = db): Promise<void> {
  await tx.delete(rooms).where(eq(rooms.id, roomId));
}

const personColumns = {
  id: people.id,
  key: people.personKey,
  name: people.name,
  group: people.groupName,
  email: people.email,
  x: people.x,
  y: people.y,
  pinned: people.pinned,
};

export async function roomPeople(roomId: number, tx: Conn = db): Promise<PersonDto[]> {
  return tx.select(personColumns).from(people).where(eq(people.roomId, roomId)).orderBy(asc(people.orderIndex), asc(people.id));
}

/** People with their manager keys, in room order, for the org-chart export. */
export async function orgChartPeople(
  roomId: number,
  tx: Conn = db,
): Promise<{ key: string; name: string; group: string | null; managerKey: string | null }[]> {
  return tx
    .select({ key: people.personKey, name: people.name, group: people.groupName, managerKey: people.managerKey })
    .from(people)
    .where(eq(people.roomId, roomId))
    .orderBy(asc(people.orderIndex), asc(people.id));
}

export async function roomOrgChart(roomId: number, tx: Conn = db): Promise<string | null> {
  const [row] = await tx.select({ orgChart: rooms.orgChart }).from(rooms).where(eq(rooms.id, roomId));
  return row?.orgChart ?? null;
}

export async function roomTies(roomId: number, tx: Conn = db): Promise<TieDto[]> {
  return tx
    .select({ id: ties.id, sourceId: ties.sourceId, targetId: ties.targetId, strength: ties.strength })
    .from(ties)
    .where(eq(ties.roomId, roomId))
    .orderBy(asc(ties.id));
}

export async function maxOrder(roomId: number, tx: Conn = db): Promise<number> {
  const [row] = await tx
    .select({ m: sql<number | null>`MAX(${people.orderIndex})` })
    .from(people)
    .where(eq(people.roomId, roomId));
  return row?.m === null || row?.m === undefined ? -1 : Number(row.m);
}

export async function countContent(roomId: number, tx: Conn = db): Promise<{ people: number; ties: number }> {
  const p = await tx
    .select({ n: sql<number>`COUNT(*)` })
    .from(people)
    .where(eq(people.roomId, roomId));
  const t = await tx
    .select({ n: sql<number>`COUNT(*)` })
    .from(ties)
    .where(eq(ties.roomId, roomId));
  return { people: Number(firstOf(p, 'people count').n), ties: Number(firstOf(t, 'tie count').n) };
}

// ---- lists ----

export type { ListParams } from '../../shared/api/lists';

export const iso = (d: Date) => d.toISOString();

export async function listPeople(roomId: number, p: ListParams<string> & { group?: string }): Promise<Page<PersonDto>> {
  const filters: (SQL | undefined)[] = [eq(people.roomId, roomId)];
  if (p.q) {
    const pat = contains(p.q);
    filters.push(or(like(people.name, pat), like(people.personKey, pat), like(people.email, pat), like(people.groupName, pat)));
  }
  if (p.group !== undefined) filters.push(p.group === '' ? sql`${people.groupName} IS NULL` : eq(people.groupName, p.group));
  const where = and(...filters);
  const order = p.direction === 'desc' ? desc : asc;
  const sortBy = { order: people.orderIndex, name: people.name, key: people.personKey, group: people.groupName, email: people.email }[
    p.sort
  ];
  const counted = await db
    .select({ total: sql<number>`COUNT(*)` })
    .from(people)
    .where(where);
  const { total } = firstOf(counted, 'people count');
  const items = await db
    .select(personColumns)
    .from(people)
    .where(where)
    .orderBy(order(sortBy ?? people.orderIndex), asc(people.orderIndex), asc(people.id))
    .limit(p.pageSize)
    .offset(p.page * p.pageSize);
  return { items, total: Number(total), page: p.page, pageSize: p.pageSize };
}

export async function listTies(roomId: number, p: ListParams<string> & { personId?: number }): Promise<Page<TieListItem>> {
  const s = alias(people, 's');
  const t = alias(people, 't');
  const filters: (SQL | undefined)[] = [eq(ties.roomId, roomId)];
  if (p.q)
    filters.push(
      or(like(s.name, contains(p.q)), like(t.name, contains(p.q)), like(s.personKey, contains(p.q)), like(t.personKey, contains(p.q))),
    );
  if (p.personId !== undefined) filters.push(or(eq(ties.sourceId, p.personId), eq(ties.targetId, p.personId)));
  const where = and(...filters);
  const order = p.direction === 'desc' ? desc : asc;
  const sortBy = { source: s.name, target: t.name, strength: ties.strength }[p.sort] ?? s.name;
  const counted = await db
    .select({ total: sql<number>`COUNT(*)` })
    .from(ties)
    .innerJoin(s, eq(s.id, ties.sourceId))
    .innerJoin(t, eq(t.id, ties.targetId))
    .where(where);
  const { total } = firstOf(counted, 'tie count');
  const items = await db
    .select({
      id: ties.id,
      sourceId: ties.sourceId,
      targetId: ties.targetId,
      strength: ties.strength,
      sourceName: s.name,
      targetName: t.name,
    })
    .from(ties)
    .innerJoin(s, eq(s.id, ties.sourceId))
    .innerJoin(t, eq(t.id, ties.targetId))
    .where(where)
    .orderBy(order(sortBy), asc(ties.id))
    .limit(p.pageSize)
    .offset(p.page * p.pageSize);
  return { items, total: Number(total), page: p.page, pageSize: p.pageSize };
}

// ---- batch edit writes ----

export async function updatePeopleRows(roomId: number, id: number, set: Partial<typeof people.$inferInsert>, tx: Tx): Promise<void> {
  await tx
    .update(people)
    .set(set)
    .where(and(eq(people.id, id), eq(people.roomId, roomId)));
}

export async function deletePeopleRows(roomId: number, ids: number[], tx: Tx): Promise<void> {
  if (ids.length === 0) return;
  await tx.delete(ties).where(and(eq(ties.roomId, roomId), or(inArray(ties.sourceId, ids), inArray(ties.targetId, ids))));
  await tx.delete(people).where(and(eq(people.roomId, roomId), inArray(people.id, ids)));
}

export async function deleteTieRows(roomId: number, ids: number[], tx: Tx): Promise<void> {
  if (ids.length === 0) return;
  await tx.delete(ties).where(and(eq(ties.roomId, roomId), inArray(ties.id, ids)));
}

export async function updateTieRow(roomId: number, id: number, strength: number, tx: Tx): Promise<void> {
  await tx
    .update(ties)
    .set({ strength })
    .where(and(eq(ties.id, id), eq(ties.roomId, roomId)));
}

export async function insertPeopleRows(roomId: number, personRows: PersonRowInput[], firstOrder: number, tx: Tx): Promise<number[]> {
  return insertContent(roomId, personRows, [], firstOrder, tx);
}

export async function insertTieRows(
  roomId: number,
  tieRows: { sourceId: number; targetId: number; strength: number }[],
  tx: Tx,
): Promise<number[]> {
  let firstId: number | undefined;
  for (let at = 0; at < tieRows.length; at += CHUNK) {
    const got = await tx
      .insert(ties)
      .values(tieRows.slice(at, at + CHUNK).map((l) => ({ roomId, ...l })))
      .$returningId();
    firstId ??= got[0]?.id;
  }
  if (firstId === undefined) return [];
  const rows = await tx
    .select({ id: ties.id, sourceId: ties.sourceId, targetId: ties.targetId })
    .from(ties)
    .where(and(eq(ties.roomId, roomId), gte(ties.id, firstId)));
  const byPair = new Map(rows.map((r) => [`${r.sourceId}:${r.targetId}`, r.id]));
  return tieRows.map((l) => idOrThrow(byPair.get(`${l.sourceId}:${l.targetId}`), 'tie'));
}

/*
 * The ids of rows just inserted are read back by their natural key, not counted up from the
 * first one: a multi-row insert's ids are consecutive only where auto_increment_increment is 1,
 * and a Galera cluster sets it to the cluster size. The room's row is locked (or the room is
 * new), so every row of the room with an id from the first new one on is one of ours.
 */
async function newIdsByKey(roomId: number, firstId: number, personRows: PersonRowInput[], tx: Conn = db): Promise<number[]> {
  const rows = await tx
    .select({ id: people.id, key: people.personKey })
    .from(people)
    .where(and(eq(people.roomId, roomId), gte(people.id, firstId)));
  const byKey = new Map(rows.map((r) => [r.key, r.id]));
  return personRows.map((p) => idOrThrow(byKey.get(p.key), 'person'));
}

function idOrThrow(id: number | undefined, what: string): number {
  if (id === undefined) throw new Error(`a ${what} just inserted was not found again`);
  return id;
}

/** Many positions in one statement per chunk (a drag of many people is one autosave). */
export async function movePeopleRows(
  roomId: number,
  moves: { id: number; x: number; y: number; pinned?: boolean }[],
  tx: Tx,
): Promise<void> {
  for (let at = 0; at < moves.length; at += CHUNK) {
    const part = moves.slice(at, at + CHUNK);
    const caseOf = (value: (m: (typeof part)[number]) => unknown, column: SQL) =>
      sql.join([sql`CASE ${people.id}`, ...part.map((m) => sql`WHEN ${m.id} THEN ${value(m)}`), sql`ELSE ${column} END`], sql` `);
    await tx
      .update(people)
      .set({
        x: caseOf((m) => m.x, sql`${people.x}`),
        y: caseOf((m) => m.y, sql`${people.y}`),
        pinned: caseOf((m) => (m.pinned === undefined ? sql`${people.pinned}` : m.pinned), sql`${people.pinned}`),
      })
      .where(
        and(
          eq(people.roomId, roomId),
          inArray(
            people.id,
            part.map((m) => m.id),
          ),
        ),
      );
  }
}
