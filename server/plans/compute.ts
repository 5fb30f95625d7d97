/**
 * Plan computations on a room snapshot, run inside the plan worker pool (server/jobs/plan-worker.ts):
 * the engine's planners, exact reach for hand-made plans, the per-person expected hops and the
 * reach curve. Pure: no database, no HTTP. Engine errors come back as values (their class does
 * not survive the trip between threads).
 */
import {
  exactReach,
  isEngineError,
  plan,
  prepareRoom,
  reachCurve,
  type PlanOptions,
  type PlanProgress,
  type PlanResult,
  type PreparedRoom,
  type RoomGraph,
  type SearchResume,
} from '../../shared/engine/index';
import { planWithWorkers } from '../../shared/engine/parallel/index';
import type { ErrorCode } from '../../shared/api/errors';
import type { PlanMethodChoice, PlanSearchProgress, PlanSettingsSnapshot, PlanWarning, ReachQuantileDto } from '../../shared/api/plans';
import { engineCode } from './engine-code';
import { apiWarnings } from './warnings';

export interface RoomSnapshot {
  graph: RoomGraph;
  /** Engine index -> person id. */
  personIds: number[];
  names: string[];
  settings: PlanSettingsSnapshot;
  version: number;
}

export interface PlannerTask {
  kind: 'planner';
  snapshot: RoomSnapshot;
  k: number;
  method: PlanMethodChoice;
  nu?: number;
  timeLimitMs?: number;
  /** Engine indices. */
  mustInclude: number[];
  exclude: number[];
  /** Chance (0..0.5) that a starter does not show up. */
  noShow?: number;
  /** Threads for the branch and bound of exhaustive and auto plans (default 2). */
  threads?: number;
  /**
   * A one-element Int32Array view of this buffer set to 1 asks a running search to stop and
   * return the best plan found so far with its proven gap (stopped early).
   */
  stopFlag?: SharedArrayBuffer;
  /** Exhaustive and auto: the saved search of this plan's problem, continued instead of started over. */
  resume?: SearchResume;
}

export interface HandMadeTask {
  kind: 'hand-made';
  snapshot: RoomSnapshot;
  /** Engine indices, in briefing order. */
  starters: number[];
}

export interface StoredCurve {
  byHop: number[];
  roomByHop: number[];
  complete: boolean;
  quantiles: ReachQuantileDto[];
}

export interface PlanComputation {
  methodUsed: PlanResult['method'] | 'hand-made';
  starters: number[];
  total: number;
  average: number;
  rank: number;
  lowerBound: number;
  gap: number;
  certified: boolean;
  coverSize: number;
  elapsedMs: number;
  notes: string[];
  warnings: PlanWarning[];
  /** Expected hops to hear per person (engine order). */
  h: number[];
  curve: StoredCurve;
  extras: ComputedExtras;
  absence: ComputedAbsence | null;
  /** Where the search stopped (or that it finished), for the next search of the same problem; null without a search. */
  resume: SearchResume | null;
}

/** Reading aids from the planner (engine indices; the service maps them to people). */
export interface ComputedExtras {
  bestSingle: { person: number; total: number } | null;
  gainShare: number | null;
  nodes: number | null;
  searchLeft: number | null;
  stopped: boolean;
  fewestForOneHop: number | null;
}

export interface ComputedAbsence {
  expectedTotal: number;
  nobodyChance: number;
  worstAbsence: { person: number; total: number } | null;
  standIns: { starter: number; person: number | null; total: number | null }[];
}

