/**
 * Exact greedy for undirected rooms without the dense inverse (docs/engine.md section 7;
 * derivations in docs/sparse-greedy.md). G = K^-1 with K = D_T - gamma W_TT from one sparse
 * LDL^T factor (grounded-factor.ts). State: u = G d_T, v = G 1_T, diag(G), sigma = 1^T u.
 *   total(A) = sigma / (1 - beta sigma)                (beta = b / n; identity 1, Sherman-Morrison)
 *   adding j: sigma' = sigma - u_j v_j / G_jj           (identity 2)
 *             g = G e_j: u -= g u_j / G_jj, v -= g v_j / G_jj, diag(G) -= g o g / G_jj (identity 3)
 * g comes from one solve with the first factor, corrected by the columns already picked
 * (G_now = G_0 - sum_p w_p w_p^T, w_p = g_p / sqrt(g_p[p])). The first starter of a room
 * without mixing comes from the pseudo-inverse diagonal (identity 5) with three solves and one
 * selected inversion. Same picks and tie-break as the dense greedy (plan-greedy.ts).
 * Cost: two or three factorisations, then per pick O(fill + n k).
 */
import { GroundedFactor, factorFits, fillReducingOrder, MAX_FACTOR_WORK, type RoomOrder } from './grounded-factor';
import { oneHopBoundSparse } from './plan-bounds';
import { finishPlan, type PlanContext } from './plan-context';
import type { PlanResult } from './plan-types';
import { invert, masked, sumOn } from './bounded-common';
import { refine } from './linalg/refine';
import { firstStarters, type FirstStarters } from './sparse-first-pick';
import { addStarter, applyG, bestCandidate, GreedyState, topGains, totalOf, worstSingle } from './sparse-greedy-state';

/** Largest factor (nonzeros below the diagonal) the sparse path builds; about 20 bytes each. */
export const DEFAULT_MAX_FILL = 40_000_000;
export function sparseGreedyEligible(ctx: PlanContext): boolean {
  const { room } = ctx;
  if (room.directed) return false;
  if (room.mixing > 0) for (let i = 0; i < room.n; i++) if (!(room.csr.outStrength[i] > 0)) return false;
  return true;
}

/**
 * Tie strengths within this ratio of each other count as well scaled: the greedy's G then comes
 * from the first factor by a change of ground (no second factorisation), and the reported total
 * is refined against that same factor. Wider spreads keep a fresh factor for each (docs/sparse-greedy.md).
 */
const WELL_SCALED = 1e4;

function wellScaled(w: Float64Array): boolean {
  let lo = Infinity;
  let hi = 0;
  for (let e = 0; e < w.length; e++) {
    const x = w[e];
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  return w.length === 0 || hi <= WELL_SCALED * lo;
}

/**
 * Returns null when the factor would exceed `maxFill` or `maxWork` (the caller then takes the
 * dense or iterative path). With a dense alternative, pass about n^3 / 8: the sparse path costs
 * some seven factorisations' work, the dense greedy about n^3.
 */
export function sparseGreedyPlan(ctx: PlanContext, maxFill = DEFAULT_MAX_FILL, maxWork = MAX_FACTOR_WORK): PlanResult | null {
  const { room, n } = ctx;
  const progress = ctx.options.onProgress;
  const beta = room.mixing / n;
  const gamma = 1 - room.mixing;
  const scale = 1 / (1 - room.laziness);
  const chosen = fillReducingOrder(room.csr, maxFill, maxWork, ctx.options.fillOrder);
  progress?.({ stage: 'ordering', done: 1, of: 1 });
  if (!chosen) return null;
  const order = chosen.order;
  const first = firstStarters(ctx, order, maxFill, maxWork);
  if (!first) return null;
  const scaled = wellScaled(room.csr.weight);
  const s = scaled && first.scoredAll && first.grounded ? regroundedState(n, first.set[0], first.grounded, room.csr.outStrength) : null;
  const state = s ?? freshState(ctx, first.set, order, gamma, maxFill, maxWork);
  if (!state) return null;
  return greedyFromState(ctx, state, first, { order, orderMethod: chosen.method, gamma, beta, scale, scaled });
}

/** The state on a new factor grounded at the starting set (G = K_TT^-1 by selected inversion). */
function freshState(
  ctx: PlanContext,
  set: number[],
  order: Int32Array,
  gamma: number,
  maxFill: number,
  maxWork: number,
): GreedyState | null {
  const { room, n } = ctx;
  const inT = new Uint8Array(n).fill(1);
  for (const a of set) inT[a] = 0;
  const f = new GroundedFactor(room.csr, order, invert(inT), gamma);
  if (!factorFits(f.sym, maxFill, maxWork)) return null;
  f.factorise();
  ctx.options.onProgress?.({ stage: 'factor', done: 1, of: 1 });
  const s = new GreedyState(f, [], inT, f.inverseDiagonal());
  setSums(s, room.csr.outStrength);
  return s;
}

/**
 * One closed group, nothing required, no mixing: the first factor X (grounded at r, the person
 * eliminated last) already holds G for the starter j by a change of ground,
 * G_ab = X_ab - X_aj - X_jb + X_jj = X_ab - x_a x_b + z_a z_b with x = X e_j / sqrt(X_jj) and
 * z = (X_jj 1 - X e_j) / sqrt(X_jj) (z_r = sqrt(X_jj), because X is zero on r): two corrections
 * of the kind every pick adds, and diag(G) from diag(X) without a second selected inversion.
 */
function regroundedState(n: number, j: number, g: NonNullable<FirstStarters['grounded']>, d: Float64Array): GreedyState {
  const inT = new Uint8Array(n).fill(1);
  inT[j] = 0;
  const s = new GreedyState(g.f, groundedOthers(g.ground, j), inT, Float64Array.from(g.diag));
  if (!g.ground[j]) {
    const e = new Float64Array(n);
    e[j] = 1;
    const xj = g.f.solve(e);
    for (const r of s.groundedFree) xj[r] = 0;
    const x = new Float64Array(n);
    const z = new Float64Array(n);
    changeOfGround(xj, j, x, z, s.dg);
    z[j] = 0;
    s.cols.push(x, z);
    s.signs.push(1, -1);
  }
  s.dg[j] = 0;
  setSums(s, d);
  return s;
}

function groundedOthers(ground: Uint8Array, j: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < ground.length; i++) if (ground[i] && i !== j) out.push(i);
  return out;
}

