import { and, eq, ne } from 'drizzle-orm';
import { rooms, roomShares } from '../../db/schema/rooms';
import { workshopFacilitators } from '../../db/schema/workshops';
import { db, type Tx } from '../db';

/**
 * Co-facilitators run the workshop's room with the owner: they get editor access to it, so
 * the room, plan, rehearsal and replay pages open for them too. An existing share is never
 * downgraded, and the room's owner needs none.
 */
export async function shareWorkshopRoom(workshopId: number, roomId: number | null, q: Tx | typeof db = db): Promise<void> {
  if (roomId === null) return;
  const [room] = await q.select({ ownerId: rooms.ownerId }).from(rooms).where(eq(rooms.id, roomId));
  if (!room) return;
  const helpers = await q
    .select({ userId: workshopFacilitators.userId })
    .from(workshopFacilitators)
    .where(and(eq(workshopFacilitators.workshopId, workshopId), ne(workshopFacilitators.userId, room.ownerId)));
  for (const { userId } of helpers) {
    await q
      .insert(roomShares)
      .values({ roomId, userId, role: 'editor' })
      .onDuplicateKeyUpdate({ set: { role: 'editor' } });
  }
}
