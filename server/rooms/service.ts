/** Rooms domain: create, read, change settings with a version check, duplicate, delete. */
import { DEFAULT_ROOM_SETTINGS, STALE_MESSAGE, type RoomDto, type RoomSettings, type StaleVersionDetails } from '../../shared/api/rooms';
import { db, type Conn, type Tx } from '../db';
import type { AuditWriter } from '../core/audit';
import { HttpError, notFound } from '../core/http-error';
import { settingsOf, type LoadedRoom, type RoomRow } from './access';
import { checkContent, pairKey, type RoomContent } from './content';
import type { CreateRoomInput } from './schemas';
import * as store from './store';
import { runInPlanPool, TimeLimitError } from '../jobs/pools';
import type { RoomSummary } from '../../shared/api/rooms';
import { loadRoomGraph } from './access';

/**
 * Room rows and content as the workshops feature writes them when it builds a room from survey
 * answers (workshops/room-build.ts), inside its own transaction.
 */
export { bumpVersion, insertPeopleRows, insertRoom, insertTieRows, lockRoom, maxOrder, roomPeople, updateRoomFields } from './store';

export function staleVersion(room: RoomRow, yourVersion: number, withCurrent = false): HttpError {
  const details: StaleVersionDetails = { currentVersion: room.version, yourVersion, message: STALE_MESSAGE };
  if (withCurrent) details.current = { name: room.name, description: room.description, settings: settingsOf(room) };
  return new HttpError(409, 'stale_version', STALE_MESSAGE, details);
}

export async function createRoom(ownerId: number, input: CreateRoomInput): Promise<number> {
  const settings: RoomSettings = { ...DEFAULT_ROOM_SETTINGS, ...input.settings };
  const content = checkContent(input.people ?? [], input.ties ?? [], settings);
  return db.transaction(async (tx) => createWithContent(ownerId, input.name, input.description ?? '', settings, content, tx));
}

export async function createWithContent(
  ownerId: number,
  name: string,
  description: string,
  settings: RoomSettings,
  content: RoomContent,
  tx: Tx,
): Promise<number> {
  const roomId = await store.insertRoom({ ownerId, name, description, settings }, tx);
  await store.insertContent(roomId, content.people, content.ties, 0, tx);
  return roomId;
}

/** What an import writes besides people and ties, and how it is audited (action room.import). */
export interface ImportWrite {
  content: RoomContent;
  /** The org-chart headers to keep with the room (null: none); left as it is when undefined. */
  orgChart?: string | null;
  audit: AuditWriter;
  detail: Record<string, unknown>;
}

/** A new room from an imported file, with its audit entry, in one transaction. */
export async function createImportedRoom(ownerId: number, name: string, settings: RoomSettings, w: ImportWrite): Promise<number> {
  return db.transaction(async (tx) => {
    const id = await createWithContent(ownerId, name, '', settings, w.content, tx);
    if (w.orgChart !== undefined) await store.setOrgChart(id, w.orgChart, tx);
    await w.audit({ action: 'room.import', targetType: 'room', targetId: id, detail: w.detail }, tx);
    return id;
  });
}

/** Replaces a room's people and ties (and its direction) from an imported file; returns the new version. */
export async function replaceImportedContent(loaded: LoadedRoom, version: number, directed: boolean, w: ImportWrite): Promise<number> {
  return db.transaction(async (tx) => {
    const room = await store.lockRoom(loaded.room.id, tx);
    if (!room) throw notFound('That room');
    if (room.version !== version) throw staleVersion(room, version);
    await store.clearContent(room.id, tx);
    await store.insertContent(room.id, w.content.people, w.content.ties, 0, tx);
    await store.updateRoomFields(room.id, { directed, orgChart: w.orgChart ?? null }, tx);
    await w.audit({ action: 'room.import', targetType: 'room', targetId: room.id, detail: w.detail }, tx);
    return room.version + 1;
  });
}

/** How many people and ties an import would replace. */
export async function contentCounts(roomId: number): Promise<{ people: number; ties: number }> {
  return store.countContent(roomId);
}

