// Shared by the plan, plan result and rehearsal page specs (a .spec file, so the app build never sees it).
import type { PlanDetail, PlanSummary } from '../../../shared/api/plans';

/**
 * A finished plan of room 5 (six people, Marek and Wren briefed) as the server sends it, every
 * field set; `over` replaces any of them. Specs override only what they are about.
 */
export function planSummary(over: Partial<PlanSummary> = {}): PlanSummary {
  return {
    id: 1,
    roomId: 5,
    name: 'Plan 1',
    kind: 'computed',
    status: 'ready',
    k: 2,
    methodRequested: 'auto',
    methodUsed: 'greedy',
    nu: null,
    timeLimitSeconds: null,
    mustBrief: [],
    cannotBrief: [],
    starters: [
      { personId: 2, name: 'Marek', group: null, order: 1 },
      { personId: 5, name: 'Wren', group: null, order: 2 },
    ],
    total: 6,
    average: 1.5,
    averageMinutes: 15,
    qualityRank: null,
    lowerBound: null,
    gap: null,
    gapShare: null,
    certified: false,
    boundSource: null,
    bestKnownTotal: 6,
    optimumKnown: false,
    noShow: null,
    absence: null,
    extras: null,
    coverSize: null,
    elapsedMs: 4,
    people: 6,
    roomVersion: 3,
    currentRoomVersion: 3,
    stale: false,
    settings: { directed: false, minutesPerHop: 10, laziness: 0, mixing: 0 },
    chosen: false,
    notes: [],
    warnings: [],
    jobId: null,
    error: null,
    createdBy: 'Owner',
    createdAt: '2026-11-30T09:10:00Z',
    ...over,
  };
}

/** The same plan with its per-person table (empty unless given) and no reach curve. */
export function planDetail(over: Partial<PlanDetail> = {}): PlanDetail {
  const { perPerson = [], reach = null, ...summary } = over;
  return { ...planSummary(summary), perPerson, reach };
}
