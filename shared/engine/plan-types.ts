/** Shapes shared by every planner (see plan.ts for the entry point). */
import type { ErgodicData } from './ergodic';
import type { WalkOptions } from './graph';

export type PlanMethod = 'greedy' | 'widened' | 'swap' | 'exhaustive' | 'lazy-greedy' | 'screen';
export type PlanMethodChoice = PlanMethod | 'auto';

export interface PlanProgress {
  readonly stage: string;
  readonly done: number;
  readonly of: number;
}

export interface PlanOptions extends WalkOptions {
  /** Number of starters to brief (1 <= k < n). */
  readonly k: number;
  readonly method?: PlanMethodChoice;
  /** Widened greedy: keep small sets with quality rank >= nu (default 0.9). */
  readonly nu?: number;
  /** Exhaustive (and auto): time budget in milliseconds (default 10 000). */
  readonly timeLimitMs?: number;
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
  /** Bottleneck screen: candidate sets evaluated exactly at most (default 200); its time budget is timeLimitMs (default 8 min). */
  readonly screenKeep?: number;
  /** Lazy greedy: people checked exactly per choice (default 3). */
  readonly lazyChecks?: number;
  /** Widened greedy: most seed sets extended (default 64). */
  readonly maxSeeds?: number;
  readonly onProgress?: (p: PlanProgress) => void;
  /** Precomputed ergodic data of this room and walk (e.g. from the Node-only parallel kernel). */
  readonly ergodic?: ErgodicData;
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
  readonly notes: string[];
  readonly warnings: string[];
  /** Which linear algebra ran: dense matrices, a sparse LDL^T factor, or an iterative solver (estimates stated in notes). */
  readonly solverPath?: 'dense' | 'sparse-factor' | 'iterative';
  /** Nonzeros of the sparse factor when solverPath is 'sparse-factor'. */
  readonly fill?: number;
}
