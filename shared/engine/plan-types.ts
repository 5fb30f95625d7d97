/** Shapes shared by every planner (see plan.ts for the entry point). */
import type { ErgodicData } from './ergodic';
import type { WalkOptions } from './graph';
import type { SearchResume } from './plan-resume';

export type { SearchResume } from './plan-resume';

export type PlanMethod = 'greedy' | 'widened' | 'swap' | 'exhaustive' | 'lazy-greedy' | 'screen';
export type PlanMethodChoice = PlanMethod | 'auto';

export interface PlanProgress {
  readonly stage: string;
  readonly done: number;
  readonly of: number;
  /** Share of the search space closed (decided), 0..1; only grows during one search. */
  readonly fraction?: number;
  /** Best room total found so far (hops). */
  readonly bestTotal?: number;
  /** Proven lower bound on the best room total so far (hops). */
  readonly lowerBound?: number;
  /** (bestTotal - lowerBound) / bestTotal, 0..1. */
  readonly gap?: number;
  /** Search nodes visited so far. */
  readonly nodes?: number;
}

/** Fill-reducing orders of the sparse exact greedy (docs/sparse-greedy.md section 3). */
export const FILL_ORDERS = ['auto', 'amd', 'nested-dissection'] as const;
export type FillOrderChoice = (typeof FILL_ORDERS)[number];

export interface PlanOptions extends WalkOptions {
  /** Number of starters to brief (1 <= k < n). */
  readonly k: number;
  readonly method?: PlanMethodChoice;
  /** Widened greedy: keep small sets with quality rank >= nu (default 0.9). */
  readonly nu?: number;
  /** Exhaustive (and auto): time budget in milliseconds (default 10 000). */
  readonly timeLimitMs?: number;
  /**
   * Greedy, widened and swap: milliseconds of branch and bound run after the heuristic only to
   * prove a lower bound (default 0: cheap bounds only). Rooms up to 400 people.
   */
  readonly boundMs?: number;
  /** People who must be briefed (indices). */
  readonly mustInclude?: readonly number[];
  /** People who cannot be briefed (indices). */
  readonly exclude?: readonly number[];
  /** Largest room handled with dense matrices (default 2500); larger rooms use lazy greedy. */
  readonly denseLimit?: number;
  /** Undirected rooms from this size on use the sparse exact greedy for method greedy (default 300, and then only when its
   *  factor's work is below the dense greedy's; an explicit value forces the sparse path whenever the factor fits). */
  readonly sparseFrom?: number;
  /** Largest sparse factor (nonzeros) before the iterative path is used (default 4e7). */
  readonly maxFill?: number;
  /** Fill-reducing order of the sparse factor: the cheaper of the two by the symbolic step (auto, the default), or one forced. */
  readonly fillOrder?: FillOrderChoice;
  /** Bottleneck screen: candidate sets evaluated exactly at most (default 200); its time budget is timeLimitMs (default 8 min). */
  readonly screenKeep?: number;
  /** Lazy greedy: people checked exactly per choice (default 3). */
  readonly lazyChecks?: number;
  /** Exact greedy on CG: exact checks a pick may spend before it takes the best checked person (default 40). */
  readonly maxChecksPerPick?: number;
  /** Widened greedy: most seed sets extended (default 64). */
  readonly maxSeeds?: number;
  /** Progress reports; searches report at most about ten times a second. */
  readonly onProgress?: (p: PlanProgress) => void;
  /** Cooperative cancellation: the planner stops at its next check and returns its best plan so far. */
  readonly signal?: AbortSignal;
  /**
   * Cooperative cancellation checked during long searches (inside a worker thread, read a
   * SharedArrayBuffer flag: a message-fed AbortSignal cannot fire while the search runs).
   */
  readonly shouldStop?: () => boolean;
  /**
   * No-show chance P in [0, 0.5]: each starter independently fails to be briefed with chance P;
   * the planner then minimises the expected room total given that at least one starter shows.
   */
  readonly noShow?: number;
  /** Precomputed ergodic data of this room and walk (e.g. from the Node-only parallel kernel). */
  readonly ergodic?: ErgodicData;
  /**
   * Exhaustive and auto: a saved search of the same room, k and constraints (PlanResult.resume of
   * an earlier run) to continue instead of starting over; one that does not fit is ignored (a note says so).
   */
  readonly resume?: SearchResume;
  /** Exhaustive and auto: stop the search after this many nodes (per thread), like a time limit. */
  readonly maxNodes?: number;
}

/**
 * The kinds of plan warning, one code each; the text of a warning says it in words with its
 * numbers. The API's list (shared/api/plans.ts) is the same plus 'note' for a stored text it
 * cannot place; server/plans/warnings.ts fails the type check when the two lists differ.
 */
