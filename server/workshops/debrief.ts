import type { DebriefSettings } from '../../shared/api/workshops';

/**
 * What participants see once results are released. It is fixed at release time (a snapshot),
 * so later edits to the room do not change what people were shown, and a participant link
 * reads only its holder's own entry plus the room-wide figures.
 */
export interface DebriefSnapshot extends DebriefSettings {
  seed: string;
  minutesPerHop: number;
  roomAverage: number | null;
  reachCurve: number[];
  replayReached: number[];
  peopleInMap: number;
  starters: string[];
  /** Keyed by room person id. */
  byPerson: Record<string, { expectedHops: number | null; heardAtHop: number | null; starter: boolean }>;
}

export interface DebriefInput {
  rehearsalId: number;
  sampleRun: number;
  seed: string;
  minutesPerHop: number;
  roomAverage: number | null;
  /** Share of the whole room reached by hop t. */
  roomByHop: number[];
  people: { personId: number; name: string; starter: boolean; expectedHops: number | null; heardAt: number | null }[];
}

/** Pure: the snapshot from the plan's figures and one replayed cascade. */
export function composeDebrief(input: DebriefInput, releasedAt = new Date()): DebriefSnapshot {
  const lastHop = input.people.reduce((m, p) => (p.heardAt !== null && p.heardAt > m ? p.heardAt : m), 0);
  const replayReached = Array.from(
    { length: lastHop + 1 },
    (_, t) => input.people.filter((p) => p.heardAt !== null && p.heardAt <= t).length,
  );
  const byPerson: DebriefSnapshot['byPerson'] = {};
  for (const p of input.people) {
    byPerson[String(p.personId)] = {
      expectedHops: p.expectedHops !== null && Number.isFinite(p.expectedHops) ? p.expectedHops : null,
      heardAtHop: p.heardAt,
      starter: p.starter,
    };
  }
  return {
    rehearsalId: input.rehearsalId,
    sampleRun: input.sampleRun,
    releasedAt: releasedAt.toISOString(),
    seed: input.seed,
    minutesPerHop: input.minutesPerHop,
    roomAverage: input.roomAverage,
    reachCurve: input.roomByHop.map((v) => Math.round(v * 10000) / 10000),
    replayReached,
    peopleInMap: input.people.length,
    starters: input.people.filter((p) => p.starter).map((p) => p.name),
    byPerson,
  };
}
