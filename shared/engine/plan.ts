/**
 * Planner entry point: validates the request (typed EngineError on bad input), runs the
 * chosen method and reports total, room average, quality rank, proven lower bound, gap and
 * whether the plan is certified optimal.
 *
 * `auto` chooses by size: rooms above the dense limit use lazy greedy; small searches
 * (n <= 150 with at most ~2e6 k-sets, n <= 40 with k <= 6, or k = 1) use exhaustive branch
 * and bound under the time limit; rooms up to 400 people use widened greedy followed by swap polish; larger
 * dense rooms use greedy followed by swap polish. When the cover fits within k (and there is
 * no mixing) the cover plus greedy fill reaches the proven best total n - k.
 */
import { AbsorbingState } from './dense-state';
import { EngineError } from './errors';
import { finishPlan, planContext, type PlanContext } from './plan-context';
import { exhaustiveSearch, type ExhaustiveOutcome } from './plan-exhaustive';
import { extendGreedy, greedyState } from './plan-greedy';
import { MAX_FACTOR_WORK } from './grounded-factor';
import { boundedGreedyEligible, boundedGreedyPlan } from './plan-bounded-greedy';
import { lazyGreedyPlan } from './plan-lazy';
import { screenPlan } from './plan-screen';
import { sparseGreedyEligible, sparseGreedyPlan } from './plan-sparse-greedy';
import { swapPolish } from './plan-swap';
import { FILL_ORDERS, type PlanMethod, type PlanOptions, type PlanResult } from './plan-types';
import { widenedState } from './plan-widened';
import { addQuickBounds } from './plan-bounds';
import { NO_SHOW_EXACT_LIMIT, noShowExhaustive, noShowGreedy, noShowReport, noShowSwap, requireNoShowRoom } from './plan-noshow';
import { exactReach, DEFAULT_DENSE_LIMIT } from './reach';
import type { RoomInput } from './room';

/**
 * Undirected rooms of at least this many people run method greedy on the sparse factor, which
 * beats the dense greedy there on sparse rooms (4-10x at 100-300 people, measured by
 * `npm run bench`); the work estimate in plan() still sends dense rooms to the dense path.
 */
export const SPARSE_GREEDY_FROM = 100;
/**
 * Below this size, plans of at most SMALL_K_DENSE starters stay dense: the pair bound of
 * plan-bounds.ts needs the dense ergodic data, and at k = 2 or 3 it often proves the greedy
 * plan best, which the sparse path's bounds (one-hop, supermodular) cannot.
 */
const PAIR_BOUND_SIZE = 300;
const SMALL_K_DENSE = 3;

/** Whether method greedy takes the sparse factor (before the fill and work checks). */
export function sparseGreedyWanted(n: number, k: number, directed: boolean, sparseFrom: number | undefined): boolean {
  if (directed) return false;
  if (sparseFrom !== undefined) return n >= sparseFrom;
  return n >= SPARSE_GREEDY_FROM && (n >= PAIR_BOUND_SIZE || k > SMALL_K_DENSE);
}

export const PLAN_METHODS = ['greedy', 'widened', 'swap', 'exhaustive', 'auto', 'lazy-greedy', 'screen'] as const;

function finalTotal(ctx: PlanContext, starters: number[], stateTotal: number): number {
  // Re-solve small rooms from scratch so every method reports the same, freshly factored value.
  if (ctx.n <= 500) return exactReach(ctx.room, starters, { solver: 'dense' }).total;
  return stateTotal;
}

function finishState(ctx: PlanContext, method: PlanMethod, s: AbsorbingState, extra: { certified?: boolean } = {}): PlanResult {
  return finishPlan(ctx, method, [...s.starters], finalTotal(ctx, s.starters, s.total), extra);
}

/** Rooms up to this size get branch and bound after the heuristics under auto. */
const SEARCH_LIMIT = 400;

/**
 * A heuristic plan with the cheap proven bounds of docs/bounds.md added, and with
 * options.boundMs a branch and bound of that many milliseconds run only for its lower bound
 * (the plan stays the heuristic's; a certified optimum it finds is named in the notes).
 */
function quick(ctx: PlanContext, method: PlanMethod, s: AbsorbingState): PlanResult {
  addQuickBounds(ctx);
  const boundMs = ctx.options.boundMs ?? 0;
  if (boundMs > 0 && ctx.n <= SEARCH_LIMIT) {
    ctx.deadline = performance.now() + boundMs;
    const out = exhaustiveSearch(ctx, s);
    ctx.bounds.push(out.lowerBound);
    if (out.complete && out.state.total < s.total * (1 - 1e-9))
      ctx.notes.push(`A bounding search proved that the best plan of this size has total ${out.state.total.toFixed(2)}.`);
  }
  return finishState(ctx, method, s);
}

