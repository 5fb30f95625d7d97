import { and, eq } from 'drizzle-orm';
import { roomShares } from '../../db/schema/rooms';
import { workshopFacilitators } from '../../db/schema/workshops';
import { db } from '../db';
import type { WorkshopRow } from './store';

/**
 * Co-facilitators run the workshop's room with the owner: while they co-facilitate, they have
 * editor access to it (server/rooms/grants.ts derives it from workshop_facilitators), so the
 * room, plan, rehearsal and replay pages open for them too. Nothing is written into the room's
 * shares, so removal, or deleting the workshop, ends that access at once, and a share the room's
 * owner gave directly keeps its own role. Each change is audited with what it did to room access.
 */
export interface RoomAccessNote {
  roomId: number | null;
  /** The direct share the person also holds on the room (kept as it is), if any. */
  directShare: 'editor' | 'viewer' | null;
}

export async function roomAccessNote(w: WorkshopRow, userId: number): Promise<RoomAccessNote> {
  if (w.roomId === null) return { roomId: null, directShare: null };
  const [share] = await db
    .select({ role: roomShares.role })
    .from(roomShares)
    .where(and(eq(roomShares.roomId, w.roomId), eq(roomShares.userId, userId)));
  return { roomId: w.roomId, directShare: share?.role ?? null };
}

/** The co-facilitators of a workshop (user ids), for the audit line when it is deleted. */
export async function coFacilitatorIds(workshopId: number): Promise<number[]> {
  const rows = await db
    .select({ userId: workshopFacilitators.userId })
    .from(workshopFacilitators)
    .where(eq(workshopFacilitators.workshopId, workshopId));
  return rows.map((r) => r.userId);
}
