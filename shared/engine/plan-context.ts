/**
 * Validation and shared state of a planning run: constraints, closed classes, the cover,
 * the ergodic data (computed at most once), and the common finish (rank, lower bound, gap).
 */
import { coverBound, gainShare, qualityRank } from './quality';
import { vertexCover, type CoverResult } from './cover';
import { AbsorbingState, beats, tieTolerance } from './dense-state';
import { EngineError } from './errors';
import { ergodicFromWalk, ergodicSymmetric, isReversibleErgodic, type ErgodicData } from './ergodic';
import type { PlanMethod, PlanOptions, PlanResult, PlanWarning } from './plan-types';
import { classStructure, type ClassStructure } from './reachability';
import { DEFAULT_DENSE_LIMIT, exactReach } from './reach';
import { checkPeople, prepareRoom, type PreparedRoom, type RoomInput } from './room';
import { denseWalk } from './walk';

export interface PlanContext {
  readonly room: PreparedRoom;
  readonly n: number;
  readonly k: number;
  readonly mustInclude: number[];
  readonly exclude: number[];
  /** 1 = may be chosen (not excluded). */
  readonly allowed: Uint8Array;
  readonly classes: ClassStructure;
  readonly started: number;
  readonly options: PlanOptions;
  readonly notes: string[];
  readonly warnings: PlanWarning[];
  cover(): CoverResult;
  p1(): Float64Array;
  /** Ergodic data, or null when the room has several closed classes. */
  ergodic(): ErgodicData | null;
  /** The worst single-starter total (rank 0 of the quality rank). */
  worstTotal(): number;
  /** Lower bounds collected by the planner (identity 6), in scaled units. */
  bounds: number[];
  deadline: number;
  /** Set by planners that estimate the worst single-starter total instead of computing it. */
  worstOverride?: number;
  /** Set by planners that score every single starter on their own (the sparse first pick). */
  bestSingleOverride?: { person: number; total: number };
}

export function planContext(input: RoomInput, options: PlanOptions): PlanContext {
  const started = performance.now();
  const room = prepareRoom(input, options);
  const n = room.n;
  const k = options.k;
  const { mustInclude, exclude, allowed, classes } = checkedRequest(room, options);
  let coverCache: CoverResult | undefined;
  let p1Cache: Float64Array | undefined;
  let ergCache: ErgodicData | null | undefined;
  let worstCache: number | undefined;
  const ctx: PlanContext = {
    room,
    n,
    k,
    mustInclude,
    exclude,
    allowed,
    classes,
    started,
    options,
    notes: [],
    warnings: [],
    bounds: [],
    deadline: started + (options.timeLimitMs ?? 10_000),
    cover: () => (coverCache ??= vertexCover(room)),
    p1: () => (p1Cache ??= denseWalk(room)),
    ergodic: () => {
      if (ergCache === undefined) {
        if (classes.closedClasses.length !== 1) ergCache = null;
        else if (options.ergodic && options.ergodic.n === n) ergCache = options.ergodic;
        else if (isReversibleErgodic(room, 1)) ergCache = ergodicSymmetric(room);
        else ergCache = ergodicFromWalk(ctx.p1(), n, 1 / (1 - room.laziness));
      }
      return ergCache;
    },
    worstTotal: () => ctx.worstOverride ?? (worstCache ??= worstSingle(ctx)),
  };
  if (classes.closedClasses.length > 1) {
    ctx.notes.push(`The room has ${classes.closedClasses.length} closed groups; the plan keeps at least one starter in each.`);
  }
  return ctx;
}

/**
 * The request checked against the room: k in range, the constraint lists, and one starter
 * possible in every closed group. Throws an EngineError naming what to change.
 */
