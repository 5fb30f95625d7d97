import { directShareRole, facilitatorUserIds, type WorkshopRow } from './store';

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
  return { roomId: w.roomId, directShare: await directShareRole(w.roomId, userId) };
}

/** The co-facilitators of a workshop (user ids), for the audit line when it is deleted. */
export async function coFacilitatorIds(workshopId: number): Promise<number[]> {
  return facilitatorUserIds(workshopId);
}
