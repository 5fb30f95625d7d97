/** What a branch and bound (plan-exhaustive.ts) starts from, shares between threads and returns. */
import type { SearchResume } from './plan-resume';

export interface ExhaustiveOutcome {
  readonly state: { starters: number[]; total: number };
  readonly complete: boolean;
  readonly stopped: boolean;
  readonly nodes: number;
  /** Proven lower bound on the optimum (scaled hops). */
  readonly lowerBound: number;
  /** Share of the k-sets not decided (0 when complete), over every run of a resumed search. */
  readonly searchLeft: number;
  /** What a later search of the same problem continues from (its `nodes` count every run). */
  readonly resume: SearchResume;
  /** True when this run continued a saved search. */
  readonly resumed: boolean;
}

export interface Incumbent {
  readonly starters: readonly number[];
  readonly rawTotal: number;
  readonly scale: number;
}

/**
 * What a search running on several threads shares (parallel/parallel-branch.ts): the best raw
 * total of all threads, and this thread's pending bound, closed share and node count.
 */
export interface SearchLink {
  best(): number;
  offer(raw: number): void;
  publish(pendingRaw: number, closed: number, nodes: number): void;
}
