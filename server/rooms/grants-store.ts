import { sql, type Placeholder, type SQL } from 'drizzle-orm';
import { roomShares, rooms } from '../../db/schema/rooms';
import { workshopFacilitators, workshops } from '../../db/schema/workshops';

/**
 * Room access has two reasons, kept apart so that each can end on its own:
 *  - a share (room_shares) the room's owner gave directly, as editor or viewer;
 *  - co-facilitating a workshop that runs on the room: editor access for as long as the person
 *    is a co-facilitator of that workshop, the workshop exists, and the workshop's owner may
 *    still change the room (owns it or holds a direct editor share).
 * The second is never written into room_shares, so removing a co-facilitator or deleting the
 * workshop ends it at once, and a direct viewer share is neither upgraded nor lost.
 */
export function workshopEditorOf(userId: number | Placeholder): SQL<boolean> {
  return sql<boolean>`EXISTS (SELECT 1 FROM ${workshopFacilitators}
    INNER JOIN ${workshops} ON ${workshops.id} = ${workshopFacilitators.workshopId}
    WHERE ${workshops.roomId} = ${rooms.id} AND ${workshopFacilitators.userId} = ${userId}
      AND (${workshops.ownerId} = ${rooms.ownerId} OR EXISTS (SELECT 1 FROM ${roomShares} AS owner_share
        WHERE owner_share.room_id = ${rooms.id} AND owner_share.user_id = ${workshops.ownerId} AND owner_share.role = 'editor')))`;
}
