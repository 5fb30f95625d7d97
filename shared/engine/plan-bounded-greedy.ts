/**
 * Exact greedy on iterative solves, for undirected rooms without mixing whose sparse factor
 * would be too big (docs/sparse-greedy.md section 8). Every pick is the dense greedy's pick,
 * proven: each person carries an upper bound on their gain u_j v_j / G_jj (G = K_T^-1,
 * u = G d, v = G 1) from a proven lower bound on G_jj (diag-lower-bound.ts); old bounds stay
 * valid after a pick because the total is supermodular. A round refreshes the bound of the
 * person on top, or checks them exactly (one CG solve for G e_j), until the best checked total
 * beats every remaining bound; the checked column then updates u, v and every diagonal bound
 * (identity 3: G' = G - g g^T / g_j). The first starter of each closed group comes the same
 * way from the pseudo-inverse formula (identity 5) on the room grounded at one member.
 * Cost: one bound per person (a few hops of ties each), then per round a few solves of
 * O(m * iterations). Memory O(m + n k).
 */
import { firstStarters } from './bounded-first-pick';
import { CHEAP_HOPS, CHECK_TOL, DEEP_HOPS, invert, masked, mayBeat, solved, STEP_SAFETY, sumOn } from './bounded-common';
import { beats, tieTolerance } from './dense-state';
import { DiagLowerBound } from './diag-lower-bound';
import { GroundedLaplacian } from './linalg/grounded-laplacian';
import { finishPlan, type PlanContext } from './plan-context';
import type { PlanResult } from './plan-types';

/**
 * Exact checks a round may spend before it settles for the best person checked (the plan then
 * says in how many rounds that happened). Small-world rooms need about 3 per pick; grids, whose
 * bounds are weakest, can need a hundred.
 */
const DEFAULT_CHECKS_PER_PICK = 40;
/** Checked columns kept for reuse in later rounds (each n numbers). */
const MAX_COLUMNS = 64;

export function boundedGreedyEligible(ctx: PlanContext): boolean {
  return !ctx.room.directed && ctx.room.mixing === 0;
}

export function boundedGreedyPlan(ctx: PlanContext): PlanResult {
  const { room, k } = ctx;
  const scale = 1 / (1 - room.laziness);
  const progress = ctx.options.onProgress;
  const first = firstStarters(ctx);
  if (first.worst !== undefined) ctx.worstOverride = first.worst * scale;
  if (first.bestSingle) ctx.bestSingleOverride = { person: first.bestSingle.person, total: first.bestSingle.total * scale };
  const starters = [...first.set];
  progress?.({ stage: 'greedy', done: starters.length, of: k });
  const search = new BoundedGreedy(ctx, starters);
  const r = k - ctx.mustInclude.length;
  ctx.bounds.push(search.lowerBound(r) * scale);
  while (starters.length < k) {
    const pick = search.pick();
    if (pick < 0) break;
    starters.push(pick);
    search.add(pick, starters.length % 25 === 0);
    ctx.bounds.push(search.lowerBound(r) * scale);
    progress?.({ stage: 'greedy', done: starters.length, of: k });
  }
  const total = search.finalTotal() * scale;
  const proof =
    search.unproven === 0
      ? "every pick proven the greedy's by lower bounds on the inverse's diagonal"
      : `picks proven the greedy's by lower bounds on the inverse's diagonal, except in ${search.unproven} of ${k - first.set.length} rounds, where ${search.checkBudget} exact checks did not settle the round and the best checked person was taken (the total may then differ from the exact greedy's)`;
  ctx.notes.push(
    `Exact greedy on iterative solves (conjugate gradient, relative residual ${CHECK_TOL}): ${proof}; ` +
      `${first.checks + search.checks} exact checks (${search.reused} from an earlier round's column), ${search.refreshes} bound refreshes, ${first.iterations + search.iterations()} iterations. ` +
      `The worst single starter (for the quality rank) is estimated from below.`,
  );
  return { ...finishPlan(ctx, 'greedy', starters, total), solverPath: 'iterative' };
}

