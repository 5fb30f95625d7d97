/** The reads behind room access (rooms/access.ts): a room with the caller's share or helper role, and a room's graph. */
import { and, asc, eq } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { people, roomShares, rooms, ties } from '../../db/schema/rooms';
import { db, type Conn } from '../db';
import { workshopEditorOf } from './grants-store';

export type RoomRow = typeof rooms.$inferSelect;

export interface RoomAccessRow {
  room: RoomRow;
  ownerName: string;
  shareRole: 'editor' | 'viewer' | null;
  /** Editor by co-facilitating a workshop on the room (rooms/grants-store.ts). */
  helper: boolean;
}

export async function roomAccessRow(userId: number, roomId: number, tx: Conn = db): Promise<RoomAccessRow | undefined> {
  const [row] = await tx
    .select({ room: rooms, ownerName: users.name, shareRole: roomShares.role, helper: workshopEditorOf(userId) })
    .from(rooms)
    .innerJoin(users, eq(users.id, rooms.ownerId))
    .leftJoin(roomShares, and(eq(roomShares.roomId, rooms.id), eq(roomShares.userId, userId)))
    .where(eq(rooms.id, roomId));
  return row;
}

export async function roomRow(roomId: number, tx: Conn = db): Promise<RoomRow | undefined> {
  const [room] = await tx.select().from(rooms).where(eq(rooms.id, roomId));
  return room;
}

/** The room's people in its stable order (order index, then id). */
export async function graphPeople(
  roomId: number,
  tx: Conn = db,
): Promise<{ id: number; key: string; name: string; group: string | null }[]> {
  return tx
    .select({ id: people.id, key: people.personKey, name: people.name, group: people.groupName })
    .from(people)
    .where(eq(people.roomId, roomId))
    .orderBy(asc(people.orderIndex), asc(people.id));
}

export async function graphTies(roomId: number, tx: Conn = db): Promise<{ s: number; t: number; w: number }[]> {
  return tx
    .select({ s: ties.sourceId, t: ties.targetId, w: ties.strength })
    .from(ties)
    .where(eq(ties.roomId, roomId))
    .orderBy(asc(ties.id));
}
