/**
 * Bottleneck screen for very large rooms (docs/engine.md section 3 and section 7, identity 7).
 *
 * 1. Candidate sets from degrees and cut sizes only: the required people plus one person per
 *    closed group without one (the best connected), then for each of R seeds from the `pool`
 *    best-connected people, a greedy fill that each time adds the pool member giving the
 *    smallest stationary bound pi(A^c)^2 / Q(A, A^c) (bottleneck.ts); O(R k pool).
 * 2. The `keep` best-scoring distinct sets (default 200) are evaluated in score order (one
 *    conjugate-gradient solve each, warm-started, relative residual 1e-7) until the time budget
 *    (timeLimitMs, default 8 minutes) is spent; progress after each.
 * 3. The best evaluated set is re-solved for the reported total (dense exact reach, or CG to
 *    relative residual 1e-10 from its ranking solve above the dense limit); the lower bound is
 *    the proven cover bound as for every plan (identity 6), so it never exceeds the optimum.
 * The quality rank's worst single starter is the least connected person's exact total up to
 * 200 000 people, above that the worst screened set's total (an estimate, said in the notes).
 */
import { cutOf, stationaryBound } from './bottleneck';
import { EngineError } from './errors';
import { finishPlan, type PlanContext } from './plan-context';
import type { PlanResult } from './plan-types';
import { DEFAULT_DENSE_LIMIT, exactReach } from './reach';
import { SparseSystem } from './sparse-system';

interface Candidate {
  readonly set: number[];
  readonly score: number;
}

export function screenPlan(ctx: PlanContext): PlanResult {
  const { room, n } = ctx;
  const started = performance.now();
  const budget = ctx.options.timeLimitMs ?? 8 * 60_000;
  const progress = ctx.options.onProgress;
  const candidates = screenCandidates(ctx, ctx.options.screenKeep ?? 200);
  progress?.({ stage: 'screen', done: 0, of: candidates.length });
  const ones = new Float64Array(n).fill(1);
  let best: number[] | null = null;
  let bestH: Float64Array | null = null;
  let bestTotal = Infinity;
  let worstSeen = 0;
  let evaluated = 0;
  let x0: Float64Array | undefined;
  for (const c of candidates) {
    if (evaluated > 0 && performance.now() - started > budget) break;
    // Ranking solves stop at relative residual 1e-7; the winner is re-solved to 1e-10 below.
    const sys = new SparseSystem(room, c.set, 1e-7);
    const h = sys.solve(ones, x0);
    x0 = h;
    const t = sumActive(h, sys.active);
    evaluated++;
    worstSeen = Math.max(worstSeen, t);
    if (t < bestTotal * (1 - 1e-12)) {
      best = c.set;
      bestH = h;
      bestTotal = t;
    }
    progress?.({ stage: 'screen', done: evaluated, of: candidates.length });
  }
  if (!best || !bestH) throw new EngineError('NO_FEASIBLE_PLAN', 'The screen found no set of starters to evaluate.');
  const scale = 1 / (1 - room.laziness);
  const worst = n <= 200_000 ? leastConnectedTotal(ctx) : null;
  ctx.worstOverride = (worst ?? worstSeen) * scale;
  const dense = n <= (ctx.options.denseLimit ?? DEFAULT_DENSE_LIMIT);
  let total: number;
  if (dense) total = exactReach(room, best).total;
  else {
    const sys = new SparseSystem(room, best, 1e-10);
    total = sumActive(sys.solve(ones, bestH), sys.active) * scale;
  }
  ctx.notes.push(
    `Bottleneck screen: ${candidates.length} candidate sets ranked by the stationary bound from cut sizes, ${evaluated} evaluated by exact solves (conjugate gradient to relative residual 1e-7, the chosen set to 1e-10)` +
      `${evaluated < candidates.length ? ' (time budget reached)' : ''}. ` +
      (worst === null
        ? 'The quality rank is relative to the worst screened set (an estimate).'
        : 'The quality rank uses the least connected person as the worst single starter (an estimate).'),
  );
  return { ...finishPlan(ctx, 'screen', best, total), solverPath: 'iterative' };
}