/** The greedy's state at the current starter set; see the file header. */
class BoundedGreedy {
  checks = 0;
  refreshes = 0;
  private readonly n: number;
  private readonly inT: Uint8Array;
  private k: GroundedLaplacian;
  private bounds: DiagLowerBound;
  private u: Float64Array;
  private v: Float64Array;
  private sigma = 0;
  /** Proven lower bounds on G_jj, and upper bounds on the gains. */
  private readonly lb: Float64Array;
  private readonly ub: Float64Array;
  private readonly refreshedAt: Int32Array;
  private readonly checkedAt: Int32Array;
  private round = 0;
  private pastIterations = 0;
  private chosenColumn: Float64Array | null = null;
  /** The columns checked so far (oldest first) and the column of each pick, by round. */
  private readonly columns = new Map<number, { x: Float64Array; round: number }>();
  private readonly picked: { s: number; g: Float64Array }[] = [];
  reused = 0;
  /** Rounds that ended on the check budget, not on proof. */
  unproven = 0;
  readonly checkBudget: number;
  private readonly tol: number;

  constructor(
    private readonly ctx: PlanContext,
    starters: number[],
  ) {
    const n = (this.n = ctx.n);
    this.tol = tieTolerance(n);
    this.checkBudget = Math.max(1, ctx.options.maxChecksPerPick ?? DEFAULT_CHECKS_PER_PICK);
    this.inT = new Uint8Array(n).fill(1);
    for (const s of starters) this.inT[s] = 0;
    this.k = new GroundedLaplacian(ctx.room.csr, invert(this.inT));
    this.u = solved(this.k, masked(ctx.room.csr.outStrength, this.inT));
    this.v = solved(this.k, masked(new Float64Array(n).fill(1), this.inT));
    this.sigma = sumOn(this.u, this.inT);
    this.bounds = new DiagLowerBound(this.k);
    this.bounds.setGlobals(this.u, this.v);
    this.lb = new Float64Array(n);
    this.ub = new Float64Array(n).fill(-Infinity);
    this.refreshedAt = new Int32Array(n);
    this.checkedAt = new Int32Array(n).fill(-1);
    for (let j = 0; j < n; j++) {
      if (!this.inT[j] || !ctx.allowed[j]) continue;
      this.lb[j] = this.bounds.lower(j, CHEAP_HOPS);
      this.ub[j] = (this.u[j] * this.v[j]) / this.lb[j];
    }
  }

  iterations(): number {
    return this.pastIterations + this.k.iterations;
  }

  /** The next greedy pick, proven: refresh or check the person on top until nobody else can win. */
  pick(): number {
    const r = this.round;
    let best = -1;
    let bestT = Infinity;
    let bestCol: Float64Array | null = null;
    let checks = 0;
    for (;;) {
      const j = this.contender(best, bestT);
      if (j < 0) break;
      if (best >= 0 && checks >= this.checkBudget) {
        // Bounds too loose to settle the round within the budget: take the best checked person.
        this.unproven++;
        break;
      }
      if (this.refreshedAt[j] !== r) {
        this.refresh(j);
        continue;
      }
      const col = this.check(j);
      checks++;
      const t = this.sigma - this.ub[j];
      if (beats(t, j, bestT, best, this.tol)) {
        best = j;
        bestT = t;
        bestCol = col;
      }
    }
    this.chosenColumn = bestCol;
    return best;
  }

  /** The unchecked person with the largest bound who could still win; -1 when none can. */
  private contender(best: number, bestT: number): number {
    const top = this.topBound(this.n);
    if (top < 0) return -1;
    if (mayBeat(this.sigma - this.ub[top], top, bestT, best, this.tol)) return top;
    // A tie within the tolerance still goes to an earlier person.
    const early = best > 0 ? this.topBound(best) : -1;
    return early >= 0 && mayBeat(this.sigma - this.ub[early], early, bestT, best, this.tol) ? early : -1;
  }

  /** The largest bound among people before `limit` not yet checked this round. */
  private topBound(limit: number): number {
    const { ub, checkedAt, round } = this;
    let top = -1;
    let topUb = -Infinity;
    for (let j = 0; j < limit; j++) {
      const b = ub[j];
      if (b > topUb && checkedAt[j] !== round) {
        top = j;
        topUb = b;
      }
    }
    return top;
  }

  private refresh(j: number): void {
    this.refreshes++;
    this.refreshedAt[j] = this.round;
    const fresh = this.bounds.lower(j, DEEP_HOPS);
    if (fresh > this.lb[j]) this.lb[j] = fresh;
    const g = (this.u[j] * this.v[j]) / this.lb[j];
    if (g < this.ub[j]) this.ub[j] = g;
  }

