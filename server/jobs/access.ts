/** A job is visible exactly when its room is: someone else's job answers 404. */
import { notFound } from '../core/http-error';
import { HttpError } from '../core/http-error';
import { loadRoomFor, type RoomNeed } from '../rooms/access';
import type { SignedInUser } from '../types';
import { findJob, type JobRow } from './store';
import { idOf } from '../core/ids';

/** Runs the room check, turning the room's 404 into one about the item asked for. */
export async function roomAccess(user: SignedInUser | undefined, roomId: number, need: RoomNeed, what: string) {
  try {
    return await loadRoomFor(user, roomId, need);
  } catch (e) {
    if (e instanceof HttpError && e.status === 404) throw notFound(what);
    throw e;
  }
}

export async function loadJobFor(user: SignedInUser | undefined, raw: unknown, need: RoomNeed): Promise<JobRow> {
  const job = await findJob(idOf(raw, 'That job'));
  if (!job) throw notFound('That job');
  await roomAccess(user, job.roomId, need, 'That job');
  return job;
}
