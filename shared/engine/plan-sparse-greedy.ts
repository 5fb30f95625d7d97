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
import { beats, tieTolerance } from './dense-state';
import { GroundedFactor, factorFits, fillReducingOrder, MAX_FACTOR_WORK, type RoomOrder } from './grounded-factor';
import { oneHopBoundSparse } from './plan-bounds';
import { finishPlan, type PlanContext } from './plan-context';
import type { PlanResult } from './plan-types';
import { refine } from './linalg/refine';
import { firstStarters, type FirstStarters } from './sparse-first-pick';

/** Largest factor (nonzeros below the diagonal) the sparse path builds; about 20 bytes each. */
export const DEFAULT_MAX_FILL = 40_000_000;
export function sparseGreedyEligible(ctx: PlanContext): boolean {
  const { room } = ctx;
  if (room.directed) return false;
  if (room.mixing > 0) for (let i = 0; i < room.n; i++) if (!(room.csr.outStrength[i] > 0)) return false;
  return true;
}

interface GreedyState {
  readonly f: GroundedFactor;
  /** People grounded in `f` who are not starters (their rows of the base inverse are zero). */
  readonly groundedFree: number[];
  readonly inT: Uint8Array;
  readonly u: Float64Array;
  readonly v: Float64Array;
  readonly dg: Float64Array;
  /** G = (inverse from f) - sum_p sign_p w_p w_p^T on T. */
  readonly cols: Float64Array[];
  readonly signs: number[];
  /** Work space for unit right-hand sides (all zero between uses). */
  readonly unit: Float64Array;
  sigma: number;
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
  const s: GreedyState = {
    f,
    groundedFree: [],
    inT,
    u: new Float64Array(n),
    v: new Float64Array(n),
    dg: f.inverseDiagonal(),
    cols: [],
    signs: [],
    unit: new Float64Array(n),
    sigma: 0,
  };
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
  const groundedFree: number[] = [];
  for (let i = 0; i < n; i++) if (g.ground[i] && i !== j) groundedFree.push(i);
  const dg = Float64Array.from(g.diag);
  const s: GreedyState = {
    f: g.f,
    groundedFree,
    inT,
    u: new Float64Array(n),
    v: new Float64Array(n),
    dg,
    cols: [],
    signs: [],
    unit: new Float64Array(n),
    sigma: 0,
  };
  if (!g.ground[j]) {
    const e = new Float64Array(n);
    e[j] = 1;
    const xj = g.f.solve(e);
    for (const r of groundedFree) xj[r] = 0;
    const xjj = xj[j];
    const sq = 1 / Math.sqrt(xjj);
    const x = new Float64Array(n);
    const z = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      x[i] = xj[i] * sq;
      z[i] = (xjj - xj[i]) * sq;
      dg[i] += z[i] * z[i] - x[i] * x[i];
    }
    z[j] = 0;
    s.cols.push(x, z);
    s.signs.push(1, -1);
  }
  dg[j] = 0;
  setSums(s, d);
  return s;
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
  const totalOf = (sigma: number) => sigma / (1 - beta * sigma);
  if (room.mixing > 0) {
    // Mixing: start from the whole room (K is positive definite), score every single starter
    // for the quality rank, then brief the required people one by one.
    ctx.worstOverride = worstSingle(s, totalOf) * scale;
    for (const p of ctx.mustInclude) addStarter(s, p);
    starters.push(...ctx.mustInclude);
  } else if (first.worst !== undefined) ctx.worstOverride = first.worst * scale;
  if (first.bestSingle) ctx.bestSingleOverride = { person: first.bestSingle.person, total: first.bestSingle.total * scale };
  const scoredAll = first.scoredAll || (room.mixing > 0 && ctx.mustInclude.length === 0);
  const r = k - ctx.mustInclude.length;
  ctx.bounds.push(oneHopBoundSparse(ctx) * scale);
  const record = () => {
    if (starters.length > 0) ctx.bounds.push((totalOf(s.sigma) - topGains(s, ctx.allowed, r, totalOf)) * scale);
    if (starters.length === 1 && k === 1 && scoredAll) ctx.bounds.push(totalOf(s.sigma) * scale);
  };
  while (starters.length < k) {
    record();
    const j = bestCandidate(s, ctx.allowed, totalOf);
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
  const total = totalOf(sigma) * scale;
  ctx.notes.push(
    `Exact greedy on a sparse LDL^T factor (${f.sym.nnz} nonzeros, ${orderMethod === 'amd' ? 'minimum-degree' : 'nested-dissection'} order; first starter ${first.scoredAll ? 'from the pseudo-inverse diagonal' : 'per closed group'}); ` +
      `final total from a refined solve (last correction ${sol.lastCorrection.toExponential(1)} relative).`,
  );
  return { ...finishPlan(ctx, 'greedy', starters, total), solverPath: 'sparse-factor', fill: f.sym.nnz };
}

function invert(inT: Uint8Array): Uint8Array {
  const g = new Uint8Array(inT.length);
  for (let i = 0; i < inT.length; i++) g[i] = inT[i] ? 0 : 1;
  return g;
}

function masked(x: Float64Array, inT: Uint8Array): Float64Array {
  const b = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) if (inT[i]) b[i] = x[i];
  return b;
}

function sumOn(x: Float64Array, inT: Uint8Array): number {
  let t = 0;
  for (let i = 0; i < x.length; i++) if (inT[i]) t += x[i];
  return t;
}