export async function roomDto(loaded: LoadedRoom, tx: Conn = db): Promise<RoomDto> {
  const { room } = loaded;
  const [people, ties] = await Promise.all([store.roomPeople(room.id, tx), store.roomTies(room.id, tx)]);
  return {
    id: room.id,
    name: room.name,
    description: room.description,
    settings: settingsOf(room),
    version: room.version,
    access: loaded.access,
    ownerName: loaded.ownerName,
    people,
    ties,
    updatedAt: room.updatedAt.toISOString(),
  };
}

export interface RoomPatch {
  version: number;
  name?: string;
  description?: string;
  settings?: Partial<RoomSettings>;
}

/** Changes name, description or settings; a stale version answers 409 with what is stored now. */
export async function updateRoom(roomId: number, patch: RoomPatch): Promise<void> {
  await db.transaction(async (tx) => {
    const room = await store.lockRoom(roomId, tx);
    if (!room) throw notFound('That room');
    if (room.version !== patch.version) throw staleVersion(room, patch.version, true);
    if (patch.settings?.directed === false && room.directed) await checkUndirectedPairs(roomId, tx);
    await store.updateRoomFields(
      roomId,
      {
        ...(patch.name !== undefined ? { name: patch.name } : {}),
        ...(patch.description !== undefined ? { description: patch.description } : {}),
        ...patch.settings,
      },
      tx,
    );
  });
}

/** Turning a directed room undirected would make a -> b and b -> a one doubled tie: refuse, and say which. */
async function checkUndirectedPairs(roomId: number, tx: Tx): Promise<void> {
  const tieRows = await store.roomTies(roomId, tx);
  const seen = new Set<string>();
  const pairs: { a: number; b: number }[] = [];
  for (const t of tieRows) {
    const k = pairKey(t.sourceId, t.targetId, false);
    if (seen.has(k)) pairs.push({ a: Math.min(t.sourceId, t.targetId), b: Math.max(t.sourceId, t.targetId) }); // as pairKey orders them
    seen.add(k);
  }
  if (pairs.length === 0) return;
  const nameOf = new Map((await store.roomPeople(roomId, tx)).map((p) => [p.id, p.name]));
  const named = pairs.slice(0, 5).map(({ a, b }) => `${nameOf.get(a)} - ${nameOf.get(b)}`);
  throw new HttpError(
    409,
    'reciprocal_ties',
    `The room has ${pairs.length} pair${pairs.length === 1 ? '' : 's'} tied both ways (${named.join(', ')}${pairs.length > 5 ? ', ...' : ''}). ` +
      'An undirected room keeps one tie per pair: delete one tie of each pair first.',
    { pairs: pairs.length },
  );
}

/** Copies a room (content, layout, settings; not its shares) into a new room of `ownerId`. */
export async function duplicateRoom(loaded: LoadedRoom, ownerId: number, name?: string): Promise<number> {
  return db.transaction(async (tx) => {
    const { room } = loaded;
    const personRows = await store.roomPeople(room.id, tx);
    const tieRows = await store.roomTies(room.id, tx);
    const at = new Map(personRows.map((p, i) => [p.id, i]));
    const content: RoomContent = {
      people: personRows.map(({ key, name: n, group, email, x, y, pinned }) => ({ key, name: n, group, email, x, y, pinned })),
      ties: tieRows.map((t) => ({ source: at.get(t.sourceId)!, target: at.get(t.targetId)!, strength: t.strength })),
    };
    const copyName = name ?? `${room.name} (copy)`.slice(0, 120);
    return createWithContent(ownerId, copyName, room.description, settingsOf(room), content, tx);
  });
}

/** The summary takes at most this long (a room of the largest size plans in well under it). */
const SUMMARY_LIMIT_MS = 60_000;

/** Counts, parts, closed groups and the first hint, computed in the plan worker pool. */
export async function roomSummary(roomId: number): Promise<RoomSummary> {
  const loaded = await loadRoomGraph(roomId);
  try {
    const outcome = await runInPlanPool({ kind: 'summary', loaded }, { hardLimitMs: SUMMARY_LIMIT_MS });
    if ('error' in outcome) throw new HttpError(422, 'summary_failed', outcome.error.message);
    return outcome.ok as RoomSummary;
  } catch (e) {
    if (e instanceof TimeLimitError)
      throw new HttpError(
        503,
        'summary_too_slow',
        `The room summary took longer than ${SUMMARY_LIMIT_MS / 1000} s and was stopped. Try again later, or plan the room directly.`,
      );
    throw e;
  }
}
