import { HttpError } from '../core/http-error';
import type { SignedInUser } from '../types';
import type { DebriefInput } from './debrief';

/** What the debrief needs from a rehearsal, through the plans and rehearsals server. */
export async function loadReplayForDebrief(
  _owner: SignedInUser,
  _rehearsalId: number,
  _sample: number,
): Promise<Omit<DebriefInput, 'rehearsalId' | 'sampleRun'> & { roomId: number }> {
  throw new HttpError(503, 'unavailable', 'Rehearsals are not available on this server yet.');
}
