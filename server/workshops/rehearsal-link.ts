import { HttpError } from '../core/http-error';
import { planDetail } from '../plans/dto';
import { findPlan, roomVersion } from '../plans/service';
import { replayIndex, replaySample } from '../rehearsals/replay';
import { loadRehearsalFor } from '../rehearsals/service';
import type { SignedInUser } from '../types';
import type { DebriefInput } from './debrief';
import { itemAt } from '../../shared/checked';

/** What the debrief needs from one rehearsal and one of its stored cascades (plans server). */
export async function loadReplayForDebrief(
  owner: SignedInUser,
  rehearsalId: number,
  sample: number,
): Promise<Omit<DebriefInput, 'rehearsalId' | 'sampleRun'> & { roomId: number }> {
  const row = await loadRehearsalFor(owner, rehearsalId, 'view');
  const index = await replayIndex(row);
  if (!index.samples.some((s) => s.n === sample)) {
    throw new HttpError(400, 'unknown_sample', `This rehearsal keeps cascades 1 to ${index.samples.length}; choose one of those.`);
  }
  const cascade = await replaySample(row, String(sample));
  const plan = (await findPlan(row.rehearsal.planId))!;
  const detail = planDetail(plan, (await roomVersion(plan.roomId)) ?? plan.roomVersion);
  const hops = new Map(detail.perPerson.map((p) => [p.personId, p.expectedHops]));
  return {
    roomId: row.rehearsal.roomId,
    seed: index.seed,
    minutesPerHop: index.minutesPerHop,
    roomAverage: detail.average,
    roomByHop: detail.reach?.roomByHop ?? [],
    people: index.people.map((p) => ({
      personId: p.personId,
      name: p.name,
      starter: p.starter,
      expectedHops: hops.get(p.personId) ?? null,
      heardAt: itemAt(cascade.heardAt, p.index, 'cascade heard-at'),
    })),
  };
}