/** A plan that still needs its branch and bound: the context, the heuristic start and the result's name. */
export interface PendingSearch {
  readonly ctx: PlanContext;
  readonly start: AbsorbingState;
  readonly method: PlanMethod;
}

export function plan(input: RoomInput, options: PlanOptions): PlanResult {
  const step = planStart(input, options);
  if ('result' in step) return step.result;
  return planFinish(step, exhaustiveSearch(step.ctx, step.start));
}

/** Everything before the search: a finished plan, or the search still to run (planFinish completes it). */
export function planStart(input: RoomInput, options: PlanOptions): { result: PlanResult } | PendingSearch {
  const done = (result: PlanResult) => ({ result });
  const method = options.method ?? 'auto';
  if (!(PLAN_METHODS as readonly string[]).includes(method)) {
    throw new EngineError('INVALID_OPTION', `Unknown method "${String(method)}": use one of ${PLAN_METHODS.join(', ')}.`);
  }
  if (options.fillOrder !== undefined && !(FILL_ORDERS as readonly string[]).includes(options.fillOrder)) {
    throw new EngineError('INVALID_OPTION', `Unknown fill order "${String(options.fillOrder)}": use one of ${FILL_ORDERS.join(', ')}.`);
  }
  if (options.nu !== undefined && !(options.nu >= 0 && options.nu <= 1)) {
    throw new EngineError('INVALID_OPTION', `nu must be between 0 and 1 (got ${options.nu}).`);
  }
  if (options.boundMs !== undefined && !(options.boundMs >= 0 && Number.isFinite(options.boundMs))) {
    throw new EngineError(
      'INVALID_OPTION',
      `The bounding time must be zero or a positive number of milliseconds (got ${String(options.boundMs)}).`,
    );
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
  if (options.noShow !== undefined) {
    if (big || method === 'lazy-greedy')
      throw new EngineError('INVALID_OPTION', `No-show plans are computed for rooms of at most ${limit} people with dense methods.`);
    return done(noShowPlan(ctx, method, options.noShow));
  }
  if (method === 'screen') return done(screenPlan(ctx));
  if (method === 'lazy-greedy') return done({ ...lazyGreedyPlan(ctx), solverPath: 'iterative' });
  if (big) return done(largeRoom(ctx, method, limit));
  switch (method) {
    case 'greedy':
      if (sparseGreedyWanted(ctx.n, ctx.k, ctx.room.directed, options.sparseFrom) && sparseGreedyEligible(ctx)) {
        // By default the sparse path must also beat the dense greedy's work; an explicit sparseFrom forces it.
        const work = options.sparseFrom === undefined ? Math.min(MAX_FACTOR_WORK, ctx.n ** 3 / 8) : MAX_FACTOR_WORK;
        const sparse = sparseGreedyPlan(ctx, options.maxFill, work);
        if (sparse) return done(sparse);
      }
      return done(quick(ctx, 'greedy', greedyState(ctx)));
    case 'swap':
      return done(quick(ctx, 'swap', swapPolish(ctx, greedyState(ctx))));
    case 'widened':
      return done(quick(ctx, 'widened', widenedState(ctx, greedyState(ctx))));
    case 'exhaustive':
      return { ctx, start: heuristicState(ctx), method: 'exhaustive' };
    default:
      return auto(ctx);
  }
}

/** The heuristic incumbent of every search: widened greedy, then swap polish. */
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
        sparse.warnings.push({
          code: 'over-dense-limit',
          text: `The room has ${ctx.n} people, above the dense limit of ${limit}: exact greedy was used instead of ${method}.`,
        });
      return sparse;
    }
    ctx.notes.push('The sparse factor of this room would be too large (fill estimate before factoring): iterative solves were used.');
    if (boundedGreedyEligible(ctx)) {
      if (method !== 'auto' && method !== 'greedy')
        ctx.warnings.push({
          code: 'over-dense-limit',
          text: `The room has ${ctx.n} people, above the dense limit of ${limit}: exact greedy was used instead of ${method}.`,
        });
      return boundedGreedyPlan(ctx);
    }
  }
  if (method !== 'auto' && method !== 'greedy')
    ctx.warnings.push({
      code: 'over-dense-limit',
      text: `The room has ${ctx.n} people, above the dense limit of ${limit}: lazy greedy was used instead of ${method}.`,
    });
  return { ...lazyGreedyPlan(ctx), solverPath: 'iterative' };
}

function heuristicState(ctx: PlanContext): AbsorbingState {
  return swapPolish(ctx, widenedState(ctx, greedyState(ctx)));
}