function worstSingle(s: GreedyState, totalOf: (sigma: number) => number): number {
  let w = 0;
  for (let j = 0; j < s.inT.length; j++) w = Math.max(w, totalOf(s.sigma - (s.u[j] * s.v[j]) / s.dg[j]));
  return w;
}

function bestCandidate(s: GreedyState, allowed: Uint8Array, totalOf: (sigma: number) => number): number {
  const { inT, u, v, dg } = s;
  const tol = tieTolerance(inT.length);
  let best = -1;
  let bestTotal = Infinity;
  for (let j = 0; j < inT.length; j++) {
    if (!inT[j] || !allowed[j]) continue;
    const t = totalOf(s.sigma - (u[j] * v[j]) / dg[j]);
    if (beats(t, j, bestTotal, best, tol)) {
      best = j;
      bestTotal = t;
    }
  }
  return best;
}

/** Sum of the r largest gains total(A) - total(A + j) among allowed people in T (a bounded min-heap). */
function topGains(s: GreedyState, allowed: Uint8Array, r: number, totalOf: (sigma: number) => number): number {
  const base = totalOf(s.sigma);
  const heap = new Float64Array(Math.max(1, r));
  let size = 0;
  for (let j = 0; j < s.inT.length; j++) {
    if (!s.inT[j] || !allowed[j]) continue;
    const g = base - totalOf(s.sigma - (s.u[j] * s.v[j]) / s.dg[j]);
    if (size < r) {
      let i = size++;
      while (i > 0 && heap[(i - 1) >> 1] > g) {
        heap[i] = heap[(i - 1) >> 1];
        i = (i - 1) >> 1;
      }
      heap[i] = g;
    } else if (r > 0 && g > heap[0]) siftDown(heap, size, g);
  }
  let t = 0;
  for (let q = 0; q < size; q++) t += heap[q];
  return t;
}

/** Replaces the heap's smallest entry by g and restores the min-heap order. */
function siftDown(heap: Float64Array, size: number, g: number): void {
  let i = 0;
  for (;;) {
    const l = 2 * i + 1;
    if (l >= size) break;
    const c = l + 1 < size && heap[l + 1] < heap[l] ? l + 1 : l;
    if (heap[c] >= g) break;
    heap[i] = heap[c];
    i = c;
  }
  heap[i] = g;
}

/** G b on T (0 elsewhere; b is overwritten): one solve with the state's factor, then the signed corrections. */
function applyG(s: GreedyState, b: Float64Array): Float64Array {
  const n = s.inT.length;
  const { cols, signs } = s;
  const dots = new Float64Array(cols.length);
  for (let p = 0; p < cols.length; p++) {
    const w = cols[p];
    let c = 0;
    for (let i = 0; i < n; i++) c += w[i] * b[i];
    dots[p] = c * signs[p];
  }
  // The base inverse is zero on the grounded people who are not starters.
  for (const r of s.groundedFree) b[r] = 0;
  const y = s.f.solve(b);
  for (let p = 0; p < cols.length; p++) {
    const w = cols[p];
    const c = dots[p];
    if (c !== 0) for (let i = 0; i < n; i++) y[i] -= c * w[i];
  }
  for (let i = 0; i < n; i++) if (!s.inT[i]) y[i] = 0;
  return y;
}

/** Column j of the current G: one solve with the state's factor, minus the corrections. */
function currentColumn(s: GreedyState, j: number): Float64Array {
  const n = s.inT.length;
  const e = s.unit;
  e[j] = 1;
  for (const r of s.groundedFree) e[r] = 0;
  const g = s.f.solve(e);
  e[j] = 0;
  const { cols, signs } = s;
  // Two corrections per sweep over g (the same operations in the same order as one at a time).
  let p = 0;
  for (; p + 1 < cols.length; p += 2) {
    const w0 = cols[p];
    const w1 = cols[p + 1];
    const c0 = w0[j] * signs[p];
    const c1 = w1[j] * signs[p + 1];
    if (c0 !== 0 && c1 !== 0) for (let i = 0; i < n; i++) g[i] = g[i] - c0 * w0[i] - c1 * w1[i];
    else if (c0 !== 0) for (let i = 0; i < n; i++) g[i] -= c0 * w0[i];
    else if (c1 !== 0) for (let i = 0; i < n; i++) g[i] -= c1 * w1[i];
  }
  if (p < cols.length) {
    const w = cols[p];
    const c = w[j] * signs[p];
    if (c !== 0) for (let i = 0; i < n; i++) g[i] -= c * w[i];
  }
  return g;
}

function addStarter(s: GreedyState, j: number): void {
  const g = currentColumn(s, j);
  const { inT, u, v, dg } = s;
  const gjj = g[j];
  const fu = u[j] / gjj;
  const fv = v[j] / gjj;
  const sq = 1 / Math.sqrt(gjj);
  let sigma = 0;
  // One sweep: the updates of identity 3 on T, the stored correction g / sqrt(g_j) (0 off T).
  for (let i = 0; i < inT.length; i++) {
    const gi = g[i];
    if (!inT[i]) {
      g[i] = 0;
      continue;
    }
    if (gi !== 0) {
      u[i] -= gi * fu;
      v[i] -= gi * fv;
      dg[i] -= (gi * gi) / gjj;
      g[i] = gi * sq;
    }
    if (i !== j) sigma += u[i];
  }
  inT[j] = 0;
  u[j] = 0;
  v[j] = 0;
  dg[j] = 0;
  s.cols.push(g);
  s.signs.push(1);
  s.sigma = sigma;
}
