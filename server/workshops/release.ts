import { HttpError } from '../core/http-error';
import type { SignedInUser } from '../types';
import { composeDebrief } from './debrief';
import { loadReplayForDebrief } from './rehearsal-link';
import { updateWorkshop, type WorkshopRow } from './store';

/**
 * Releases the debrief: fixes what participants will see (from one rehearsal of a plan on
 * the workshop's room and one of its stored cascades) and moves the workshop to debrief.
 */
export async function releaseDebrief(
  w: WorkshopRow,
  owner: SignedInUser,
  body: { rehearsalId: number; sampleRun: number; showStarters: boolean },
): Promise<void> {
  if (w.status !== 'running' && w.status !== 'debrief') {
    throw new HttpError(409, 'status_move', 'Results can be released while the workshop is running (close the survey first).');
  }
  if (w.roomId === null)
    throw new HttpError(409, 'no_room', 'Build the room from the answers, plan and rehearse before releasing results.');
  const replay = await loadReplayForDebrief(owner, body.rehearsalId, body.sampleRun);
  if (replay.roomId !== w.roomId) {
    throw new HttpError(400, 'wrong_room', 'That rehearsal belongs to another room. Choose a rehearsal of this workshop’s room.');
  }
  const snapshot = composeDebrief({ ...replay, rehearsalId: body.rehearsalId, sampleRun: body.sampleRun });
  await updateWorkshop(w.id, { debrief: snapshot, showStarters: body.showStarters, status: 'debrief' });
}