/**
 * Branch and bound from the heuristic plan. `method` names the result: 'exhaustive' when asked
 * for, otherwise the heuristic's own name unless the search found a strictly better set.
 */
export function planFinish(pending: PendingSearch, out: ExhaustiveOutcome): PlanResult {
  const { ctx, start, method } = pending;
  const improved = out.state.total < start.total * (1 - 1e-12);
  const name: PlanMethod = method === 'exhaustive' || improved ? 'exhaustive' : method;
  const left = `${(100 * out.searchLeft).toPrecision(2)} % of the search space`;
  if (out.resumed)
    ctx.notes.push(
      `The search continued where an earlier one of the same problem stopped (${out.resume.nodes - out.nodes} steps before, ${out.resume.runs - 1} earlier ${out.resume.runs === 2 ? 'run' : 'runs'}).`,
    );
  if (out.stopped)
    ctx.warnings.push({
      code: 'search-stopped',
      text: `The search was stopped after ${out.nodes} steps with ${left} still open: the best plan found is returned with its proven gap.`,
    });
  else if (!out.complete)
    ctx.warnings.push({
      code: 'search-time-limit',
      text: `Time limit reached after ${out.nodes} search steps with ${left} still open: the best plan found is returned with its proven gap.`,
    });
  else ctx.notes.push(`Branch and bound checked every plan of this size (${out.nodes} search steps): proven best.`);
  const total = finalTotal(ctx, out.state.starters, out.state.total);
  const result = finishPlan(ctx, name, out.state.starters, total, {
    certified: out.complete,
    lowerBound: out.lowerBound,
    stopped: out.stopped,
    nodes: out.nodes,
    searchLeft: out.searchLeft,
  });
  return { ...result, resume: out.resume };
}

function auto(ctx: PlanContext): { result: PlanResult } | PendingSearch {
  const { n, k } = ctx;
  const cover = ctx.cover();
  if (ctx.room.mixing === 0 && cover.size <= k && !cover.cover.some((p) => !ctx.allowed[p])) {
    const set = [...new Set([...ctx.mustInclude, ...cover.cover])];
    if (set.length <= k) {
      const s = extendGreedy(ctx, AbsorbingState.fromStarters(ctx.room, set), k);
      ctx.notes.push(`A vertex cover of ${cover.size} people fits within k: every other person hears in one hop.`);
      return { result: finishState(ctx, 'greedy', s) };
    }
  }
  if (n <= SEARCH_LIMIT) {
    // Widened greedy and swap polish, then branch and bound for the rest of the time budget:
    // certified, or the heuristic plan with the proven gap the search reached.
    ctx.notes.push('Widened greedy, then swap polish, then branch and bound.');
    return { ctx, start: heuristicState(ctx), method: 'swap' };
  }
  const g = greedyState(ctx);
  addQuickBounds(ctx);
  ctx.notes.push('Greedy, then swap polish.');
  return { result: finishState(ctx, 'swap', swapPolish(ctx, g)) };
}

/**
 * Plans under a no-show chance (plan-noshow.ts): greedy, then swap polish (all methods but
 * greedy), then every k-set when exhaustive is asked and affordable. Above 12 starters the
 * plan is chosen for full attendance and the expectation is sampled.
 */
function noShowPlan(ctx: PlanContext, method: string, p: number): PlanResult {
  requireNoShowRoom(ctx, p);
  let set: number[];
  let used: PlanMethod = method === 'greedy' ? 'greedy' : method === 'exhaustive' ? 'exhaustive' : 'swap';
  let certified = false;
  if (ctx.k > NO_SHOW_EXACT_LIMIT) {
    set = [...heuristicState(ctx).starters];
    used = 'swap';
    ctx.notes.push(`With more than ${NO_SHOW_EXACT_LIMIT} starters the plan is chosen for full attendance; the expected total is sampled.`);
  } else {
    set = noShowGreedy(ctx, p);
    if (method !== 'greedy') {
      const polished = noShowSwap(ctx, set, p);
      set = polished.set;
      if (method === 'exhaustive') {
        const all = noShowExhaustive(ctx, p, polished);
        if (all) {
          set = all.set;
          certified = true;
          ctx.notes.push('Every plan of this size was scored on the expected total: proven best for this no-show chance.');
        } else {
          used = 'swap';
          ctx.warnings.push({
            code: 'no-show-not-exhaustive',
            text: 'Too many plans of this size to score each on the expected total: greedy and swap polish were used.',
          });
        }
      }
    }
  }
  const report = noShowReport(ctx, set, p);
  const total = exactReach(ctx.room, set, { solver: 'dense' }).total;
  return { ...finishPlan(ctx, used, set, total), noShow: { ...report, provenBest: certified } };
}
