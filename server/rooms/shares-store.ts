/** Rows of room_shares: who else may see or change a room, as editor or viewer. */
import { and, asc, eq } from 'drizzle-orm';
import type { ShareRole } from '../../shared/api/rooms';
import { users } from '../../db/schema/accounts';
import { roomShares } from '../../db/schema/rooms';
import { db, type Conn } from '../db';

export interface ShareRow {
  userId: number;
  email: string;
  name: string;
  role: ShareRole;
  createdAt: Date;
}

export async function shareRows(roomId: number, tx: Conn = db): Promise<ShareRow[]> {
  return tx
    .select({ userId: users.id, email: users.email, name: users.name, role: roomShares.role, createdAt: roomShares.createdAt })
    .from(roomShares)
    .innerJoin(users, eq(users.id, roomShares.userId))
    .where(eq(roomShares.roomId, roomId))
    .orderBy(asc(users.name), asc(users.id));
}

export async function shareRoleOf(roomId: number, userId: number, tx: Conn = db): Promise<ShareRole | undefined> {
  const [row] = await tx
    .select({ role: roomShares.role })
    .from(roomShares)
    .where(and(eq(roomShares.roomId, roomId), eq(roomShares.userId, userId)));
  return row?.role;
}

export async function insertShare(roomId: number, userId: number, role: ShareRole, tx: Conn = db): Promise<void> {
  await tx.insert(roomShares).values({ roomId, userId, role });
}

export async function updateShareRole(roomId: number, userId: number, role: ShareRole, tx: Conn = db): Promise<void> {
  await tx
    .update(roomShares)
    .set({ role })
    .where(and(eq(roomShares.roomId, roomId), eq(roomShares.userId, userId)));
}

/** Deletes the share; false when there was none. */
export async function deleteShare(roomId: number, userId: number, tx: Conn = db): Promise<boolean> {
  const result = await tx.delete(roomShares).where(and(eq(roomShares.roomId, roomId), eq(roomShares.userId, userId)));
  return result[0].affectedRows !== 0;
}