/** x = X e_j / sqrt(X_jj), z = (X_jj 1 - X e_j) / sqrt(X_jj) from xj = X e_j, and diag(G) += z o z - x o x. */
function changeOfGround(xj: Float64Array, j: number, x: Float64Array, z: Float64Array, dg: Float64Array): void {
  const xjj = xj[j];
  const sq = 1 / Math.sqrt(xjj);
  for (let i = 0; i < xj.length; i++) {
    x[i] = xj[i] * sq;
    z[i] = (xjj - xj[i]) * sq;
    dg[i] += z[i] * z[i] - x[i] * x[i];
  }
}

/** u = G d_T, v = G 1_T and sigma = 1^T u from the state's factor and corrections. */
function setSums(s: GreedyState, d: Float64Array): void {
  const n = s.inT.length;
  const ones = new Float64Array(n).fill(1);
  s.u.set(applyG(s, masked(d, s.inT)));
  s.v.set(applyG(s, masked(ones, s.inT)));
  s.sigma = sumOn(s.u, s.inT);
}

interface Setup {
  readonly order: Int32Array;
  readonly orderMethod: RoomOrder['method'];
  readonly gamma: number;
  readonly beta: number;
  readonly scale: number;
  readonly scaled: boolean;
}

function greedyFromState(ctx: PlanContext, s: GreedyState, first: FirstStarters, setup: Setup): PlanResult {
  const { room, k } = ctx;
  const progress = ctx.options.onProgress;
  const { order, gamma, beta, scale, orderMethod } = setup;
  const f = s.f;
  const d = room.csr.outStrength;
  const starters = [...first.set];
  if (room.mixing > 0) {
    // Mixing: start from the whole room (K is positive definite), score every single starter
    // for the quality rank, then brief the required people one by one.
    ctx.worstOverride = worstSingle(s, beta) * scale;
    for (const p of ctx.mustInclude) addStarter(s, p);
    starters.push(...ctx.mustInclude);
  } else if (first.worst !== undefined) ctx.worstOverride = first.worst * scale;
  if (first.bestSingle) ctx.bestSingleOverride = { person: first.bestSingle.person, total: first.bestSingle.total * scale };
  const scoredAll = first.scoredAll || (room.mixing > 0 && ctx.mustInclude.length === 0);
  const r = k - ctx.mustInclude.length;
  ctx.bounds.push(oneHopBoundSparse(ctx) * scale);
  const record = () => {
    if (starters.length > 0) ctx.bounds.push((totalOf(s.sigma, beta) - topGains(s, ctx.allowed, r, beta)) * scale);
    if (starters.length === 1 && k === 1 && scoredAll) ctx.bounds.push(totalOf(s.sigma, beta) * scale);
  };
  while (starters.length < k) {
    record();
    const j = bestCandidate(s, ctx.allowed, beta);
    if (j < 0) break;
    addStarter(s, j);
    starters.push(j);
    progress?.({ stage: 'greedy', done: starters.length, of: k });
  }
  record();
  // The reported total from a refined solve (double-double residuals from the ties), so it does not
  // carry the rounding of the rank-one updates: against the same factor and corrections for
  // well-scaled rooms, against a fresh factor of the final set otherwise.
  const b = masked(d, s.inT);
  const sol = setup.scaled
    ? refine(room.csr, s.inT, gamma, b, applyG(s, b.slice()), (res) => applyG(s, res), 1e-13)
    : new GroundedFactor(room.csr, order, invert(s.inT), gamma).factorise().solveRefined(b);
  const sigma = sumOn(sol.x, s.inT);
  const total = totalOf(sigma, beta) * scale;
  ctx.notes.push(
    `Exact greedy on a sparse LDL^T factor (${f.sym.nnz} nonzeros, ${orderMethod === 'amd' ? 'minimum-degree' : 'nested-dissection'} order; first starter ${first.scoredAll ? 'from the pseudo-inverse diagonal' : 'per closed group'}); ` +
      `final total from a refined solve (last correction ${sol.lastCorrection.toExponential(1)} relative).`,
  );
  return { ...finishPlan(ctx, 'greedy', starters, total), solverPath: 'sparse-factor', fill: f.sym.nnz };
}
