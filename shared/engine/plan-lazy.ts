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
  const { room, n, k, allowed } = ctx;
  const tol = 1e-10;
  const scale = 1 / (1 - room.laziness);
  const ones = new Float64Array(n).fill(1);
  const progress = ctx.options.onProgress;
  const evalTotal = (set: number[]) => {
    const sys = new SparseSystem(room, set, tol);
    const h = sys.solve(ones);
    let t = 0;
    for (let i = 0; i < n; i++) if (sys.active[i]) t += h[i];
    return t;
  };
  // Start: required people plus one per open closed group; in a room with a single closed
  // group and nothing required, the best of five well-connected candidates.
  const start = classPickSparse(ctx);
  const starters = [...start.set];
  ctx.worstOverride = Math.max(...start.evaluated.map((t) => t * scale), 0) || undefined;
  if (start.evaluated.length > 0)
    ctx.notes.push(
      `First starter: best of ${start.evaluated.length - 1} well-connected candidates (an estimate of the best single starter).`,
    );
  const ub = new Float64Array(n);
  const freshAt = new Int32Array(n).fill(-1);
  let sys = new SparseSystem(room, starters, tol);
  let h = sys.solve(ones);
  let c = sys.solveTransposed(ones);
  let step = 0;
  let checks = 0;
  let unproven = 0;
  const recompute = () => {
    const lo = sys.diagLowerBound();
    for (let j = 0; j < n; j++) ub[j] = sys.active[j] && allowed[j] ? (h[j] * c[j]) / lo[j] : -Infinity;
  };
  recompute();
  const tighten = () => {
    const lo = sys.diagLowerBound();
    for (let j = 0; j < n; j++) {
      if (!sys.active[j] || !allowed[j]) {
        ub[j] = -Infinity;
        continue;
      }
      const fresh = (h[j] * c[j]) / lo[j];
      if (fresh < ub[j]) ub[j] = fresh;
    }
  };
  const bound = (rawTotal: number) => {
    const r = k - ctx.mustInclude.length;
    const top = Array.from(ub)
      .filter((g) => g > 0)
      .sort((a, b) => b - a)
      .slice(0, r);
    ctx.bounds.push((rawTotal - top.reduce((s, g) => s + g, 0)) * scale);
  };
  const sumH = () => {
    let t = 0;
    for (let i = 0; i < n; i++) if (sys.active[i]) t += h[i];
    return t;
  };
  let rawTotal = sumH();
  bound(rawTotal);
  const e = new Float64Array(n);
  const checksPerPick = Math.max(1, ctx.options.lazyChecks ?? 3);
  while (starters.length < k) {
    step++;
    // Pick: the highest estimated gains; the top few are checked exactly (one solve each for
    // the column of N), and the best checked person is chosen. A checked gain that stays
    // above every other estimate is chosen at once.
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
      const col = sys.solve(e);
      columns.set(best, col);
      checks++;
      ub[best] = (h[best] * c[best]) / col[best];
      freshAt[best] = step;
      if (ub[best] > chosenGain * (1 + 1e-12) || (ub[best] >= chosenGain * (1 - 1e-12) && best < chosen)) {
        chosen = best;
        chosenGain = ub[best];
      }
    }
    if (chosen < 0) throw new EngineError('NO_FEASIBLE_PLAN', 'No allowed person is left to brief.');
    starters.push(chosen);
    const x = columns.get(chosen)!;
    sys = new SparseSystem(room, starters, tol);
    if (sys.symmetric && step % 10 !== 0) {
      // Identity 1 with the column just solved: h' = h - x h_j / x_j; for undirected rooms
      // N = L_T^-1 D, so row j of N is x_l d_l / d_j and c' needs no further solve.
      const d = room.csr.outStrength;
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
      h = sys.solve(ones, h);
      c = sys.solveTransposed(ones, c);
    }
    rawTotal = sumH();
    if (!provenRound(ub, freshAt, step, chosen)) unproven++;
    // Old bounds stay valid (supermodularity); fresh estimates at the new set are valid too,
    // so keep the smaller of the two.
    tighten();
    bound(rawTotal);
    progress?.({ stage: 'lazy-greedy', done: starters.length, of: k });
  }
  // Fresh upper bounds at the final set for the proven lower bound.
  recompute();
  bound(rawTotal);
  const total = evalTotal(starters) * scale;
  ctx.notes.push(
    `Lazy greedy: ${checks} exact gain checks; in ${unproven} of ${k - start.set.length} rounds an unchecked person's estimate exceeded the chosen gain, so the choice may differ from exact greedy there. ` +
      `The total is a fresh iterative solve (relative residual ${tol}); the lower bound and gap are proven.`,
  );
  return finishPlan(ctx, 'lazy-greedy', starters, total);
}

/** True when the chosen person's exact gain is at least every remaining (upper-bound) estimate. */
function provenRound(ub: Float64Array, freshAt: Int32Array, step: number, chosen: number): boolean {
  const g = ub[chosen];
  for (let j = 0; j < ub.length; j++) if (j !== chosen && freshAt[j] !== step && ub[j] > g * (1 + 1e-12)) return false;
  return true;
}
