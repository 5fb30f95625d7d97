/**
 * Cheap proven lower bounds on OPT_k, the smallest room total of any k-set (proofs and sources
 * in docs/bounds.md; all are checked against brute force in tests/engine/bounds.test.ts):
 *
 *  - bound 1 (supermodular bound at any evaluated set S, identity 6 of docs/engine.md):
 *    OPT_k >= F(S) - (sum of the k largest gains at S); collected by the planners (recordBound).
 *  - bound 2 (pair bound, partial enumeration of the first starter): order the people by their
 *    single total; every k-set A has a first member a in that order and the rest of A lies after
 *    a, so F(A) >= F({a}) - sum of the k - 1 largest ρ_b({a}) over b after a, with
 *    ρ_b({a}) = F({a}) - F({a, b}) from all pair totals (identity 4). OPT_k >= min over a.
 *    Cost O(n^2 log n) after the ergodic fundamental matrix.
 *  - bound 3 (one-hop bound per person): a person i who is not briefed needs one hop, and a
 *    second one unless the first question reaches a starter: h_i >= 2 - P_i(A), so
 *    OPT_k >= 2 (n - k) - (sum of the k largest column sums of P off the diagonal). O(n^2).
 * Bounds are in raw hops (laziness 0) and scaled by 1 / (1 - laziness) when recorded.
 */
import { allPairsTotals } from './pairs';
import type { Csr } from './graph';
import type { PlanContext } from './plan-context';

/** Rooms up to this size get bound 2 after a heuristic plan (it needs all pair totals). */
export const PAIR_BOUND_LIMIT = 300;

export interface FirstStarterBound {
  /** First starters in the enumeration order (ascending single total, then input order). */
  readonly order: number[];
  /** bound[p]: proven raw lower bound on every k-set whose first member is order[p]. */
  readonly bound: Float64Array;
}

/**
 * Bound 2 for every first starter, or null without ergodic data on an irreducible walk.
 * Only allowed people are enumerated (required people only raise the optimum).
 */
export function firstStarterBounds(ctx: PlanContext, k: number): FirstStarterBound | null {
  const e = ctx.ergodic();
  if (!e || !e.pi.every((v) => v > 0)) return null;
  const { n, allowed } = ctx;
  const scale = e.scale;
  const order = Array.from({ length: n }, (_, i) => i)
    .filter((i) => allowed[i])
    .sort((a, b) => e.singleTotals[a] - e.singleTotals[b] || a - b);
  const bound = new Float64Array(order.length);
  const pairs = k >= 2 ? allPairsTotals(e) : null;
  const gains = new Float64Array(order.length);
  for (let p = 0; p < order.length; p++) {
    const a = order[p];
    const fa = e.singleTotals[a] / scale;
    const rest = order.length - p - 1;
    if (rest < k - 1) {
      bound[p] = Infinity;
      continue;
    }
    if (!pairs) {
      bound[p] = fa;
      continue;
    }
    for (let q = p + 1; q < order.length; q++) gains[q - p - 1] = Math.max(0, fa - pairs[a * n + order[q]] / scale);
    const g = gains.subarray(0, rest).sort().reverse();
    let s = 0;
    for (let q = 0; q < k - 1; q++) s += g[q];
    bound[p] = fa - s;
  }
  return { order, bound };
}

/** Bound 3 (raw hops): 2 (n - k) - the k largest off-diagonal column sums of the walk. */
export function oneHopBound(ctx: PlanContext): number {
  const { n, k } = ctx;
  const p1 = ctx.p1();
  const col = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = i * n;
    for (let j = 0; j < n; j++) if (j !== i) col[j] += p1[r + j];
  }
  col.sort();
  let top = 0;
  for (let q = 0; q < k; q++) top += col[n - 1 - q];
  return 2 * (n - k) - top;
}

/**
 * Bound 3 from the sparse walk in O(m), equal to oneHopBound: the off-diagonal column sum of
 * P at j is (n - 1) b / n from mixing plus (1 - b) w_ij / s_i over ties i -> j with i != j
 * (a person without ties keeps the walk, which lands on the diagonal only).
 */
export function oneHopBoundSparse(ctx: PlanContext): number {
  const { n, k, room } = ctx;
  const col = offDiagonalColumnSums(room.csr, room.mixing);
  col.sort();
  return 2 * (n - k) - largestSum(col, k);
}

/** Off-diagonal column sums of P (one loop per function: see linalg/sparse-ldl.ts on compiled code). */
function offDiagonalColumnSums(csr: Csr, b: number): Float64Array {
  const n = csr.n;
  const col = new Float64Array(n).fill(((n - 1) * b) / n);
  for (let i = 0; i < n; i++) {
    const s = csr.outStrength[i];
    if (!(s > 0)) continue;
    const f = (1 - b) / s;
    for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) if (csr.col[e] !== i) col[csr.col[e]] += f * csr.weight[e];
  }
  return col;
}

/** Sum of the k last entries of a sorted array, largest first. */
function largestSum(sorted: Float64Array, k: number): number {
  let top = 0;
  for (let q = 0; q < k; q++) top += sorted[sorted.length - 1 - q];
  return top;
}

/** Adds bounds 2 and 3 (scaled) to the context's bounds; dense rooms up to PAIR_BOUND_LIMIT people. */
export function addQuickBounds(ctx: PlanContext): void {
  if (ctx.n > PAIR_BOUND_LIMIT) return;
  const scale = 1 / (1 - ctx.room.laziness);
  ctx.bounds.push(oneHopBound(ctx) * scale);
  const fb = firstStarterBounds(ctx, ctx.k);
  if (!fb) return;
  let lb = Infinity;
  for (let p = 0; p < fb.bound.length; p++) lb = Math.min(lb, fb.bound[p]);
  if (Number.isFinite(lb)) ctx.bounds.push(lb * scale);
}
