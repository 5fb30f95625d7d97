/**
 * Lazy greedy for large sparse rooms (after Minoux, "Accelerated greedy algorithms for
 * maximizing submodular set functions", 1978). Gains h_j c_j / N_jj (identity 2) are estimated
 * from above by h_j c_j / N^lo_jj, where N^lo_jj <= N_jj counts returns in one or two hops
 * only; because the total is supermodular, old estimates stay upper bounds. Each round the
 * `lazyChecks` (default 3) people with the highest estimates are checked exactly (one sparse
 * solve for their column of N) and the best checked person is chosen; when that exact gain
 * exceeds every remaining estimate, the choice is provably the greedy one.
 * Per round: the checks, each O(m * iterations); in undirected rooms h and c are then updated
 * from the chosen person's column (identity 1, with N = L_T^-1 D giving the row), with fresh
 * solves every tenth round; directed rooms re-solve h and c (two more solves).
 *
 * What is estimated, and the error: the first starter is the best of the five best-connected
 * people (not the best of all n); a later choice can differ from exact greedy when a person
 * outside the checked few has a larger true gain (the notes count the rounds where this could
 * not be ruled out); the reported total is a fresh solve of the final set; the quality rank
 * uses an estimated worst single starter. The lower bound (identity 6 with upper-bounded gains)
 * is proven, so the stated gap to best is a true bound.
 */
import { EngineError } from './errors';
import { classPickSparse } from './plan-lazy-start';
import { finishPlan, type PlanContext } from './plan-context';
import type { PlanResult } from './plan-types';
import { SparseSystem } from './sparse-system';

export function lazyGreedyPlan(ctx: PlanContext): PlanResult {
  const { room, k } = ctx;
  const scale = 1 / (1 - room.laziness);
  const progress = ctx.options.onProgress;
  // Start: required people plus one per open closed group; in a room with a single closed
  // group and nothing required, the best of five well-connected candidates.
  const start = classPickSparse(ctx);
  const starters = [...start.set];
  ctx.worstOverride = Math.max(...start.evaluated.map((t) => t * scale), 0) || undefined;
  if (start.evaluated.length > 0)
    ctx.notes.push(
      `First starter: best of ${start.evaluated.length - 1} well-connected candidates (an estimate of the best single starter).`,
    );
  const search = new LazyGreedy(ctx, starters);
  search.recompute();
  let rawTotal = search.sumH();
  search.bound(rawTotal);
  const checksPerPick = Math.max(1, ctx.options.lazyChecks ?? 3);
  let step = 0;
  let unproven = 0;
  while (starters.length < k) {
    step++;
    const { chosen, column } = search.pick(step, checksPerPick);
    starters.push(chosen);
    search.update(starters, chosen, column, step);
    rawTotal = search.sumH();
    if (!provenRound(search.ub, search.freshAt, step, chosen)) unproven++;
    // Old bounds stay valid (supermodularity); fresh estimates at the new set are valid too,
    // so keep the smaller of the two.
    search.tighten();
    search.bound(rawTotal);
    progress?.({ stage: 'lazy-greedy', done: starters.length, of: k });
  }
  // Fresh upper bounds at the final set for the proven lower bound.
  search.recompute();
  search.bound(rawTotal);
  const total = search.freshTotal(starters) * scale;
  ctx.notes.push(
    `Lazy greedy: ${search.checks} exact gain checks; in ${unproven} of ${k - start.set.length} rounds an unchecked person's estimate exceeded the chosen gain, so the choice may differ from exact greedy there. ` +
      `The total is a fresh iterative solve (relative residual ${LAZY_TOL}); the lower bound and gap are proven.`,
  );
  return finishPlan(ctx, 'lazy-greedy', starters, total);
}

/** Relative residual of every solve of the lazy greedy. */
const LAZY_TOL = 1e-10;

/**
 * The lazy greedy's state at the current starter set: its sparse system, expected hops h,
 * the column sums c of the fundamental matrix N, and per person an upper bound `ub` on the gain.
 */
class LazyGreedy {
  private readonly room: PlanContext['room'];
  private readonly n: number;
  private readonly scale: number;
  private readonly ones: Float64Array;
  private readonly e: Float64Array;
  private sys: SparseSystem;
  private h: Float64Array;
  private c: Float64Array;
  readonly ub: Float64Array;
  /** The round in which each person's gain was last checked exactly (-1: never). */
  readonly freshAt: Int32Array;
  checks = 0;

  constructor(
    private readonly ctx: PlanContext,
    starters: number[],
  ) {
    this.room = ctx.room;
    this.n = ctx.n;
    this.scale = 1 / (1 - this.room.laziness);
    this.ones = new Float64Array(this.n).fill(1);
    this.e = new Float64Array(this.n);
    this.ub = new Float64Array(this.n);
    this.freshAt = new Int32Array(this.n).fill(-1);
    this.sys = new SparseSystem(this.room, starters, LAZY_TOL);
    this.h = this.sys.solve(this.ones);
    this.c = this.sys.solveTransposed(this.ones);
  }