/** Fields the planner adds to its progress reports and results (optional: older engines leave them out). */
interface ProgressExtras {
  fraction?: number;
  bestTotal?: number;
  lowerBound?: number;
  gap?: number;
  nodes?: number;
}
interface ResultExtras {
  stopped?: boolean;
  nodes?: number;
  searchLeft?: number;
  bestSingle?: { person: number; total: number };
  fewestForOneHop?: number;
  gainShare?: number;
  noShow?: {
    expectedTotal: number;
    nobodyChance: number;
    worstAbsence: { person: number; total: number };
    standIns: readonly { starter: number; person: number; total: number }[];
  };
}

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** What the bar shows: the planner's own progress, in the API's shape. */
export function searchProgress(p: PlanProgress): PlanSearchProgress {
  const x = p as PlanProgress & ProgressExtras;
  const best = num(x.bestTotal);
  const lb = num(x.lowerBound);
  const gap = num(x.gap) ?? (best !== null && lb !== null && best > 0 ? Math.max(0, (best - lb) / best) : null);
  return { stage: p.stage, closed: num(x.fraction), bestTotal: best, lowerBound: lb, gapShare: gap, nodes: num(x.nodes) };
}

function extrasOf(r: PlanResult): { extras: ComputedExtras; absence: ComputedAbsence | null } {
  const x = r as PlanResult & ResultExtras;
  const ns = x.noShow;
  return {
    extras: {
      bestSingle: x.bestSingle ? { person: x.bestSingle.person, total: x.bestSingle.total } : null,
      gainShare: num(x.gainShare),
      nodes: num(x.nodes),
      searchLeft: num(x.searchLeft),
      stopped: x.stopped === true,
      fewestForOneHop: num(x.fewestForOneHop),
    },
    absence: ns
      ? {
          expectedTotal: ns.expectedTotal,
          nobodyChance: ns.nobodyChance,
          worstAbsence: ns.worstAbsence ? { person: ns.worstAbsence.person, total: ns.worstAbsence.total } : null,
          standIns: ns.standIns.map((s) => ({ starter: s.starter, person: num(s.person), total: num(s.total) })),
        }
      : null,
  };
}

export interface ComputeFailure {
  error: { code: ErrorCode; message: string; detail?: Record<string, unknown> };
}

export type ComputeOutcome<T> = { ok: T } | ComputeFailure;

export const REACH_QUANTILES = [0.5, 0.9, 0.99, 1] as const;

export function prepared(snapshot: RoomSnapshot): PreparedRoom {
  return prepareRoom(snapshot.graph, { laziness: snapshot.settings.laziness, mixing: snapshot.settings.mixing });
}

/** The reach curve stored with a plan: until 99.99% have heard (at most 5000 hops). */
export function curveFor(room: PreparedRoom, starters: readonly number[], minutesPerHop: number): StoredCurve {
  const c = reachCurve(room, starters, { tolerance: 1e-4, maxHops: 5000, quantiles: [...REACH_QUANTILES], minutesPerHop });
  return {
    byHop: Array.from(c.shareReached),
    roomByHop: Array.from(c.roomShare),
    complete: c.complete,
    quantiles: c.quantiles.map((q) => ({ share: q.share, hop: q.hop, minutes: q.minutes })),
  };
}

/**
 * The planner on the task's snapshot. The branch and bound runs on `task.threads` threads
 * (planWithWorkers); a raised stop flag ends it with the best plan found so far.
 */
