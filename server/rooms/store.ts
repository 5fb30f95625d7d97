/** Rooms data access (Drizzle on MariaDB: select / join only, bulk inserts in chunks). */
import { and, asc, desc, eq, inArray, isNotNull, like, or, sql, type Placeholder, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import type { Page, PersonDto, RoomListItem, RoomSettings, TieDto, TieListItem } from '../../shared/api/rooms';
import { users } from '../../db/schema/accounts';
import { people, roomShares, rooms, ties } from '../../db/schema/rooms';
import { db, type Tx } from '../db';
import type { RoomRow } from './access';
import { workshopEditorOf } from './grants';

type Q = Tx | typeof db;
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
  tx: Q,
  values: { ownerId: number; name: string; description: string; settings: RoomSettings },
): Promise<number> {
  const [{ id }] = await tx
    .insert(rooms)
    .values({ ownerId: values.ownerId, name: values.name, description: values.description, ...values.settings })
    .$returningId();
  return id;
}

/** Inserts people and ties (by index into `folk`); returns the new person ids in order. */
export async function insertContent(
  tx: Q,
  roomId: number,
  folk: PersonRowInput[],
  links: TieRowInput[],
  firstOrder = 0,
): Promise<number[]> {
  const ids: number[] = [];
  for (let at = 0; at < folk.length; at += CHUNK) {
    const rows = folk.slice(at, at + CHUNK).map((p, i) => ({
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
    ids.push(...got.map((g) => g.id));
  }
  for (let at = 0; at < links.length; at += CHUNK) {
    const rows = links
      .slice(at, at + CHUNK)
      .map((t) => ({ roomId, sourceId: ids[t.source], targetId: ids[t.target], strength: t.strength }));
    await tx.insert(ties).values(rows);
  }
  return ids;
}

export async function clearContent(tx: Q, roomId: number): Promise<void> {
  await tx.delete(ties).where(eq(ties.roomId, roomId));
  await tx.delete(people).where(eq(people.roomId, roomId));
}

/** Locks the room row for the rest of the transaction (serialises edits of one room). */
export async function lockRoom(tx: Tx, roomId: number): Promise<RoomRow | undefined> {
  const [row] = await tx.select().from(rooms).where(eq(rooms.id, roomId)).for('update');
  return row;
}

export async function bumpVersion(tx: Q, roomId: number): Promise<void> {
  await tx
    .update(rooms)
    .set({ version: sql`${rooms.version} + 1` })
    .where(eq(rooms.id, roomId));
}

export async function touchRoom(tx: Q, roomId: number): Promise<void> {
  await tx
    .update(rooms)
    .set({ updatedAt: sql`CURRENT_TIMESTAMP(3)` })
    .where(eq(rooms.id, roomId));
}

export async function updateRoomFields(tx: Q, roomId: number, set: Partial<typeof rooms.$inferInsert>): Promise<void> {
  await tx
    .update(rooms)
    .set({ ...set, version: sql`${rooms.version} + 1` })
    .where(eq(rooms.id, roomId));
}

/** Notes the org-chart headers of a room just created from one (not a content change: no version bump). */
export async function setOrgChart(tx: Q, roomId: number, saved: string | null): Promise<void> {
  await tx.update(rooms).set({ orgChart: saved }).where(eq(rooms.id, roomId));
}

export async function deleteRoom(roomId: number): Promise<void> {
  await db.delete(rooms).where(eq(rooms.id, roomId));
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

export async function roomPeople(tx: Q, roomId: number): Promise<PersonDto[]> {
  return tx.select(personColumns).from(people).where(eq(people.roomId, roomId)).orderBy(asc(people.orderIndex), asc(people.id));
}

/** People with their manager keys, in room order, for the org-chart export. */
export async function orgChartPeople(
  tx: Q,
  roomId: number,
): Promise<{ key: string; name: string; group: string | null; managerKey: string | null }[]> {
  return tx
    .select({ key: people.personKey, name: people.name, group: people.groupName, managerKey: people.managerKey })
    .from(people)
    .where(eq(people.roomId, roomId))
    .orderBy(asc(people.orderIndex), asc(people.id));
}

export async function roomOrgChart(tx: Q, roomId: number): Promise<string | null> {
  const [row] = await tx.select({ orgChart: rooms.orgChart }).from(rooms).where(eq(rooms.id, roomId));
  return row?.orgChart ?? null;
}

export async function roomTies(tx: Q, roomId: number): Promise<TieDto[]> {
  return tx
    .select({ id: ties.id, sourceId: ties.sourceId, targetId: ties.targetId, strength: ties.strength })
    .from(ties)
    .where(eq(ties.roomId, roomId))
    .orderBy(asc(ties.id));
}

export async function maxOrder(tx: Q, roomId: number): Promise<number> {
  const [row] = await tx
    .select({ m: sql<number | null>`MAX(${people.orderIndex})` })
    .from(people)
    .where(eq(people.roomId, roomId));
  return row?.m === null || row?.m === undefined ? -1 : Number(row.m);
}

export async function countContent(tx: Q, roomId: number): Promise<{ people: number; ties: number }> {
  const [p] = await tx
    .select({ n: sql<number>`COUNT(*)` })
    .from(people)
    .where(eq(people.roomId, roomId));
  const [t] = await tx
    .select({ n: sql<number>`COUNT(*)` })
    .from(ties)
    .where(eq(ties.roomId, roomId));
  return { people: Number(p.n), ties: Number(t.n) };
}

// ---- lists ----

export interface ListParams<S extends string> {
  page: number;
  pageSize: number;
  sort: S;
  direction: 'asc' | 'desc';
  q?: string;
}

const iso = (d: Date) => d.toISOString();

type RoomScope = 'all' | 'mine' | 'shared';
type Param<T> = T | Placeholder;

/**
 * Which rooms `userId` may open: owned, shared directly (the left-joined `room_shares` row of the
 * caller, unique per room and user), or co-facilitated through a workshop.
 */
function roomFilter(userId: Param<number>, scope: RoomScope, pattern: Param<string> | undefined) {
  const mine = eq(rooms.ownerId, userId);
  const sharedWithMe = or(isNotNull(roomShares.role), workshopEditorOf(userId));
  const filters = [scope === 'mine' ? mine : scope === 'shared' ? sharedWithMe : or(mine, sharedWithMe)];
  if (pattern !== undefined) filters.push(or(like(rooms.name, pattern), like(rooms.description, pattern)));
  return and(...filters);
}

const myShare = (userId: Param<number>) => and(eq(roomShares.roomId, rooms.id), eq(roomShares.userId, userId));

/**
 * The list statement of one shape (scope, sort, direction, search or not), built once per process.
 * The page is chosen and ordered without the description: sorting rows that carry a TEXT column
 * makes MariaDB put its sort table on disk (Aria), which cost more than the rest of the request.
 * The outer select adds the description and the counts for the page's rows only; `pos` keeps
 * the inner order (the outer select has none, so that it sorts nothing).
 */
function roomPageQuery(scope: RoomScope, sort: string, direction: 'asc' | 'desc', search: boolean) {
  const userId = sql.placeholder('userId');
  const countOf = (table: typeof people | typeof ties, roomId: SQL | typeof rooms.id) =>
    sql<number>`(SELECT COUNT(*) FROM ${table} WHERE ${table.roomId} = ${roomId})`;
  const order = direction === 'desc' ? desc : asc;
  const sortBy =
    { name: rooms.name, updatedAt: rooms.updatedAt, people: countOf(people, rooms.id), ties: countOf(ties, rooms.id) }[sort] ??
    rooms.updatedAt;
  const ordering = [order(sortBy), asc(rooms.id)];
  const page = db
    .select({
      id: rooms.id,
      name: rooms.name,
      ownerId: rooms.ownerId,
      version: rooms.version,
      updatedAt: rooms.updatedAt,
      ownerName: sql<string>`${users.name}`.as('owner_name'),
      shareRole: sql<'editor' | 'viewer' | null>`${roomShares.role}`.as('share_role'),
      // Asked only where it changes the access shown: not owned, no direct editor share.
      helper:
        sql<number>`CASE WHEN ${rooms.ownerId} <> ${userId} AND (${roomShares.role} IS NULL OR ${roomShares.role} <> 'editor') THEN ${workshopEditorOf(userId)} ELSE 0 END`.as(
          'helper',
        ),
      total: sql<number>`COUNT(*) OVER ()`.as('total'),
      pos: sql<number>`ROW_NUMBER() OVER (ORDER BY ${sql.join(ordering, sql`, `)})`.as('pos'),
    })
    .from(rooms)
    .innerJoin(users, eq(users.id, rooms.ownerId))
    .leftJoin(roomShares, myShare(userId))
    .where(roomFilter(userId, scope, search ? sql.placeholder('pattern') : undefined))
    .orderBy(...ordering)
    .limit(sql.placeholder('limit'))
    .offset(sql.placeholder('offset'))
    .as('page');
  const described = alias(rooms, 'described');
  return db
    .select({
      id: page.id,
      name: page.name,
      description: described.description,
      ownerId: page.ownerId,
      version: page.version,
      updatedAt: page.updatedAt,
      ownerName: page.ownerName,
      shareRole: page.shareRole,
      helper: page.helper,
      people: countOf(people, sql`${page.id}`),
      ties: countOf(ties, sql`${page.id}`),
      total: page.total,
      pos: page.pos,
    })
    .from(page)
    .innerJoin(described, eq(described.id, page.id))
    .prepare();
}

const roomPageQueries = new Map<string, ReturnType<typeof roomPageQuery>>();

/**
 * One page of the rooms `userId` may open, in one statement: the access reasons are a join and
 * a subquery of the same select, and the total comes with every row (`COUNT(*) OVER ()`,
 * computed before LIMIT). Only a page past the end needs a second statement, for its total.
 */
export async function listRooms(userId: number, p: ListParams<string> & { scope: RoomScope }): Promise<Page<RoomListItem>> {
  const shape = `${p.scope}|${p.sort}|${p.direction}|${p.q ? 'q' : ''}`;
  let query = roomPageQueries.get(shape);
  if (!query) roomPageQueries.set(shape, (query = roomPageQuery(p.scope, p.sort, p.direction, !!p.q)));
  const pattern = p.q ? contains(p.q) : undefined;
  const rows = (await query.execute({ userId, pattern, limit: p.pageSize, offset: p.page * p.pageSize })).sort(
    (a, b) => Number(a.pos) - Number(b.pos),
  );
  const total = rows.length ? Number(rows[0].total) : p.page > 0 ? await countRooms(userId, p.scope, pattern) : 0;
  return {
    total,
    page: p.page,
    pageSize: p.pageSize,
    items: rows.map((r) => ({
      id: r.id,
      name: r.name,
      description: r.description,
      access: r.ownerId === userId ? 'owner' : Number(r.helper) ? 'editor' : (r.shareRole ?? 'viewer'),
      ownerName: r.ownerName,
      people: Number(r.people),
      ties: Number(r.ties),
      version: r.version,
      updatedAt: iso(r.updatedAt),
    })),
  };
}

async function countRooms(userId: number, scope: RoomScope, pattern: string | undefined): Promise<number> {
  const [{ total }] = await db
    .select({ total: sql<number>`COUNT(*)` })
    .from(rooms)
    .leftJoin(roomShares, myShare(userId))
    .where(roomFilter(userId, scope, pattern));
  return Number(total);
}

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
  const [{ total }] = await db
    .select({ total: sql<number>`COUNT(*)` })
    .from(people)
    .where(where);
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
  const [{ total }] = await db
    .select({ total: sql<number>`COUNT(*)` })
    .from(ties)
    .innerJoin(s, eq(s.id, ties.sourceId))
    .innerJoin(t, eq(t.id, ties.targetId))
    .where(where);
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

export async function updatePeopleRows(tx: Tx, roomId: number, id: number, set: Partial<typeof people.$inferInsert>): Promise<void> {
  await tx
    .update(people)
    .set(set)
    .where(and(eq(people.id, id), eq(people.roomId, roomId)));
}

export async function deletePeopleRows(tx: Tx, roomId: number, ids: number[]): Promise<void> {
  if (ids.length === 0) return;
  await tx.delete(ties).where(and(eq(ties.roomId, roomId), or(inArray(ties.sourceId, ids), inArray(ties.targetId, ids))));
  await tx.delete(people).where(and(eq(people.roomId, roomId), inArray(people.id, ids)));
}

export async function deleteTieRows(tx: Tx, roomId: number, ids: number[]): Promise<void> {
  if (ids.length === 0) return;
  await tx.delete(ties).where(and(eq(ties.roomId, roomId), inArray(ties.id, ids)));
}

export async function updateTieRow(tx: Tx, roomId: number, id: number, strength: number): Promise<void> {
  await tx
    .update(ties)
    .set({ strength })
    .where(and(eq(ties.id, id), eq(ties.roomId, roomId)));
}

export async function insertPeopleRows(tx: Tx, roomId: number, folk: PersonRowInput[], firstOrder: number): Promise<number[]> {
  return insertContent(tx, roomId, folk, [], firstOrder);
}

export async function insertTieRows(
  tx: Tx,
  roomId: number,
  links: { sourceId: number; targetId: number; strength: number }[],
): Promise<number[]> {
  const ids: number[] = [];
  for (let at = 0; at < links.length; at += CHUNK) {
    const got = await tx
      .insert(ties)
      .values(links.slice(at, at + CHUNK).map((l) => ({ roomId, ...l })))
      .$returningId();
    ids.push(...got.map((g) => g.id));
  }
  return ids;
}

/** Many positions in one statement per chunk (a drag of many people is one autosave). */
export async function movePeopleRows(
  tx: Tx,
  roomId: number,
  moves: { id: number; x: number; y: number; pinned?: boolean }[],
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
