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
import { GroundedFactor, factorFits, fillReducingOrder, MAX_FACTOR_WORK } from './grounded-factor';
import { oneHopBoundSparse } from './plan-bounds';
import { finishPlan, type PlanContext } from './plan-context';
import type { PlanResult } from './plan-types';
import { firstStarters } from './sparse-first-pick';

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
  readonly inT: Uint8Array;
  readonly u: Float64Array;
  readonly v: Float64Array;
  readonly dg: Float64Array;
  readonly cols: Float64Array[];
  sigma: number;
}

/**
 * Returns null when the factor would exceed `maxFill` or `maxWork` (the caller then takes the
 * dense or iterative path). With a dense alternative, pass about n^3 / 8: the sparse path costs
 * some seven factorisations' work, the dense greedy about n^3.
 */
export function sparseGreedyPlan(ctx: PlanContext, maxFill = DEFAULT_MAX_FILL, maxWork = MAX_FACTOR_WORK): PlanResult | null {
  const { room, n, k } = ctx;
  const progress = ctx.options.onProgress;
  const beta = room.mixing / n;
  const gamma = 1 - room.mixing;
  const scale = 1 / (1 - room.laziness);
  const order = fillReducingOrder(room.csr);
  progress?.({ stage: 'ordering', done: 1, of: 1 });
  const first = firstStarters(ctx, order, maxFill, maxWork);
  if (!first) return null;
  const inT = new Uint8Array(n).fill(1);
  for (const a of first.set) inT[a] = 0;
  const f = new GroundedFactor(room.csr, order, invert(inT), gamma);
  if (!factorFits(f.sym, maxFill, maxWork)) return null;
  f.factorise();
  progress?.({ stage: 'factor', done: 1, of: 1 });
  const d = room.csr.outStrength;
  const u = f.solve(masked(d, inT));
  const v = f.solve(masked(new Float64Array(n).fill(1), inT));
  const s: GreedyState = { f, inT, u, v, dg: f.inverseDiagonal(), cols: [], sigma: sumOn(u, inT) };
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
  // Fresh factor of the final set, refined solve: the reported total does not carry the
  // rounding of k rank-one updates.
  const fin = new GroundedFactor(room.csr, order, invert(s.inT), gamma).factorise();
  const sol = fin.solveRefined(masked(d, s.inT));
  const sigma = sumOn(sol.x, s.inT);
  const total = totalOf(sigma) * scale;
  ctx.notes.push(
    `Exact greedy on a sparse LDL^T factor (${f.sym.nnz} nonzeros; first starter ${first.scoredAll ? 'from the pseudo-inverse diagonal' : 'per closed group'}); ` +
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

/** Column j of the current G: one solve with the first factor, minus the picked columns. */
function currentColumn(s: GreedyState, j: number): Float64Array {
  const n = s.inT.length;
  const e = new Float64Array(n);
  e[j] = 1;
  const g = s.f.solve(e);
  for (const w of s.cols) {
    const c = w[j];
    if (c !== 0) for (let i = 0; i < n; i++) g[i] -= c * w[i];
  }
  for (let i = 0; i < n; i++) if (!s.inT[i]) g[i] = 0;
  return g;
}

function addStarter(s: GreedyState, j: number): void {
  const g = currentColumn(s, j);
  const { inT, u, v, dg } = s;
  const gjj = g[j];
  const fu = u[j] / gjj;
  const fv = v[j] / gjj;
  for (let i = 0; i < inT.length; i++) {
    const gi = g[i];
    if (gi === 0) continue;
    u[i] -= gi * fu;
    v[i] -= gi * fv;
    dg[i] -= (gi * gi) / gjj;
  }
  inT[j] = 0;
  u[j] = 0;
  v[j] = 0;
  dg[j] = 0;
  const w = new Float64Array(inT.length);
  const sq = 1 / Math.sqrt(gjj);
  for (let i = 0; i < inT.length; i++) w[i] = g[i] * sq;
  s.cols.push(w);
  s.sigma = sumOn(u, inT);
}