export async function runPlanner(
  task: PlannerTask,
  onProgress?: (fraction: number, search: PlanSearchProgress) => void,
): Promise<PlanComputation> {
  const room = prepared(task.snapshot);
  const started = performance.now();
  const limitMs = task.timeLimitMs ?? 10_000;
  const flag = task.stopFlag ? new Int32Array(task.stopFlag) : null;
  let last = 0;
  const options: PlanOptions = {
    k: task.k,
    method: task.method,
    ...(task.nu !== undefined ? { nu: task.nu } : {}),
    timeLimitMs: limitMs,
    mustInclude: task.mustInclude,
    exclude: task.exclude,
    ...(task.noShow ? { noShow: task.noShow } : {}),
    onProgress: (p) => {
      // A search ends when it has settled every group or at its time limit, whichever comes first:
      // its bar is the larger of the two shares (so it reaches the end exactly when the job does).
      // Other methods: their stage's own count. The bar never moves backwards.
      const search = searchProgress(p);
      const byStage = p.of > 0 ? p.done / p.of : 0;
      const byTime = (performance.now() - started) / limitMs;
      const timed = task.method === 'exhaustive' || task.method === 'auto';
      const own = timed ? Math.max(search.closed ?? 0, byTime) : (search.closed ?? byStage);
      const f = Math.min(0.99, Math.max(last, own));
      if (f > last + 0.002 || search.bestTotal !== null) {
        last = f;
        onProgress?.(f, search);
      }
    },
    ...(flag ? { shouldStop: () => Atomics.load(flag, 0) === 1 } : {}),
    ...(task.resume ? { resume: task.resume } : {}),
  };
  const threads = task.threads ?? 2;
  const r = threads > 1 ? await planWithWorkers(room, options, threads) : plan(room, options);
  const reach = exactReach(room, r.starters);
  return {
    methodUsed: r.method,
    starters: r.starters,
    total: r.total,
    average: r.average,
    rank: r.rank,
    lowerBound: r.lowerBound,
    gap: r.gap,
    certified: r.certified,
    coverSize: r.coverSize,
    elapsedMs: performance.now() - started,
    notes: r.notes,
    warnings: apiWarnings(r.warnings),
    h: Array.from(reach.h),
    curve: curveFor(room, r.starters, task.snapshot.settings.minutesPerHop),
    ...extrasOf(r),
    resume: r.resume ?? null,
  };
}

/**
 * A hand-made plan gets the same scores: its total and quality rank from the planner with every
 * starter required (which then returns exactly that set), and its gap to best from the
 * unconstrained greedy plan's proven lower bound of the same size (identity 6 of engine.md).
 */
export function scoreHandMade(task: HandMadeTask): ComputeOutcome<PlanComputation> {
  const room = prepared(task.snapshot);
  const started = performance.now();
  const reach = exactReach(room, task.starters);
  if (reach.unreachable.length > 0) {
    const people = reach.unreachable.map((u) => ({
      personId: task.snapshot.personIds[u.index],
      name: task.snapshot.names[u.index],
      reason: u.reason,
    }));
    const named = people
      .slice(0, 5)
      .map((p) => p.name)
      .join(', ');
    return {
      error: {
        code: 'unreachable_people',
        message:
          `With these starters ${people.length} ${people.length === 1 ? 'person' : 'people'} can never hear (${named}${people.length > 5 ? ', ...' : ''}): ` +
          'add a starter in each part of the room that questions cannot leave.',
        detail: { people },
      },
    };
  }
  const k = task.starters.length;
  const fixed = plan(room, { k, method: 'greedy', mustInclude: task.starters });
  const free = plan(room, { k, method: 'greedy' });
  const lowerBound = Math.min(free.lowerBound, reach.total);
  const gap = Math.max(0, reach.total - lowerBound);
  return {
    ok: {
      methodUsed: 'hand-made',
      starters: [...task.starters],
      total: reach.total,
      average: reach.average,
      rank: fixed.rank,
      lowerBound,
      gap,
      certified: gap <= 1e-9 * Math.abs(reach.total),
      coverSize: fixed.coverSize,
      elapsedMs: performance.now() - started,
      notes: [],
      warnings: apiWarnings(fixed.warnings),
      h: Array.from(reach.h),
      curve: curveFor(room, task.starters, task.snapshot.settings.minutesPerHop),
      extras: { ...extrasOf(free).extras, gainShare: null, nodes: null, searchLeft: null, stopped: false },
      absence: null,
      resume: null,
    },
  };
}

export function asFailure(e: unknown): ComputeFailure {
  if (isEngineError(e)) return { error: { code: engineCode(e.code), message: e.message, detail: e.detail } };
  throw e;
}