  /**
   * G e_j by one solve; sets j's bound to the exact gain. A column checked in an earlier round is
   * brought up to date by the picks since (G' e_j = G e_j - g (g_j / g_s), exact) and only
   * polished by CG from there, which then mostly stops at once.
   */
  private check(j: number): Float64Array {
    this.checks++;
    this.checkedAt[j] = this.round;
    const e = new Float64Array(this.n);
    e[j] = 1;
    const old = this.columns.get(j);
    if (old) {
      this.columns.delete(j);
      for (let r = old.round; r < this.round; r++) downdate(old.x, this.picked[r]);
      this.reused++;
    }
    const x = solved(this.k, e, old?.x);
    this.columns.set(j, { x, round: this.round });
    if (this.columns.size > MAX_COLUMNS) this.columns.delete(this.columns.keys().next().value!);
    this.lb[j] = x[j];
    this.ub[j] = (this.u[j] * this.v[j]) / x[j];
    return x;
  }

  /** Moves to the set with `s` added (identity 3); `fresh` re-solves u and v from the updated values. */
  add(s: number, fresh: boolean): void {
    const g = this.chosenColumn!;
    const { n, u, v, lb, ub, inT } = this;
    const gs = g[s];
    const us = u[s] / gs;
    const vs = v[s] / gs;
    for (let i = 0; i < n; i++) {
      const gi = g[i];
      u[i] -= gi * us;
      v[i] -= gi * vs;
      lb[i] = (lb[i] - (gi * gi) / gs) * STEP_SAFETY;
    }
    inT[s] = 0;
    u[s] = v[s] = lb[s] = 0;
    ub[s] = -Infinity;
    this.pastIterations += this.k.iterations;
    this.k = new GroundedLaplacian(this.ctx.room.csr, invert(inT));
    if (fresh) {
      this.u = solved(this.k, masked(this.ctx.room.csr.outStrength, inT), u);
      this.v = solved(this.k, masked(new Float64Array(n).fill(1), inT), v);
    }
    this.sigma = sumOn(this.u, inT);
    for (let i = 0; i < n; i++) if (ub[i] > -Infinity && lb[i] > 0) ub[i] = Math.min(ub[i], (this.u[i] * this.v[i]) / lb[i]);
    this.bounds = new DiagLowerBound(this.k);
    this.bounds.setGlobals(this.u, this.v);
    this.picked.push({ s, g });
    this.columns.delete(s);
    this.round++;
    this.chosenColumn = null;
  }

  /** The current total less the r largest gain bounds (identity 6). */
  lowerBound(r: number): number {
    const top = largest(this.ub, r);
    let s = 0;
    for (const g of top) if (g > 0) s += g;
    return this.sigma - s;
  }

  /** 1^T G d of the final set by a fresh solve from the updated u. */
  finalTotal(): number {
    const x = solved(this.k, masked(this.ctx.room.csr.outStrength, this.inT), this.u, 1e-13);
    return sumOn(x, this.inT);
  }
}

/** x = G e_j moved to the set with the pick's column added: x -= g x_s / g_s (symmetry: g_j = x_s). */
function downdate(x: Float64Array, pick: { s: number; g: Float64Array }): void {
  const { s, g } = pick;
  const c = x[s] / g[s];
  for (let i = 0; i < x.length; i++) x[i] -= c * g[i];
  x[s] = 0;
}

/** The r largest finite values (a bounded min-heap). */
function largest(values: Float64Array, r: number): number[] {
  const heap: number[] = [];
  for (let i = 0; i < values.length; i++) {
    const x = values[i];
    if (!(x > -Infinity)) continue;
    if (heap.length < r) {
      heap.push(x);
      siftUp(heap, heap.length - 1);
    } else if (r > 0 && x > heap[0]) {
      heap[0] = x;
      siftDown(heap, 0);
    }
  }
  return heap;
}

function siftUp(h: number[], i: number): void {
  while (i > 0) {
    const p = (i - 1) >> 1;
    if (h[p] <= h[i]) return;
    [h[p], h[i]] = [h[i], h[p]];
    i = p;
  }
}

function siftDown(h: number[], i: number): void {
  for (;;) {
    const l = 2 * i + 1;
    const r = l + 1;
    let m = i;
    if (l < h.length && h[l] < h[m]) m = l;
    if (r < h.length && h[r] < h[m]) m = r;
    if (m === i) return;
    [h[m], h[i]] = [h[i], h[m]];
    i = m;
  }
}
