/**
 * Widened greedy: rank every small set by its quality rank, keep the near-optimal ones
 * (rank >= nu) at the smallest size m (1, then 2) where any exist, extend each greedily to k
 * and keep the best (a published refinement of greedy: J. Res. NIST 121, 2016). Pairs come
 * from identity 4 in O(n^2). When no set of size <= 2 reaches nu, the best `maxSeeds` pairs
 * are extended instead (stated in the notes). The plain greedy result is always among the
 * candidates, so the result is never worse than greedy. With required people or several closed
 * groups, seeds are the single additions to greedy's starting set (see widenFromBase).
 * Cost: O(n^3) once, then O(k n^2) per seed (at most maxSeeds seeds); a seed is dropped as soon
 * as the identity-6 bound shows its extensions cannot beat the best plan so far.
 */
import { AbsorbingState } from './dense-state';
import { allPairsTotals } from './pairs';
import { initialState, type PlanContext } from './plan-context';
import { extendGreedy } from './plan-greedy';
import { qualityRank } from './quality';

export function widenedState(ctx: PlanContext, greedy: AbsorbingState): AbsorbingState {
  const e = ctx.ergodic();
  const nu = ctx.options.nu ?? 0.9;
  const maxSeeds = ctx.options.maxSeeds ?? 64;
  if (ctx.k < 2) return greedy;
  if (!e || ctx.mustInclude.length > 0) return widenFromBase(ctx, greedy, nu, maxSeeds);
  const n = ctx.n;
  const cover = ctx.cover().size;
  const worst = ctx.worstTotal();
  const scale = e.scale;
  const rank = (t: number, size: number) => qualityRank(t, worst, n, size, cover, scale);
  type Seed = { set: number[]; total: number };
  let seeds: Seed[] = [];
  for (let j = 0; j < n; j++) if (ctx.allowed[j] && rank(e.singleTotals[j], 1) >= nu) seeds.push({ set: [j], total: e.singleTotals[j] });
  if (seeds.length === 0) {
    const pairs = allPairsTotals(e);
    const all: Seed[] = [];
    for (let a = 0; a < n; a++) {
      if (!ctx.allowed[a]) continue;
      for (let b = a + 1; b < n; b++)
        if (ctx.allowed[b] && Number.isFinite(pairs[a * n + b])) all.push({ set: [a, b], total: pairs[a * n + b] });
    }
    all.sort((x, y) => x.total - y.total || x.set[0] - y.set[0] || x.set[1] - y.set[1]);
    seeds = all.filter((s) => rank(s.total, 2) >= nu);
    if (seeds.length === 0) {
      seeds = all.slice(0, maxSeeds);
      ctx.notes.push(`No set of 1 or 2 starters reaches quality rank ${nu}; the ${seeds.length} best pairs were extended.`);
    } else
      ctx.notes.push(
        `${seeds.length} pairs reach quality rank ${nu}${seeds.length > maxSeeds ? `; the best ${maxSeeds} were extended` : ''}.`,
      );
  } else {
    seeds.sort((x, y) => x.total - y.total || x.set[0] - y.set[0]);
    ctx.notes.push(`${seeds.length} single starters reach quality rank ${nu}.`);
  }
  seeds = seeds.slice(0, maxSeeds);
  let best = greedy;
  let done = 0;
  for (const seed of seeds) {
    const s = AbsorbingState.fromErgodic(e, seed.set[0]);
    for (const x of seed.set.slice(1)) s.add(x);
    const ext = extendGreedy(ctx, s, ctx.k, false, best.rawTotal);
    if (ext && ext.rawTotal < best.rawTotal - 1e-12 * best.rawTotal) best = ext;
    // Counted apart from the report: an absent onProgress would skip evaluating its argument.
    done++;
    ctx.options.onProgress?.({ stage: 'widened', done, of: seeds.length });
    if (performance.now() > ctx.deadline) {
      ctx.warnings.push({ code: 'widening-time-limit', text: `Time limit reached after ${done} of ${seeds.length} seeds.` });
      break;
    }
  }
  return best;
}

/**
 * With required people or several closed groups the seeds grow from the starting set B of
 * greedy (required people plus one starter per closed group): every single addition is scored
 * by identity 2 at B, the ones reaching rank nu (or the best maxSeeds) are extended greedily.
 */
function widenFromBase(ctx: PlanContext, greedy: AbsorbingState, nu: number, maxSeeds: number): AbsorbingState {
  const base = initialState(ctx);
  if (base.starters.length >= ctx.k) return greedy;
  const worst = ctx.worstTotal();
  const cover = ctx.cover().size;
  const size = base.starters.length + 1;
  const cands: { j: number; total: number }[] = [];
  for (let j = 0; j < ctx.n; j++)
    if (base.inT[j] && ctx.allowed[j]) cands.push({ j, total: (base.rawTotal - base.rawGain(j)) * base.scale });
  cands.sort((a, b) => a.total - b.total || a.j - b.j);
  let seeds = cands.filter((c) => qualityRank(c.total, worst, ctx.n, size, cover, base.scale) >= nu);
  if (seeds.length === 0) seeds = cands;
  seeds = seeds.slice(0, maxSeeds);
  ctx.notes.push(`Widened from the ${base.starters.length} required or group starters: ${seeds.length} single additions extended.`);
  let best = greedy;
  for (const seed of seeds) {
    const s = base.clone();
    s.add(seed.j);
    const ext = extendGreedy(ctx, s, ctx.k, false, best.rawTotal);
    if (ext && ext.rawTotal < best.rawTotal - 1e-12 * best.rawTotal) best = ext;
    if (performance.now() > ctx.deadline) {
      ctx.warnings.push({ code: 'widening-time-limit', text: 'Time limit reached while widening.' });
      break;
    }
  }
  return best;
}
