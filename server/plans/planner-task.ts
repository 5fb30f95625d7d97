/** The planner task of a stored plan row (its snapshot, budget and constraints), and the hard stop of its worker. */
import { PLAN_LIMITS } from '../../shared/api/plans';
import type { PlanMethodChoice } from '../../shared/api/plans';
import type { PlannerTask, RoomSnapshot } from './compute';
import type { PlanRow } from './store';
import { indicesOfPeople } from './validate';

export function plannerTask(
  snapshot: RoomSnapshot,
  row: Pick<PlanRow, 'k' | 'methodRequested' | 'nu' | 'timeLimitSeconds' | 'mustBrief' | 'cannotBrief' | 'noShow'>,
): PlannerTask {
  return {
    kind: 'planner',
    snapshot,
    k: row.k,
    method: row.methodRequested as PlanMethodChoice,
    ...(row.noShow ? { noShow: row.noShow } : {}),
    ...(row.nu !== null ? { nu: row.nu } : {}),
    ...(row.timeLimitSeconds !== null ? { timeLimitMs: row.timeLimitSeconds * 1000 } : {}),
    mustInclude: indicesOfPeople(snapshot, row.mustBrief, 'People who must be briefed'),
    exclude: indicesOfPeople(snapshot, row.cannotBrief, 'People who cannot be briefed'),
  };
}

/** Hard stop for a worker: the engine's own budget plus a generous margin. */
export function hardLimitMs(timeLimitSeconds: number | null): number {
  return ((timeLimitSeconds ?? PLAN_LIMITS.timeLimitSeconds.default) + 60) * 1000;
}