function checkedRequest(
  room: PreparedRoom,
  options: PlanOptions,
): { mustInclude: number[]; exclude: number[]; allowed: Uint8Array; classes: ClassStructure } {
  const n = room.n;
  const k = options.k;
  if (n < 2) throw new EngineError('INVALID_K', 'A plan needs a room of at least two people.');
  if (!Number.isInteger(k) || k < 1 || k >= n) {
    throw new EngineError('INVALID_K', `k must be a whole number with 1 <= k <= ${n - 1} (the room has ${n} people); got ${String(k)}.`, {
      k,
      n,
    });
  }
  const mustInclude = checkPeople(room, options.mustInclude ?? [], 'People who must be briefed');
  const exclude = checkPeople(room, options.exclude ?? [], 'People who cannot be briefed');
  const both = mustInclude.filter((p) => exclude.includes(p));
  if (both.length > 0) {
    throw new EngineError('CONFLICTING_CONSTRAINTS', `${both.map((p) => room.ids[p]).join(', ')} cannot be both required and excluded.`, {
      people: both,
    });
  }
  if (mustInclude.length > k) {
    throw new EngineError(
      'MUST_INCLUDE_TOO_MANY',
      `${mustInclude.length} people must be briefed but k is ${k}: raise k or shorten the list.`,
      { k, mustInclude: mustInclude.length },
    );
  }
  if (n - exclude.length < k) {
    throw new EngineError('NO_FEASIBLE_PLAN', `Only ${n - exclude.length} people may be briefed, fewer than k = ${k}.`);
  }
  const allowed = new Uint8Array(n).fill(1);
  for (const p of exclude) allowed[p] = 0;
  const classes = classStructure(room);
  const isMust = new Uint8Array(n);
  for (const p of mustInclude) isMust[p] = 1;
  let open = 0;
  for (const cls of classes.closedClasses) {
    if (cls.some((p) => isMust[p])) continue;
    if (!cls.some((p) => allowed[p])) {
      throw new EngineError(
        'NO_FEASIBLE_PLAN',
        `The closed group ${describe(room, cls)} can only hear from one of its own members, and all of them are excluded.`,
        { group: cls },
      );
    }
    open++;
  }
  if (mustInclude.length + open > k) {
    throw new EngineError(
      'K_BELOW_CLOSED_GROUPS',
      `The room has ${classes.closedClasses.length} closed groups (parts no question leaves), and each needs its own starter` +
        (mustInclude.length > 0 ? ` besides the ${mustInclude.length} required people` : '') +
        `: k must be at least ${mustInclude.length + open} (got ${k}).`,
      { closedGroups: classes.closedClasses.length, needed: mustInclude.length + open },
    );
  }
  return { mustInclude, exclude, allowed, classes };
}

function describe(room: PreparedRoom, cls: number[]): string {
  const names = cls.slice(0, 5).map((p) => room.ids[p]);
  return `{${names.join(', ')}${cls.length > 5 ? `, ... (${cls.length} people)` : ''}}`;
}

/** Worst single-starter total; with several closed groups, each group's worst member together. */
function worstSingle(ctx: PlanContext): number {
  const e = ctx.ergodic();
  if (e) {
    let w = 0;
    for (let j = 0; j < ctx.n; j++) if (Number.isFinite(e.singleTotals[j]) && e.singleTotals[j] > w) w = e.singleTotals[j];
    return w;
  }
  const picks = ctx.classes.closedClasses.map((cls) => classPick(ctx, cls, null, true));
  return exactReach(ctx.room, picks).total;
}

/** Best (or worst) single starter of a closed class, within the class's own walk. */
export function classPick(ctx: PlanContext, cls: number[], allowed: Uint8Array | null, worst = false): number {
  if (cls.length === 1) return cls[0];
  const n = ctx.n;
  const m = cls.length;
  const p1 = ctx.p1();
  const sub = new Float64Array(m * m);
  for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) sub[a * m + b] = p1[cls[a] * n + cls[b]];
  const e = ergodicFromWalk(sub, m);
  let best = -1;
  let bestT = Infinity;
  for (let a = 0; a < m; a++) {
    if (allowed && !allowed[cls[a]]) continue;
    const t = worst ? -e.singleTotals[a] : e.singleTotals[a];
    if (beats(t, cls[a], bestT, best < 0 ? -1 : cls[best], tieTolerance(m))) {
      best = a;
      bestT = t;
    }
  }
  return cls[best];
}

/**
 * The starting set of the dense planners and its state: the required people, then one
 * starter per closed group not yet covered (the group's best single starter), or, in a
 * room with one closed group and nothing required, the best single starter (identity 3).
 */
