/**
 * Worker thread of the parallel branch and bound (parallel-branch.ts): takes pieces from a
 * shared counter, shares the best total through a SharedArrayBuffer, and returns its best set.
 * Run by piscina (the default export); Node only.
 */
import type { ErgodicData } from '../ergodic';
import { planContext } from '../plan-context';
import { BranchSearch } from '../plan-exhaustive';
import type { Root } from '../plan-roots';
import type { PreparedRoom } from '../room';
import { SharedSearchState } from './branch-shared';

export interface BranchWorkerData {
  readonly room: PreparedRoom;
  readonly k: number;
  readonly mustInclude: number[];
  readonly exclude: number[];
  readonly ergodic: ErgodicData | null;
  readonly items: Root[];
  readonly incumbent: { starters: number[]; rawTotal: number; scale: number };
  readonly timeLimitMs: number;
  readonly sab: SharedArrayBuffer;
  readonly slot: number;
  readonly threads: number;
}

export interface BranchWorkerResult {
  readonly starters: number[];
  readonly rawTotal: number;
  readonly nodes: number;
  readonly halted: boolean;
  readonly pendingRaw: number;
}

/** `{ warm: true }` only loads this code (the pool starts its threads while the caller searches). */
export default function runBranchWorker(data: BranchWorkerData | { warm: true }): BranchWorkerResult | null {
  if ('warm' in data) return null;
  const shared = new SharedSearchState(data.sab, data.threads);
  const ctx = planContext(data.room, {
    k: data.k,
    mustInclude: data.mustInclude,
    exclude: data.exclude,
    timeLimitMs: data.timeLimitMs,
    shouldStop: () => shared.stopRequested(),
    ...(data.ergodic ? { ergodic: data.ergodic } : {}),
  });
  const search = new BranchSearch(ctx, data.incumbent, shared.link(data.slot));
  search.searchItems(data.items, () => shared.take(data.items.length));
  const out = search.outcome();
  return {
    starters: out.state.starters,
    rawTotal: out.state.total / data.incumbent.scale,
    nodes: out.nodes,
    halted: !out.complete,
    pendingRaw: search.pendingBound(),
  };
}
