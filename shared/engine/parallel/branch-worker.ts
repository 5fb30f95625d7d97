/**
 * Worker thread of the parallel branch and bound (parallel-branch.ts): takes pieces from a
 * shared counter, shares the best total through a SharedArrayBuffer, and returns its best set.
 * Run by piscina (the default export); Node only.
 */
import type { ErgodicData } from '../ergodic';
import { planContext } from '../plan-context';
import { BranchSearch } from '../plan-exhaustive';
import type { OpenPiece, Piece } from '../plan-resume';
import type { PreparedRoom } from '../room';
import { SharedSearchState } from './branch-shared';

export interface BranchWorkerData {
  readonly room: PreparedRoom;
  readonly k: number;
  readonly mustInclude: number[];
  readonly exclude: number[];
  readonly ergodic: ErgodicData | null;
  readonly items: Piece[];
  readonly incumbent: { starters: number[]; rawTotal: number; scale: number };
  readonly timeLimitMs: number;
  readonly maxNodes?: number;
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
  /** The piece this thread stopped inside (resumed later). */
  readonly partial: OpenPiece | null;
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
    ...(data.maxNodes !== undefined ? { maxNodes: data.maxNodes } : {}),
    shouldStop: () => shared.stopRequested(),
    ...(data.ergodic ? { ergodic: data.ergodic } : {}),
  });
  const search = new BranchSearch(ctx, data.incumbent, shared.link(data.slot));
  search.searchItems(data.items, () => shared.take(data.items.length));
  return search.threadResult();
}
