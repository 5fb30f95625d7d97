/**
 * Shared proven bounds: every computation records what it proved under its key (room version,
 * k, constraints), and every plan of the key reads the best of them. So a widened-greedy plan
 * whose total equals an optimum certified by an exhaustive search is shown as proven best, and a
 * lower bound proven by one search tightens the gap of every other plan of the same problem.
 *
 * Why sharing is sound: a lower bound L for a key is a statement about the problem (no k-set that
 * satisfies the constraints has total below L), not about the plan that proved it. Plans of the
 * key share the room version (same people, ties and walk settings), k and constraints, so L holds
 * for each of them; gap = total - max(L over the key) is then a proven gap for each.
 */
import { coverBound } from '../../shared/engine/index';
import type { BoundSource, KSweepResult } from '../../shared/api/plans';
import { db, type Conn } from '../db';
import { boundKey, keyText, type BoundKey } from './bound-key';
import type { PlanComputation } from './compute';
import type { BoundRow, PlanListRow } from './store';
import * as store from './store';
import { itemAt } from '../../shared/checked';

/** Relative tolerance under which two totals are the same number (solver rounding). */
export const SAME_TOTAL = 1e-9;

type KeyedRow = Pick<PlanListRow, 'roomId' | 'roomVersion' | 'k' | 'mustBrief' | 'cannotBrief' | 'noShow'>;

export function keyOfPlan(row: KeyedRow): BoundKey {
  return boundKey({
    roomId: row.roomId,
    roomVersion: row.roomVersion,
    k: row.k,
    mustBrief: row.mustBrief,
    cannotBrief: row.cannotBrief,
    noShow: row.noShow ?? null,
  });
}

/** Which argument proved a computation's lower bound (shown in the gap's tooltip). */
export function sourceOf(
  c: Pick<PlanComputation, 'methodUsed' | 'lowerBound' | 'certified' | 'total'>,
  n: number,
  k: number,
  scale: number,
): BoundSource {
  if (c.methodUsed === 'exhaustive') return 'search';
  if (c.certified && k === 1) return 'single';
  return c.lowerBound > coverBound(n, k, scale) * (1 + SAME_TOTAL) ? 'supermodular' : 'cover';
}

/** Records what a finished computation proved and achieved under the plan's key. */
export async function recordComputation(
  row: KeyedRow & { people: number; settings: { laziness: number } },
  c: PlanComputation,
  personIds: readonly number[],
  tx: Conn = db,
): Promise<void> {
  if (!Number.isFinite(c.total)) return;
  const scale = 1 / (1 - row.settings.laziness);
  await store.mergeBound(
    keyOfPlan(row),
    {
      lowerBound: Number.isFinite(c.lowerBound) ? Math.min(c.lowerBound, c.total) : coverBound(row.people, row.k, scale),
      lowerSource: sourceOf(c, row.people, row.k, scale),
      bestTotal: c.total,
      bestStarters: c.starters.map((i) => itemAt(personIds, i, 'starter person id')),
    },
    tx,
  );
}

/** Keeps where the computation's search stopped (or that it finished) for the next search of the key. */
export async function recordSearch(row: KeyedRow, c: Pick<PlanComputation, 'resume'>, tx: Conn = db): Promise<void> {
  if (c.resume) await store.saveSearchState(keyOfPlan(row), c.resume, tx);
}

/** The saved search of a plan's key, for a search that continues it (only the plain objective has one). */
export async function savedSearchOf(row: KeyedRow): Promise<BoundRow['searchState']> {
  if (row.noShow) return null;
  return (await boundOf(row))?.searchState ?? null;
}

/** A proven lower bound without a plan (e.g. from a k-sweep), for the unconstrained key of k. */
export async function recordLowerBound(key: BoundKey, lowerBound: number, source: BoundSource): Promise<void> {
  if (Number.isFinite(lowerBound) && lowerBound > 0)
    await store.mergeBound(key, { lowerBound, lowerSource: source, bestTotal: null, bestStarters: null });
}

/** A k-sweep's proven lower bounds (room averages) become bounds of the unconstrained key of each k. */
export async function recordSweepBounds(roomId: number, roomVersion: number, sweep: KSweepResult): Promise<void> {
  for (const p of sweep.points) {
    if (p.lowerBound === null) continue;
    const key = boundKey({ roomId, roomVersion, k: p.k, mustBrief: [], cannotBrief: [], noShow: null });
    await recordLowerBound(key, p.lowerBound * (sweep.people - p.k), 'supermodular');
  }
}

/** The key's bound row of each plan, looked up once per distinct key. */
export async function boundsFor(rows: readonly KeyedRow[]): Promise<Map<string, BoundRow>> {
  const out = new Map<string, BoundRow>();
  const rooms = [...new Set(rows.map((r) => r.roomId))];
  for (const roomId of rooms) {
    for (const b of await store.boundsOfRoom(roomId)) out.set(keyText(b), b);
  }
  return out;
}

export async function boundOf(row: KeyedRow): Promise<BoundRow | undefined> {
  return store.findBound(keyOfPlan(row));
}

export function boundForRow(map: Map<string, BoundRow>, row: KeyedRow): BoundRow | undefined {
  return map.get(keyText(keyOfPlan(row)));
}

export interface SharedScores {
  lowerBound: number | null;
  gap: number | null;
  gapShare: number | null;
  certified: boolean;
  boundSource: BoundSource | null;
  bestKnownTotal: number | null;
  optimumKnown: boolean;
}

/** A plan's gap to best from its own bound and its key's shared one. */
export function sharedScores(
  row: Pick<PlanListRow, 'total' | 'lowerBound' | 'certified' | 'methodUsed' | 'status'>,
  bound: Pick<BoundRow, 'lowerBound' | 'lowerSource' | 'bestTotal'> | undefined,
): SharedScores {
  const total = row.total !== null && Number.isFinite(row.total) ? row.total : null;
  const own = row.lowerBound !== null && Number.isFinite(row.lowerBound) ? row.lowerBound : null;
  const shared = bound && Number.isFinite(bound.lowerBound) ? bound.lowerBound : null;
  const bestKnown = bound?.bestTotal ?? null;
  const optimumKnown = shared !== null && bestKnown !== null && bestKnown - shared <= SAME_TOTAL * Math.abs(bestKnown);
  if (total === null || row.status !== 'ready') {
    return { lowerBound: own, gap: null, gapShare: null, certified: false, boundSource: null, bestKnownTotal: bestKnown, optimumKnown };
  }
  const useShared = shared !== null && (own === null || shared >= own);
  let lb = useShared ? shared : own;
  if (lb !== null && lb > total) lb = total; // a proven bound never exceeds an achieved total
  const certified = row.certified || (lb !== null && total - lb <= SAME_TOTAL * Math.abs(total));
  const gap = lb === null ? null : certified ? 0 : Math.max(0, total - lb);
  const ownSource: BoundSource | null = row.methodUsed === 'exhaustive' ? 'search' : own !== null ? 'cover' : null;
  return {
    lowerBound: certified ? total : lb,
    gap,
    gapShare: gap === null || total === 0 ? null : gap / total,
    certified,
    boundSource: useShared ? ((bound!.lowerSource as BoundSource) ?? null) : ownSource,
    bestKnownTotal: bestKnown,
    optimumKnown,
  };
}
