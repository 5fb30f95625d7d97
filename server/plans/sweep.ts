/**
 * The k-sweep: room average for k = 1..K under greedy, widened greedy, swap polish, a most-ties
 * baseline (the k people with the largest total tie strength, a common-practice heuristic) and a
 * seeded random baseline (mean over RANDOM_DRAWS draws of k people). Runs in the plan worker.
 */
import { exactReach, isEngineError, plan, runGenerator, type PreparedRoom } from '../../shared/engine/index';
import type { KSweepPoint, KSweepResult } from '../../shared/api/plans';
import { firstOf, itemAt } from '../../shared/checked';
import { prepared, type RoomSnapshot } from './compute';

export const RANDOM_DRAWS = 20;
const NO_PLAN_NOTE = 'No plan exists where k is below the number of closed groups (each needs its own starter).';
const PARTIAL_RANDOM_NOTE = 'partial-random';

/** Joins the parts of a sweep computed in parallel. */
export function mergeSweeps(parts: KSweepResult[], elapsedMs: number): KSweepResult {
  const points = parts.flatMap((p) => p.points).sort((a, b) => a.k - b.k);
  const notes = new Set<string>();
  let partial = 0;
  for (const n of parts.flatMap((p) => p.notes)) {
    if (n.startsWith(`${PARTIAL_RANDOM_NOTE}:`)) partial += Number(n.slice(PARTIAL_RANDOM_NOTE.length + 1));
    else notes.add(n);
  }
  if (partial > 0)
    notes.add(`For ${partial} values of k some random draws left people who can never hear; the random baseline averages the others.`);
  return { ...firstOf(parts, 'k-sweep parts'), points, notes: [...notes], elapsedMs };
}

export interface SweepTask {
  kind: 'sweep';
  snapshot: RoomSnapshot;
  maxK: number;
  /** The values of k this task computes (a sweep is split over the pool's threads). */
  ks: number[];
  seed: string;
}

function averageOrNull(room: PreparedRoom, starters: number[]): number | null {
  const r = exactReach(room, starters);
  return Number.isFinite(r.average) ? r.average : null;
}

function planned(room: PreparedRoom, k: number, method: 'greedy' | 'widened' | 'swap'): { average: number; lowerBound: number } | null {
  try {
    const r = plan(room, { k, method });
    return { average: r.average, lowerBound: r.lowerBound / (room.n - k) };
  } catch (e) {
    if (isEngineError(e) && e.code === 'K_BELOW_CLOSED_GROUPS') return null;
    throw e;
  }
}

/** Total tie strength per person, both directions (ties by input order). */
function mostTies(room: PreparedRoom): number[] {
  const { csr, n } = room;
  const s = Float64Array.from(csr.outStrength);
  const strength = (i: number) => itemAt(s, i, 'tie strength');
  if (room.directed) csr.col.forEach((to, e) => (s[to] = strength(to) + itemAt(csr.weight, e, 'tie weight')));
  return Array.from({ length: n }, (_, i) => i).sort((a, b) => strength(b) - strength(a) || a - b);
}

function randomAverage(room: PreparedRoom, k: number, seed: string): { mean: number | null; finite: number } {
  let sum = 0;
  let finite = 0;
  for (let d = 0; d < RANDOM_DRAWS; d++) {
    const rand = runGenerator(`sweep/${seed}/${k}`, d);
    // Partial Fisher-Yates: the first k of a random permutation.
    const order = Array.from({ length: room.n }, (_, i) => i);
    for (let i = 0; i < k; i++) {
      const j = i + Math.floor(rand() * (room.n - i));
      [order[i], order[j]] = [itemAt(order, j, 'draw order'), itemAt(order, i, 'draw order')];
    }
    const a = averageOrNull(room, order.slice(0, k));
    if (a !== null) {
      sum += a;
      finite++;
    }
  }
  return { mean: finite > 0 ? sum / finite : null, finite };
}

export function runSweep(task: SweepTask): KSweepResult {
  const started = performance.now();
  const room = prepared(task.snapshot);
  const ranked = mostTies(room);
  const points: KSweepPoint[] = [];
  const notes: string[] = [];
  let partialRandom = 0;
  for (const k of task.ks) {
    const g = planned(room, k, 'greedy');
    const w = planned(room, k, 'widened');
    const s = planned(room, k, 'swap');
    const rnd = randomAverage(room, k, task.seed);
    if (rnd.finite < RANDOM_DRAWS) partialRandom++;
    points.push({
      k,
      greedy: g?.average ?? null,
      widened: w?.average ?? null,
      swap: s?.average ?? null,
      mostTies: averageOrNull(room, ranked.slice(0, k)),
      random: rnd.mean,
      lowerBound: g ? Math.max(g.lowerBound, w?.lowerBound ?? 0, s?.lowerBound ?? 0) : null,
    });
  }
  if (points.some((p) => p.greedy === null)) notes.push(NO_PLAN_NOTE);
  if (partialRandom > 0) notes.push(`${PARTIAL_RANDOM_NOTE}:${partialRandom}`);
  return {
    roomVersion: task.snapshot.version,
    people: room.n,
    maxK: task.maxK,
    seed: task.seed,
    minutesPerHop: task.snapshot.settings.minutesPerHop,
    points,
    elapsedMs: performance.now() - started,
    notes,
  };
}