export function initialState(ctx: PlanContext): AbsorbingState {
  const e = ctx.ergodic();
  if (ctx.mustInclude.length === 0 && e) {
    let best = -1;
    for (let j = 0; j < ctx.n; j++)
      if (ctx.allowed[j] && beats(e.singleTotals[j], j, best < 0 ? Infinity : e.singleTotals[best], best, tieTolerance(ctx.n))) best = j;
    // For k = 1 the best single starter is the optimum (identity 3 scores every candidate).
    if (ctx.k === 1) ctx.bounds.push(e.singleTotals[best]);
    return AbsorbingState.fromErgodic(e, best);
  }
  const chosen = [...ctx.mustInclude];
  const isIn = new Uint8Array(ctx.n);
  for (const p of chosen) isIn[p] = 1;
  for (const cls of ctx.classes.closedClasses) {
    if (cls.some((p) => isIn[p])) continue;
    const p = classPick(ctx, cls, ctx.allowed);
    chosen.push(p);
    isIn[p] = 1;
  }
  return AbsorbingState.fromStarters(ctx.room, chosen);
}

/** Records the identity-6 bound at a state: OPT_k >= total(S) - (sum of the r largest gains at S). */
export function recordBound(ctx: PlanContext, s: AbsorbingState): void {
  const r = ctx.k - ctx.mustInclude.length;
  ctx.bounds.push((s.rawTotal - s.topGains(ctx.allowed, r)) * s.scale);
}

export interface FinishExtra {
  readonly certified?: boolean;
  readonly lowerBound?: number;
  readonly stopped?: boolean;
  readonly nodes?: number;
  readonly searchLeft?: number;
}

export function finishPlan(ctx: PlanContext, method: PlanMethod, starters: number[], total: number, extra: FinishExtra = {}): PlanResult {
  const n = ctx.n;
  const k = ctx.k;
  const scale = 1 / (1 - ctx.room.laziness);
  const cover = ctx.cover();
  let lowerBound = Math.max(coverBound(n, k, scale), ...ctx.bounds, extra.lowerBound ?? 0);
  if (lowerBound > total) lowerBound = total; // rounding: a proven bound never exceeds an achieved total
  const certified = extra.certified === true || total - lowerBound <= 1e-9 * Math.abs(total);
  if (certified) lowerBound = total;
  const worst = ctx.worstTotal();
  const rank = qualityRank(total, worst, n, k, cover.size, scale);
  const single = bestSingle(ctx);
  const gap = certified ? 0 : Math.max(0, total - lowerBound);
  return {
    method,
    k,
    starters,
    total,
    average: total / (n - k),
    rank,
    lowerBound,
    certified,
    gap,
    relativeGap: total > 0 && Number.isFinite(total) ? gap / total : 0,
    ...(extra.stopped ? { stopped: true } : {}),
    ...(extra.nodes !== undefined ? { nodes: extra.nodes } : {}),
    ...(extra.searchLeft !== undefined ? { searchLeft: certified ? 0 : extra.searchLeft } : {}),
    ...(single ? { bestSingle: single } : {}),
    fewestForOneHop: cover.size,
    fewestToReachAll: fewestToReachAll(ctx),
    gainShare: gainShare(total, lowerBound, single?.total),
    elapsedMs: performance.now() - ctx.started,
    coverSize: cover.size,
    rankScale: { worst, best: coverBound(n, Math.max(k, cover.size), scale) },
    notes: ctx.notes,
    warnings: ctx.warnings,
  };
}

/** The best single starter (identity 3, tie-break of engine.md), or undefined without ergodic data. */
function bestSingle(ctx: PlanContext): { person: number; total: number } | undefined {
  if (ctx.bestSingleOverride) return ctx.bestSingleOverride;
  // Above the dense limit the ergodic data (an n x n inverse, O(n^3)) would cost far more than
  // the plan itself: the card is left out unless the planner scored every single starter.
  if (ctx.n > (ctx.options.denseLimit ?? DEFAULT_DENSE_LIMIT)) return undefined;
  const e = ctx.ergodic();
  if (!e) return undefined;
  let best = -1;
  for (let j = 0; j < ctx.n; j++)
    if (beats(e.singleTotals[j], j, best < 0 ? Infinity : e.singleTotals[best], best, tieTolerance(ctx.n))) best = j;
  return best >= 0 && Number.isFinite(e.singleTotals[best]) ? { person: best, total: e.singleTotals[best] } : undefined;
}

/** Required people plus one starter for every closed group that holds none of them. */
function fewestToReachAll(ctx: PlanContext): number {
  const must = new Set(ctx.mustInclude);
  return must.size + ctx.classes.closedClasses.filter((cls) => !cls.some((p) => must.has(p))).length;
}