  /** Sets every estimate afresh from the current h, c and the lower bound on N's diagonal. */
  recompute(): void {
    const { n, sys, h, c, ub } = this;
    const allowed = this.ctx.allowed;
    const lo = sys.diagLowerBound();
    for (let j = 0; j < n; j++) ub[j] = sys.active[j] && allowed[j] ? (h[j] * c[j]) / lo[j] : -Infinity;
  }

  /** Lowers each estimate to the fresh one where that is smaller. */
  tighten(): void {
    const { n, sys, h, c, ub } = this;
    const allowed = this.ctx.allowed;
    const lo = sys.diagLowerBound();
    for (let j = 0; j < n; j++) {
      if (!sys.active[j] || !allowed[j]) {
        ub[j] = -Infinity;
        continue;
      }
      const fresh = (h[j] * c[j]) / lo[j];
      if (fresh < ub[j]) ub[j] = fresh;
    }
  }

  /** Records the lower bound: the total less the largest gains still to pick (identity 6). */
  bound(rawTotal: number): void {
    const r = this.ctx.k - this.ctx.mustInclude.length;
    const top = Array.from(this.ub)
      .filter((g) => g > 0)
      .sort((a, b) => b - a)
      .slice(0, r);
    this.ctx.bounds.push((rawTotal - top.reduce((s, g) => s + g, 0)) * this.scale);
  }

  /** The raw total of `set` by a fresh solve. */
  freshTotal(set: number[]): number {
    const sys = new SparseSystem(this.room, set, LAZY_TOL);
    const h = sys.solve(this.ones);
    let t = 0;
    for (let i = 0; i < this.n; i++) if (sys.active[i]) t += h[i];
    return t;
  }

  sumH(): number {
    let t = 0;
    for (let i = 0; i < this.n; i++) if (this.sys.active[i]) t += this.h[i];
    return t;
  }

  /**
   * The highest estimated gains; the top few are checked exactly (one solve each for the column
   * of N), and the best checked person is chosen. A checked gain that stays above every other
   * estimate is chosen at once.
   */
  pick(step: number, checksPerPick: number): { chosen: number; column: Float64Array } {
    const { n, ub, freshAt, h, c, e } = this;
    let chosen = -1;
    let chosenGain = -Infinity;
    const columns = new Map<number, Float64Array>();
    for (let q = 0; q < checksPerPick; q++) {
      let best = -1;
      for (let j = 0; j < n; j++) if (ub[j] > -Infinity && freshAt[j] !== step && (best < 0 || ub[j] > ub[best] * (1 + 1e-12))) best = j;
      if (best < 0) break;
      if (chosen >= 0 && ub[best] <= chosenGain) break;
      e.fill(0);
      e[best] = 1;
      const col = this.sys.solve(e);
      columns.set(best, col);
      this.checks++;
      ub[best] = (h[best] * c[best]) / col[best];
      freshAt[best] = step;
      if (ub[best] > chosenGain * (1 + 1e-12) || (ub[best] >= chosenGain * (1 - 1e-12) && best < chosen)) {
        chosen = best;
        chosenGain = ub[best];
      }
    }
    if (chosen < 0) throw new EngineError('NO_FEASIBLE_PLAN', 'No allowed person is left to brief.');
    return { chosen, column: columns.get(chosen)! };
  }

  /** Moves to the set with `chosen` added: a rank-one update of h and c, or fresh solves. */
  update(starters: number[], chosen: number, x: Float64Array, step: number): void {
    const { n, h, c } = this;
    const sys = (this.sys = new SparseSystem(this.room, starters, LAZY_TOL));
    if (sys.symmetric && step % 10 !== 0) {
      // Identity 1 with the column just solved: h' = h - x h_j / x_j; for undirected rooms
      // N = L_T^-1 D, so row j of N is x_l d_l / d_j and c' needs no further solve.
      const d = this.room.csr.outStrength;
      const hj = h[chosen];
      const cj = c[chosen];
      const xj = x[chosen];
      for (let i = 0; i < n; i++) {
        if (!sys.active[i]) {
          h[i] = 0;
          c[i] = 0;
          continue;
        }
        h[i] -= (x[i] * hj) / xj;
        c[i] -= (cj * x[i] * d[i]) / (d[chosen] * xj);
      }
    } else {
      // Fresh solves now and then, so rounding from the rank-one updates cannot build up.
      this.h = sys.solve(this.ones, h);
      this.c = sys.solveTransposed(this.ones, c);
    }
  }
}

/** True when the chosen person's exact gain is at least every remaining (upper-bound) estimate. */
function provenRound(ub: Float64Array, freshAt: Int32Array, step: number, chosen: number): boolean {
  const g = ub[chosen];
  for (let j = 0; j < ub.length; j++) if (j !== chosen && freshAt[j] !== step && ub[j] > g * (1 + 1e-12)) return false;
  return true;
}