export const PLAN_WARNING_CODES = [
  /** The branch and bound was stopped (cancel) with part of the search space still open. */
  'search-stopped',
  /** The branch and bound reached its time limit (or node limit) with part of the search space still open. */
  'search-time-limit',
  /** Widened greedy reached the time limit before it had extended every seed. */
  'widening-time-limit',
  /** Swap polish reached the time limit before a pass without improvement. */
  'swap-time-limit',
  /** The room is above the dense limit: a greedy ran instead of the method asked for. */
  'over-dense-limit',
  /** With a no-show chance, too many plans to score each: greedy and swap polish instead of every plan. */
  'no-show-not-exhaustive',
] as const;

export type PlanWarningCode = (typeof PLAN_WARNING_CODES)[number];

/** One warning of a plan: what kind (a stable code to act on) and the sentence to show. */
export interface PlanWarning {
  readonly code: PlanWarningCode;
  readonly text: string;
}

export interface PlanResult {
  /** The method actually used (auto resolves to one of these). */
  readonly method: PlanMethod;
  readonly k: number;
  /** Starter indices in the order chosen. */
  readonly starters: number[];
  readonly total: number;
  readonly average: number;
  /** Quality rank 0..1 (engine.md section 3). */
  readonly rank: number;
  /** Proven lower bound on the best total of any plan of this size under the constraints (identity 6). */
  readonly lowerBound: number;
  /** True when total is proven optimal (within 1e-9 relative). */
  readonly certified: boolean;
  /** total - lowerBound (0 when certified): the gap to best. */
  readonly gap: number;
  readonly elapsedMs: number;
  /** Size of the vertex cover used for the rank and the cover bound. */
  readonly coverSize: number;
  /** Worst single-starter total (rank 0) and the cover bound (rank 1). */
  readonly rankScale: { readonly worst: number; readonly best: number };
  /** (total - lowerBound) / total, 0..1: the proven relative gap to best. */
  readonly relativeGap: number;
  /** True when the search was stopped (cancel) before it finished. */
  readonly stopped?: boolean;
  /** Branch-and-bound nodes visited (searches only). */
  readonly nodes?: number;
  /** Share of the k-sets not yet decided when the search ended, 0..1 (0 when certified), over every run of a resumed search. */
  readonly searchLeft?: number;
  /** Searches: the state a later search of the same problem continues from (options.resume), with the counts of every run. */
  readonly resume?: SearchResume;
  /** The best single starter and its room total (index, hops): what one person alone achieves. */
  readonly bestSingle?: { readonly person: number; readonly total: number };
  /**
   * Fewest starters after whom everyone else hears in one hop (the size of the smallest cover
   * found): a different question from the best single starter.
   */
  readonly fewestForOneHop: number;
  /**
   * Fewest starters with whom everyone can hear at all (one per closed group, plus required
   * people): 1 in a connected room, whatever the speed.
   */
  readonly fewestToReachAll: number;
  /**
   * Share of the possible saving over the best single starter that this plan achieves:
   * (bestSingle.total - total) / (bestSingle.total - lowerBound), clamped to [0, 1]; 1 = proven
   * best of its size. Unlike rank it separates good plans of the same size (see quality.ts).
   */
  readonly gainShare: number;
  /** Set when a no-show chance was given. */
  readonly noShow?: NoShowReport;
  readonly notes: string[];
  readonly warnings: PlanWarning[];
  /** Which linear algebra ran: dense matrices, a sparse LDL^T factor, or an iterative solver (estimates stated in notes). */
  readonly solverPath?: 'dense' | 'sparse-factor' | 'iterative';
  /** Nonzeros of the sparse factor when solverPath is 'sparse-factor'. */
  readonly fill?: number;
}

export interface NoShowReport {
  /** The chance P that a starter does not show up. */
  readonly chance: number;
  /** Expected room total given at least one starter shows (everyone not briefed must hear). */
  readonly expectedTotal: number;
  /** P^k: the chance that nobody shows up (reported beside, not part of the expectation). */
  readonly nobodyChance: number;
  /** The starter whose absence (all others present) costs most, and the room total then. */
  readonly worstAbsence: { readonly person: number; readonly total: number };
  /** For each starter: the best stand-in if that starter is missing, and the room total with it. */
  readonly standIns: readonly { readonly starter: number; readonly person: number; readonly total: number }[];
  /** Exact over all 2^k subsets, or sampled (with the stated standard error). */
  readonly exact: boolean;
  readonly standardError: number;
  /** True when every plan of this size was scored on the expected total (exhaustive). */
  readonly provenBest?: boolean;
}
