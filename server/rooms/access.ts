/**
 * Who may do what with a room. Every rooms route (and the plans and rehearsals built on
 * rooms) loads its room through `loadRoomFor`: a room the caller may not see answers 404,
 * never 403, so room ids cannot be probed; a viewer asking to change something gets 403.
 */
import type { RoomGraph } from '../../shared/engine/index';
import type { RoomAccess, RoomSettings } from '../../shared/api/rooms';
import { db, type Conn } from '../db';
import { forbidden, notFound, unauthorized } from '../core/http-error';
import { idOf } from '../core/ids';
import { graphPeople, graphTies, roomAccessRow, roomRow, type RoomRow } from './access-store';
import type { SignedInUser } from '../types';

export type RoomNeed = 'view' | 'edit' | 'own';
export type { RoomRow } from './access-store';

export interface LoadedRoom {
  room: RoomRow;
  access: RoomAccess;
  ownerName: string;
}

const ALLOWED: Record<RoomNeed, readonly RoomAccess[]> = {
  view: ['owner', 'editor', 'viewer'],
  edit: ['owner', 'editor'],
  own: ['owner'],
};

/** Parses a room id from a URL; anything that is not a positive integer is simply not found. */
export function roomIdOf(raw: unknown): number {
  return idOf(raw, 'That room');
}

export async function loadRoomFor(user: SignedInUser | undefined, roomId: unknown, need: RoomNeed, tx: Conn = db): Promise<LoadedRoom> {
  if (!user) throw unauthorized();
  const id = roomIdOf(roomId);
  const row = await roomAccessRow(user.id, id, tx);
  if (!row) throw notFound('That room');
  const access: RoomAccess | undefined =
    row.room.ownerId === user.id ? 'owner' : Number(row.helper) ? 'editor' : (row.shareRole ?? undefined);
  if (!access) throw notFound('That room');
  if (!ALLOWED[need].includes(access)) {
    throw forbidden(
      need === 'edit'
        ? 'You can view this room but not change it: ask its owner for editor access.'
        : 'Only the owner of this room can do this.',
    );
  }
  return { room: row.room, access, ownerName: row.ownerName };
}

export function settingsOf(room: RoomRow): RoomSettings {
  return { directed: room.directed, minutesPerHop: room.minutesPerHop, laziness: room.laziness, mixing: room.mixing };
}

export interface LoadedRoomGraph {
  /** People in the room's stable order (order index, then id); ids are the people keys. */
  graph: RoomGraph;
  /** Engine index -> person id. */
  personIds: number[];
  /** Engine index -> display name. */
  names: string[];
  settings: RoomSettings;
  version: number;
}

/** The room as the engine sees it, for the summary, the planners and rehearsals. Throws notFound if gone. */
export async function loadRoomGraph(roomId: number, tx: Conn = db): Promise<LoadedRoomGraph> {
  const room = await roomRow(roomId, tx);
  if (!room) throw notFound('That room');
  const people = await graphPeople(roomId, tx);
  const tieRows = await graphTies(roomId, tx);
  const indexOf = new Map<number, number>();
  people.forEach((p, i) => indexOf.set(p.id, i));
  const graph: RoomGraph = {
    ids: people.map((p) => p.key),
    labels: people.map((p) => p.name),
    groups: people.map((p) => p.group),
    directed: room.directed,
    ties: tieRows.map((l) => ({ source: indexOf.get(l.s)!, target: indexOf.get(l.t)!, strength: l.w })),
  };
  return { graph, personIds: people.map((p) => p.id), names: people.map((p) => p.name), settings: settingsOf(room), version: room.version };
}
