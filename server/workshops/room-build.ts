import { DEFAULT_ROOM_SETTINGS } from '../../shared/api/rooms';
import type { BuildMode, BuildResult, MissingAnswer } from '../../shared/api/workshops';
import { db, type Conn, type Tx } from '../db';
import { HttpError } from '../core/http-error';
import { keyMaker } from '../rooms/content';
import * as roomService from '../rooms/service';
import type { SignedInUser } from '../types';
import { loadRoomFor } from '../rooms/access';
import {
  answeredIds,
  deleteTiesAmong,
  nominationsOf,
  participantsById,
  setParticipantPerson,
  updateWorkshop,
  type WorkshopRow,
} from './store';
import { missingMeaning, tiesFromAnswers } from './ties-from-answers';
import { itemAt } from '../../shared/checked';

/**
 * Builds or updates the workshop's room from the survey answers, in one transaction:
 * a new room when the workshop has none; a person for every participant not yet in it; the
 * ties among the survey's people replaced by those the answers give (ties touching anyone
 * else in the room are kept). Uses the rooms store, so versions and order stay consistent.
 */
export async function missingAnswers(workshopId: number, mode: BuildMode, tx: Conn = db): Promise<MissingAnswer[]> {
  const [all, answered, edges] = await Promise.all([
    participantsById(workshopId, undefined, tx),
    answeredIds(workshopId, tx),
    nominationsOf(workshopId, tx),
  ]);
  return all
    .filter((p) => !answered.has(p.id))
    .map((p) => {
      const nominatedBy = edges.filter((e) => e.to === p.id).length;
      return { participantId: p.id, name: p.name, nominatedBy, meaning: missingMeaning(nominatedBy, mode) };
    });
}

export async function buildRoom(w: WorkshopRow, owner: SignedInUser, mode: BuildMode): Promise<BuildResult> {
  if (w.roomId !== null) {
    // The owner's rights on the room apply: they linked it to this workshop.
    await loadRoomFor(owner, w.roomId, 'edit').catch((err: unknown) => {
      if (err instanceof HttpError && err.status === 404) {
        throw new HttpError(
          409,
          'room_gone',
          'The room of this workshop was deleted. Unlink it in the workshop settings and build a new one.',
        );
      }
      throw err;
    });
  }
  const directed = mode === 'directed';
  return db.transaction(async (tx) => {
    const roomId = await ensureRoom(w, directed, tx);
    const room = await roomService.lockRoom(roomId, tx);
    if (!room) throw new HttpError(409, 'room_gone', 'The room of this workshop was deleted.');
    const participants = await participantsById(w.id, undefined, tx);
    if (participants.length < 2) throw new HttpError(409, 'too_few', 'Add at least two participants before building the room.');
    const existing = await roomService.roomPeople(roomId, tx);
    const { personOf, added } = await placeParticipants(roomId, participants, existing, tx);
    const built = await rebuildTies(w.id, roomId, personOf, mode, tx);
    if (room.directed !== directed) await roomService.updateRoomFields(roomId, { directed }, tx);
    else await roomService.bumpVersion(roomId, tx);
    return {
      roomId,
      people: existing.length + added,
      ties: built.length,
      mode,
      missing: await missingAnswers(w.id, mode, tx),
    };
  });
}

/** The workshop's room, made (and linked to the workshop) when it has none. */
async function ensureRoom(w: WorkshopRow, directed: boolean, tx: Tx): Promise<number> {
  if (w.roomId !== null) return w.roomId;
  const roomId = await roomService.insertRoom(
    {
      ownerId: w.ownerId,
      name: `${w.title} (from the survey)`.slice(0, 120),
      description: `Built from the survey answers of the workshop “${w.title}” on ${w.sessionDate}.`,
      settings: { ...DEFAULT_ROOM_SETTINGS, directed },
    },
    tx,
  );
  await updateWorkshop(w.id, { roomId }, tx);
  return roomId;
}

/** Each participant's person in the room: the one they have, else a new person; returns participant id -> person id. */
async function placeParticipants(
  roomId: number,
  participants: { id: number; personId: string | null; name: string; email: string | null }[],
  existing: { id: number; key: string }[],
  tx: Tx,
): Promise<{ personOf: Map<number, number>; added: number }> {
  const existingIds = new Set(existing.map((p) => p.id));
  const personOf = new Map<number, number>();
  const toAdd = participants.filter((p) => {
    const id = p.personId === null ? NaN : Number(p.personId);
    if (existingIds.has(id)) {
      personOf.set(p.id, id);
      return false;
    }
    return true;
  });
  if (toAdd.length) {
    const nextKey = keyMaker(existing.map((p) => p.key));
    const first = (await roomService.maxOrder(roomId, tx)) + 1;
    const ids = await roomService.insertPeopleRows(
      roomId,
      toAdd.map((p) => ({ key: nextKey(), name: p.name, group: null, email: p.email, x: null, y: null, pinned: false })),
      first,
      tx,
    );
    for (const [i, participant] of toAdd.entries()) {
      const personId = itemAt(ids, i, 'new person id');
      personOf.set(participant.id, personId);
      await setParticipantPerson(participant.id, personId, tx);
    }
  }
  return { personOf, added: toAdd.length };
}

/** Replaces the ties among the survey's people by those the answers give; returns them. */
async function rebuildTies(workshopId: number, roomId: number, personOf: Map<number, number>, mode: BuildMode, tx: Tx) {
  await deleteTiesAmong(roomId, [...personOf.values()], tx);
  const edges = (await nominationsOf(workshopId, tx))
    .filter((e) => personOf.has(e.from) && personOf.has(e.to))
    .map((e) => ({ from: personOf.get(e.from)!, to: personOf.get(e.to)!, level: e.level }));
  const built = tiesFromAnswers(edges, mode);
  await roomService.insertTieRows(
    roomId,
    built.map((t) => ({ sourceId: t.source, targetId: t.target, strength: t.strength })),
    tx,
  );
  return built;
}
