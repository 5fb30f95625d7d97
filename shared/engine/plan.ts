/**
 * Planner entry point: validates the request (typed EngineError on bad input), runs the
 * chosen method and reports total, room average, quality rank, proven lower bound, gap and
 * whether the plan is certified optimal.
 *
 * `auto` chooses by size: rooms above the dense limit use the sparse exact greedy when the
 * room is undirected and its factor fits, lazy greedy otherwise; `screen` is the bottleneck
 * screen for very large rooms (plan-screen.ts); small searches
 * (n <= 150 with at most ~2e6 k-sets, n <= 40 with k <= 6, or k = 1) use exhaustive branch
 * and bound under the time limit; rooms up to 400 people use widened greedy followed by swap polish; larger
 * dense rooms use greedy followed by swap polish. When the cover fits within k (and there is
 * no mixing) the cover plus greedy fill reaches the proven best total n - k.
 */
import { AbsorbingState } from './dense-state';
import { EngineError } from './errors';
import { finishPlan, planContext, type PlanContext } from './plan-context';
import { exhaustiveSearch } from './plan-exhaustive';
import { extendGreedy, greedyState } from './plan-greedy';
import { lazyGreedyPlan } from './plan-lazy';
import { screenPlan } from './plan-screen';
import { MAX_FACTOR_WORK } from './grounded-factor';
import { sparseGreedyEligible, sparseGreedyPlan } from './plan-sparse-greedy';
import { swapPolish } from './plan-swap';
import type { PlanMethod, PlanOptions, PlanResult } from './plan-types';
import { widenedState } from './plan-widened';
import { exactReach, DEFAULT_DENSE_LIMIT } from './reach';
import type { RoomInput } from './room';

/** Undirected rooms of at least this many people run method greedy on the sparse factor. */
export const SPARSE_GREEDY_FROM = 300;

export const PLAN_METHODS = ['greedy', 'widened', 'swap', 'exhaustive', 'auto', 'lazy-greedy', 'screen'] as const;

function binomial(n: number, k: number): number {
  let r = 1;
  for (let i = 1; i <= k; i++) r = (r * (n - k + i)) / i;
  return r;
}

function finalTotal(ctx: PlanContext, starters: number[], stateTotal: number): number {
  // Re-solve small rooms from scratch so every method reports the same, freshly factored value.
  if (ctx.n <= 500) return exactReach(ctx.room, starters, { solver: 'dense' }).total;
  return stateTotal;
}

function finishState(ctx: PlanContext, method: PlanMethod, s: AbsorbingState, extra: { certified?: boolean } = {}): PlanResult {
  return finishPlan(ctx, method, [...s.starters], finalTotal(ctx, s.starters, s.total), extra);
}

export function plan(input: RoomInput, options: PlanOptions): PlanResult {
  const method = options.method ?? 'auto';
  if (!(PLAN_METHODS as readonly string[]).includes(method)) {
    throw new EngineError('INVALID_OPTION', `Unknown method "${String(method)}": use one of ${PLAN_METHODS.join(', ')}.`);
  }
  if (options.nu !== undefined && !(options.nu >= 0 && options.nu <= 1)) {
    throw new EngineError('INVALID_OPTION', `nu must be between 0 and 1 (got ${options.nu}).`);
  }
  if (options.timeLimitMs !== undefined && !(options.timeLimitMs > 0 && Number.isFinite(options.timeLimitMs))) {
    throw new EngineError('INVALID_OPTION', `The time limit must be a positive number of seconds.`);
  }
  const ctx = planContext(input, options);
  const limit = options.denseLimit ?? DEFAULT_DENSE_LIMIT;
  const big = ctx.n > limit;
  if (method === 'exhaustive' && big) {
    throw new EngineError(
      'EXHAUSTIVE_INFEASIBLE',
      `Exhaustive search is limited to rooms of at most ${limit} people (this room has ${ctx.n}); use greedy, auto or lazy-greedy.`,
    );
  }
  if (method === 'screen') return screenPlan(ctx);
  if (method === 'lazy-greedy') return { ...lazyGreedyPlan(ctx), solverPath: 'iterative' };
  if (big) return largeRoom(ctx, method, limit);
  switch (method) {
    case 'greedy':
      if (ctx.n >= (options.sparseFrom ?? SPARSE_GREEDY_FROM) && sparseGreedyEligible(ctx)) {
        // By default the sparse path must also beat the dense greedy's work; an explicit sparseFrom forces it.
        const work = options.sparseFrom === undefined ? Math.min(MAX_FACTOR_WORK, ctx.n ** 3 / 8) : MAX_FACTOR_WORK;
        const sparse = sparseGreedyPlan(ctx, options.maxFill, work);
        if (sparse) return sparse;
      }
      return finishState(ctx, 'greedy', greedyState(ctx));
    case 'swap':
      return finishState(ctx, 'swap', swapPolish(ctx, greedyState(ctx)));
    case 'widened':
      return finishState(ctx, 'widened', widenedState(ctx, greedyState(ctx)));
    case 'exhaustive':
      return runExhaustive(ctx);
    default:
      return auto(ctx);
  }
}