/** Exact total with the least connected allowed person as the only starter (rank 0 estimate). */
function sumActive(h: Float64Array, active: Uint8Array): number {
  let t = 0;
  for (let i = 0; i < h.length; i++) if (active[i]) t += h[i];
  return t;
}

function leastConnectedTotal(ctx: PlanContext): number | null {
  if (ctx.classes.closedClasses.length !== 1) return null;
  const d = ctx.room.csr.outStrength;
  let w = 0;
  for (let i = 1; i < ctx.n; i++) if (d[i] < d[w]) w = i;
  return exactReach(ctx.room, [w], { denseLimit: ctx.options.denseLimit }).total / (1 / (1 - ctx.room.laziness));
}

/** The starting people: required ones, then the best connected allowed member of each closed group without one. */
function baseSet(ctx: PlanContext): number[] {
  const d = ctx.room.csr.outStrength;
  const base = [...ctx.mustInclude];
  const isIn = new Uint8Array(ctx.n);
  for (const p of base) isIn[p] = 1;
  for (const cls of ctx.classes.closedClasses) {
    if (cls.some((p) => isIn[p])) continue;
    let b = -1;
    for (const p of cls) if (ctx.allowed[p] && (b < 0 || d[p] > d[b])) b = p;
    base.push(b);
    isIn[b] = 1;
  }
  return base;
}

/** The `keep` best distinct candidate sets by the stationary bound, best first. */
export function screenCandidates(ctx: PlanContext, keep: number): Candidate[] {
  const { room, n, k } = ctx;
  const { csr } = room;
  const d = csr.outStrength;
  const base = baseSet(ctx);
  const inBase = new Uint8Array(n);
  for (const p of base) inBase[p] = 1;
  const free: number[] = [];
  for (let i = 0; i < n; i++) if (ctx.allowed[i] && !inBase[i]) free.push(i);
  free.sort((a, b) => d[b] - d[a] || a - b);
  const pool = free.slice(0, Math.min(free.length, Math.max(40 * k, 1000)));
  const at = new Int32Array(n).fill(-1);
  pool.forEach((p, q) => (at[p] = q));
  const start = cutOf(csr, base);
  const toBase = new Float64Array(pool.length);
  for (const p of base)
    for (let e = csr.rowStart[p]; e < csr.rowStart[p + 1]; e++) if (at[csr.col[e]] >= 0) toBase[at[csr.col[e]]] += csr.weight[e];
  const seeds = Math.min(pool.length, 2 * keep);
  const found = new Map<string, Candidate>();
  const toSet = new Float64Array(pool.length);
  const taken = new Uint8Array(pool.length);
  for (let s = 0; s < seeds && k > base.length; s++) {
    toSet.set(toBase);
    taken.fill(0);
    const set = [...base];
    let cut = start.cut;
    let vol = start.volume;
    const take = (q: number) => {
      const p = pool[q];
      taken[q] = 1;
      set.push(p);
      cut += d[p] - 2 * toSet[q];
      vol += d[p];
      for (let e = csr.rowStart[p]; e < csr.rowStart[p + 1]; e++) if (at[csr.col[e]] >= 0) toSet[at[csr.col[e]]] += csr.weight[e];
    };
    take(s);
    while (set.length < k) {
      let bq = -1;
      let bs = Infinity;
      for (let q = 0; q < pool.length; q++) {
        if (taken[q]) continue;
        const sc = stationaryBound({ cut: cut + d[pool[q]] - 2 * toSet[q], volume: vol + d[pool[q]], total: start.total });
        if (sc < bs) {
          bs = sc;
          bq = q;
        }
      }
      if (bq < 0) break;
      take(bq);
    }
    const key = [...set].sort((a, b) => a - b).join(',');
    if (!found.has(key)) found.set(key, { set, score: stationaryBound({ cut, volume: vol, total: start.total }) });
  }
  if (found.size === 0) found.set(base.join(','), { set: base, score: stationaryBound(start) });
  return [...found.values()].sort((a, b) => a.score - b.score).slice(0, keep);
}
