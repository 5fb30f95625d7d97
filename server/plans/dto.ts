/** Plan rows -> API shapes (shared/api/plans.ts). */
import type { PlanDetail, PlanMethodChoice, PlanMethodUsed, PlanSummary, ReachCurveDto } from '../../shared/api/plans';
import type { RoomSnapshot, StoredCurve } from './compute';
import { sharedScores } from './bounds';
import type { BoundRow, PlanListRow, PlanRow } from './store';
import { personAt } from './snapshot';
import { storedWarnings } from './warnings';

export interface StoredPlanResults {
  /** Expected hops per person, engine order (null: cannot be reached). */
  h: (number | null)[];
  curve: StoredCurve;
}

const finite = (v: number | null | undefined): number | null => (v === null || v === undefined || !Number.isFinite(v) ? null : v);

/** `bound`: the row of the plan's key (room version, k, constraints), whose proven bound all its plans share. */
export function planSummary(row: PlanListRow, currentRoomVersion: number, bound?: BoundRow): PlanSummary {
  const mph = row.settings.minutesPerHop;
  const total = finite(row.total);
  const shared = sharedScores(row, bound);
  return {
    id: row.id,
    roomId: row.roomId,
    name: row.name,
    kind: row.kind,
    status: row.status,
    k: row.k,
    methodRequested: row.methodRequested as PlanMethodChoice | 'hand-made',
    methodUsed: (row.methodUsed as PlanMethodUsed | null) ?? null,
    nu: row.nu,
    timeLimitSeconds: row.timeLimitSeconds,
    mustBrief: row.mustBrief,
    cannotBrief: row.cannotBrief,
    starters: (row.starters ?? []).map((s, i) => ({ personId: s.personId, name: s.name, group: s.group, order: i + 1 })),
    total,
    average: finite(row.average),
    averageMinutes: row.average === null ? null : row.average * mph,
    qualityRank: finite(row.qualityRank),
    ...shared,
    noShow: row.noShow && row.noShow > 0 ? row.noShow : null,
    absence: row.absence ?? null,
    extras: row.extras ?? null,
    coverSize: row.coverSize,
    elapsedMs: row.elapsedMs,
    people: row.people,
    roomVersion: row.roomVersion,
    currentRoomVersion,
    stale: currentRoomVersion !== row.roomVersion,
    settings: row.settings,
    chosen: row.chosen,
    notes: row.notes,
    warnings: storedWarnings(row.warnings),
    jobId: row.jobId,
    error: row.error,
    createdBy: row.createdByName,
    createdAt: row.createdAt.toISOString(),
  };
}

export function reachDto(curve: StoredCurve, minutesPerHop: number): ReachCurveDto {
  return {
    byHop: curve.byHop,
    roomByHop: curve.roomByHop,
    byMinute: curve.byHop.map((share, t) => ({ minutes: t * minutesPerHop, share })),
    minutesPerHop,
    complete: curve.complete,
    quantiles: curve.quantiles,
  };
}

export function parseSnapshot(row: Pick<PlanRow, 'snapshot'>): RoomSnapshot {
  return JSON.parse(row.snapshot) as RoomSnapshot;
}

export function parseResults(row: Pick<PlanRow, 'results'>): StoredPlanResults | null {
  return row.results ? (JSON.parse(row.results) as StoredPlanResults) : null;
}

export function planDetail(row: PlanRow & { createdByName: string }, currentRoomVersion: number, bound?: BoundRow): PlanDetail {
  const summary = planSummary(row, currentRoomVersion, bound);
  const results = parseResults(row);
  if (!results || row.status !== 'ready') return { ...summary, perPerson: [], reach: null };
  const snapshot = parseSnapshot(row);
  const mph = row.settings.minutesPerHop;
  const order = new Map((row.starters ?? []).map((s, i) => [s.personId, i + 1]));
  const perPerson = snapshot.personIds.map((personId, i) => {
    const h = results.h[i] ?? Infinity;
    const { name, group } = personAt(snapshot, i);
    return {
      personId,
      name,
      group,
      starter: order.has(personId),
      order: order.get(personId) ?? null,
      expectedHops: h,
      expectedMinutes: h * mph,
    };
  });
  return { ...summary, perPerson, reach: reachDto(results.curve, mph) };
}