/**
 * Rooms above the dense limit: the sparse exact greedy for undirected rooms whose factor fits;
 * otherwise (directed rooms, or too much fill) lazy greedy on iterative solves, which says
 * where it estimates.
 */
function largeRoom(ctx: PlanContext, method: string, limit: number): PlanResult {
  if (sparseGreedyEligible(ctx)) {
    const sparse = sparseGreedyPlan(ctx, ctx.options.maxFill);
    if (sparse) {
      if (method !== 'auto' && method !== 'greedy')
        sparse.warnings.push(
          `The room has ${ctx.n} people, above the dense limit of ${limit}: exact greedy was used instead of ${method}.`,
        );
      return sparse;
    }
    ctx.notes.push('The sparse factor of this room would be too large (fill estimate before factoring): iterative solves were used.');
  }
  if (method !== 'auto' && method !== 'greedy')
    ctx.warnings.push(`The room has ${ctx.n} people, above the dense limit of ${limit}: lazy greedy was used instead of ${method}.`);
  return { ...lazyGreedyPlan(ctx), solverPath: 'iterative' };
}

function runExhaustive(ctx: PlanContext): PlanResult {
  const start = swapPolish(ctx, greedyState(ctx));
  const out = exhaustiveSearch(ctx, start);
  if (!out.complete)
    ctx.warnings.push(`Time limit reached after ${out.nodes} search nodes: the best plan found is returned with a proven gap.`);
  else ctx.notes.push(`Branch and bound visited ${out.nodes} nodes.`);
  const total = finalTotal(ctx, out.state.starters, out.state.total);
  return finishPlan(ctx, 'exhaustive', out.state.starters, total, { certified: out.complete });
}

function auto(ctx: PlanContext): PlanResult {
  const { n, k } = ctx;
  const cover = ctx.cover();
  if (ctx.room.mixing === 0 && cover.size <= k && !cover.cover.some((p) => !ctx.allowed[p])) {
    const set = [...new Set([...ctx.mustInclude, ...cover.cover])];
    if (set.length <= k) {
      const s = extendGreedy(ctx, AbsorbingState.fromStarters(ctx.room, set), k);
      ctx.notes.push(`A vertex cover of ${cover.size} people fits within k: every other person hears in one hop.`);
      return finishState(ctx, 'greedy', s);
    }
  }
  const free = n - ctx.exclude.length - ctx.mustInclude.length;
  const sets = binomial(free, k - ctx.mustInclude.length);
  if ((n <= 150 && sets <= 2e6) || (n <= 40 && k <= 6) || k === 1) return runExhaustive(ctx);
  const g = greedyState(ctx);
  if (n <= 400) {
    const w = widenedState(ctx, g);
    const s = swapPolish(ctx, w);
    ctx.notes.push('Widened greedy, then swap polish.');
    return finishState(ctx, 'swap', s);
  }
  ctx.notes.push('Greedy, then swap polish.');
  return finishState(ctx, 'swap', swapPolish(ctx, g));
}
