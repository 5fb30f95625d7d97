/**
 * Replay data of a rehearsal: stored sample cascades, hop by hop (GET /api/rehearsals/:id/samples,
 * /samples/:n, or all of it in one answer: GET /api/rehearsals/:id/replay).
 */

export interface ReplayPersonDto {
  index: number;
  personId: number;
  name: string;
  group: string | null;
  x: number | null;
  y: number | null;
  starter: boolean;
}

export interface ReplayIndex {
  rehearsalId: number;
  seed: string;
  runs: number;
  minutesPerHop: number;
  /** Person ids in briefing order. */
  starters: number[];
  people: ReplayPersonDto[];
  ties: { source: number; target: number; strength: number }[];
  directed: boolean;
  samples: { n: number; run: number }[];
}

export interface ReplayChain {
  /** The person whose question this is (index into ReplayIndex.people). */
  person: number;
  /** Indices visited, from the person to the starter reached. */
  path: number[];
  hops: number;
  /** The stored path was cut (hops still counts the whole walk). */
  truncated: boolean;
  /** The walk hit the hop cap without reaching a starter. */
  capped: boolean;
}

export interface ReplaySample {
  rehearsalId: number;
  n: number;
  run: number;
  seed: string;
  /** heardAt[i] = hop at which person i heard (0 for starters; null: cannot be reached or capped). */
  heardAt: (number | null)[];
  chains: ReplayChain[];
  lastHop: number;
}

/** Everything the replay shows, in one answer (GET /api/rehearsals/:id/replay): the index and every sample, in order. */
export interface ReplayBundle {
  index: ReplayIndex;
  samples: ReplaySample[];
}
