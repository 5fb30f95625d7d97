/**
 * Piscina worker of the plan pool: planners (their branch and bound on worker threads of its own),
 * hand-made scoring and k-sweeps off the request thread.
 */
import type { MessagePort } from 'node:worker_threads';
import {
  asFailure,
  runPlanner,
  scoreHandMade,
  type ComputeOutcome,
  type HandMadeTask,
  type PlanComputation,
  type PlannerTask,
} from '../plans/compute';
import { runSweep, type SweepTask } from '../plans/sweep';
import { summarize, type SummaryTask } from '../rooms/summary';
import type { KSweepResult } from '../../shared/api/plans';
import type { RoomSummary } from '../../shared/api/rooms';

export type PlanPoolTask = (PlannerTask | HandMadeTask | SweepTask | SummaryTask) & { port?: MessagePort };
export type PlanPoolResult = ComputeOutcome<PlanComputation> | ComputeOutcome<KSweepResult> | ComputeOutcome<RoomSummary>;

export default async function runPlanTask(task: PlanPoolTask): Promise<PlanPoolResult> {
  try {
    switch (task.kind) {
      case 'planner':
        return { ok: await runPlanner(task, (fraction, search) => task.port?.postMessage({ fraction, search })) };
      case 'hand-made':
        return scoreHandMade(task);
      case 'summary':
        return { ok: summarize(task.loaded) };
      default:
        return { ok: runSweep(task) };
    }
  } catch (e) {
    return asFailure(e);
  } finally {
    task.port?.close();
  }
}
