/**
 * Bookkeeping of a long search: nodes, the share of the search space decided, the time limit,
 * cooperative cancellation (AbortSignal or shouldStop) and throttled progress reports.
 * Checks the clock every 64 nodes and reports at most every 100 ms. O(1) per node.
 */
import type { PlanContext } from './plan-context';

export class SearchMeter {
  nodes = 0;
  halted = false;
  stopped = false;
  private space = 1;
  private closed = 0;
  private lastReport = 0;
  private readonly maxNodes: number;

  constructor(
    private readonly ctx: PlanContext,
    private readonly lowerBound: () => number,
    private readonly bestTotal: () => number,
    private readonly stage = 'exhaustive',
  ) {
    this.maxNodes = ctx.options.maxNodes ?? Infinity;
  }

  begin(space: number): void {
    this.space = Math.max(1, space);
    this.closed = 0;
    this.report(true);
  }

  /** Nodes of earlier runs (reported with this run's). */
  private priorNodes = 0;

  /** A resumed search starts from the k-sets an earlier run decided (and reports its nodes with its own). */
  restore(closed: number, priorNodes: number): void {
    this.closed = closed;
    this.priorNodes = priorNodes;
  }

  get priorNodeCount(): number {
    return this.priorNodes;
  }

  /** Marks `sets` k-sets as decided (evaluated or pruned). */
  close(sets: number): void {
    this.closed += sets;
  }

  spaceSize(): number {
    return this.space;
  }

  /** Number of k-sets decided so far. */
  closedSets(): number {
    return this.closed;
  }

  /** Share of the search space not decided, 0..1. */
  left(): number {
    return Math.min(1, Math.max(0, 1 - this.closed / this.space));
  }

  /** Counts a node; true when the search must stop (time limit, node budget, signal or shouldStop). */
  tick(): boolean {
    if (this.halted) return true;
    if (++this.nodes >= this.maxNodes) {
      this.halted = true;
      return true;
    }
    if ((this.nodes & 63) !== 0) return false;
    const now = performance.now();
    if (shouldStop(this.ctx)) {
      this.halted = true;
      this.stopped = true;
    } else if (now > this.ctx.deadline) this.halted = true;
    if (!this.halted && now - this.lastReport >= 100) this.report(false);
    return this.halted;
  }

  finish(): void {
    this.report(true);
  }

  private report(force: boolean): void {
    const cb = this.ctx.options.onProgress;
    if (!cb) return;
    const now = performance.now();
    if (!force && now - this.lastReport < 100) return;
    this.lastReport = now;
    const best = this.bestTotal();
    const lb = Math.min(best, this.lowerBound());
    const fraction = this.halted ? 1 - this.left() : Math.min(1, this.closed / this.space);
    cb({
      stage: this.stage,
      done: Math.round(fraction * 1000),
      of: 1000,
      fraction,
      bestTotal: best,
      lowerBound: lb,
      gap: best > 0 ? Math.max(0, (best - lb) / best) : 0,
      nodes: this.priorNodes + this.nodes,
    });
  }
}

/** True when the caller asked the planner to stop (AbortSignal or shouldStop). */
export function shouldStop(ctx: PlanContext): boolean {
  return ctx.options.signal?.aborted === true || ctx.options.shouldStop?.() === true;
}

/** binom[m][r] = C(m, r) for m <= n, r <= k (doubles; exact below 2^53). */
export function binomialTable(n: number, k: number): Float64Array[] {
  const t: Float64Array[] = [];
  for (let m = 0; m <= n; m++) {
    const row = new Float64Array(k + 1);
    row[0] = 1;
    for (let r = 1; r <= Math.min(k, m); r++) row[r] = t[m - 1][r - 1] + (r <= m - 1 ? t[m - 1][r] : 0);
    t.push(row);
  }
  return t;
}
