/** A participant's own debrief entry and the room-wide figures, read from the snapshot taken at release. */
import type { MyDebrief } from '../../shared/api/workshops';
import { HttpError } from '../core/http-error';
import type { DebriefSnapshot } from '../workshops/debrief';
import type { LinkHolder } from './links';
import { workshopById } from './store';

export async function myDebrief(holder: LinkHolder): Promise<MyDebrief> {
  const w = await workshopById(holder.workshopId);
  const snap = w?.debrief as DebriefSnapshot | null | undefined;
  if (!w || !snap || (w.status !== 'debrief' && w.status !== 'closed')) {
    throw new HttpError(
      409,
      'not_released',
      'Results are not released yet. Your facilitator will release them during the debrief; keep this link.',
    );
  }
  const mine = holder.personId === null ? undefined : snap.byPerson[holder.personId];
  return {
    name: holder.participantName,
    workshopTitle: w.title,
    inMap: mine !== undefined,
    starter: mine?.starter ?? false,
    expectedHops: mine?.expectedHops ?? null,
    heardAtHop: mine?.heardAtHop ?? null,
    minutesPerHop: snap.minutesPerHop,
    roomAverage: snap.roomAverage,
    reachCurve: snap.reachCurve,
    replayReached: snap.replayReached,
    peopleInMap: snap.peopleInMap,
    starters: w.showStarters ? snap.starters : null,
    seed: snap.seed,
  };
}
