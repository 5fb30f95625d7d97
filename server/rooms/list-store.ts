/** The rooms list (GET /api/rooms): one prepared statement per list shape. */
import { and, asc, desc, eq, isNotNull, like, or, sql, type Placeholder } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import type { Page } from '../../shared/api/lists';
import type { RoomListItem } from '../../shared/api/rooms';
import { firstOf } from '../../shared/checked';
import { users } from '../../db/schema/accounts';
import { roomShares, rooms } from '../../db/schema/rooms';
import { db } from '../db';
import { workshopEditorOf } from './grants-store';
import { contains, iso, type ListParams } from './store';

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
 * The outer select adds the description for the page's rows only; `pos` keeps
 * the inner order (the outer select has none, so that it sorts nothing).
 */
function roomPageQuery(scope: RoomScope, sort: string, direction: 'asc' | 'desc', search: boolean) {
  const userId = sql.placeholder('userId');
  const order = direction === 'desc' ? desc : asc;
  // The counts are stored with the room (kept by every content write), never counted here.
  const sortBy =
    { name: rooms.name, updatedAt: rooms.updatedAt, people: rooms.peopleCount, ties: rooms.tiesCount }[sort] ?? rooms.updatedAt;
  const ordering = [order(sortBy), asc(rooms.id)];
  const page = db
    .select({
      id: rooms.id,
      name: rooms.name,
      ownerId: rooms.ownerId,
      version: rooms.version,
      updatedAt: rooms.updatedAt,
      people: sql<number>`${rooms.peopleCount}`.as('n_people'),
      ties: sql<number>`${rooms.tiesCount}`.as('n_ties'),
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
      people: page.people,
      ties: page.ties,
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
  const first = rows[0];
  const total = first ? Number(first.total) : p.page > 0 ? await countRooms(userId, p.scope, pattern) : 0;
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
  const counted = await db
    .select({ total: sql<number>`COUNT(*)` })
    .from(rooms)
    .leftJoin(roomShares, myShare(userId))
    .where(roomFilter(userId, scope, pattern));
  return Number(firstOf(counted, 'room count').total);
}
