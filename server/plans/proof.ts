/**
 * Proving in the background: after an automatic plan is shown with a gap above 0, its search goes
 * on as a low-priority job of kind 'proof' (both threads, config.PROOF_SECONDS, cancellable), from
 * where the key's saved search stopped. What it proves tightens the bound every plan of the key
 * shares; a faster set it finds becomes a plan of its own, offered on the page, while the shown
 * plan stays the one the user made. At most one proof per key is open at a time, and it is only
 * queued while the user has room under their job quota.
 */
import type { PlanDetail } from '../../shared/api/plans';
import { PLAN_LIMITS } from '../../shared/api/plans';
import { config } from '../config';
import type { Tx } from '../db';
import { runInPlanPool } from '../jobs/pools';
import { JobFailure, jobRunner, type JobHandler } from '../jobs/runner';
import { findJob, insertJob, openJobsOf, openLoadOf, plansStoredBy } from '../jobs/service';
import { keyText } from './bound-key';
import { keyOfPlan, recordComputation, recordSearch, SAME_TOTAL, savedSearchOf } from './bounds';
import type { ComputeOutcome, PlanComputation } from './compute';
import { parseSnapshot } from './dto';
import { plannerTask } from './planner-task';
import { resultColumns } from './result-columns';
import type { BoundRow, PlanRow } from './store';
import * as store from './store';

type KeyCols = Parameters<typeof keyOfPlan>[0];
const sameKey = (a: KeyCols, b: KeyCols) => keyText(keyOfPlan(a)) === keyText(keyOfPlan(b));

/**
 * Inside the transaction that stores an automatic plan (its bound and saved search merged first):
 * adds a proof job row when the plan is not proven best, its search left something open, the
 * key has no open proof and the user has room under the quota. Returns the job id to queue once
 * the transaction commits, or null.
 */
export async function addProofRow(row: PlanRow, c: PlanComputation, userId: number, tx: Tx): Promise<number | null> {
  const eligible =
    config.PROOF_SECONDS > 0 &&
    row.kind === 'computed' &&
    row.methodRequested === 'auto' &&
    !row.noShow &&
    row.people <= PLAN_LIMITS.exhaustiveMaxPeople &&
    c.resume !== null &&
    !c.certified;
  if (!eligible) return null;
  const key = keyOfPlan(row);
  const bound = await store.lockBound(key, tx);
  if (!bound || bound.lowerBound >= c.total * (1 - SAME_TOTAL)) return null;
  if ((await openLoadOf(userId, true, tx)).jobs >= config.MAX_OPEN_JOBS_PER_USER) return null;
  if ((await store.openProofsOfRoom(row.roomId, tx)).some((p) => sameKey(p.plan, row))) return null;
  return insertJob({ userId, roomId: row.roomId, kind: 'proof', planId: row.id }, tx);
}

/** Puts a proof row added by addProofRow on the queue (after its transaction committed). */
export async function queueProof(jobId: number | null): Promise<void> {
  if (jobId === null) return;
  const job = await findJob(jobId);
  if (job) await jobRunner.enqueue(job);
}

/** The user asked for a plan: their running proofs stop and keep what they proved (the saved search). */
export async function yieldProofs(userId: number): Promise<void> {
  for (const job of await openJobsOf(userId)) if (job.kind === 'proof' && job.status === 'running') await jobRunner.stopEarly(job);
}

const FOUND = ' · faster, found in the background';

/** A faster set found in the background, as a plan of its own (when the user may keep one more plan). */
async function fasterPlan(row: PlanRow, c: PlanComputation, tx: Tx): Promise<void> {
  if (row.total === null || !(c.total < row.total * (1 - SAME_TOTAL))) return;
  const rows = await store.readyPlansOfRoom(row.roomId);
  if (rows.some((p) => sameKey(p, row) && p.total !== null && p.total <= c.total * (1 + SAME_TOTAL))) return;
  if ((await plansStoredBy(row.createdBy)) >= config.MAX_PLANS_PER_USER) return;
  const snapshot = parseSnapshot(row);
  await store.insertPlan(
    {
      roomId: row.roomId,
      createdBy: row.createdBy,
      name: row.name.slice(0, 120 - FOUND.length) + FOUND,
      kind: 'computed',
      status: 'computing',
      k: row.k,
      methodRequested: 'exhaustive',
      nu: null,
      timeLimitSeconds: config.PROOF_SECONDS,
      mustBrief: row.mustBrief,
      cannotBrief: row.cannotBrief,
      noShow: null,
      people: row.people,
      roomVersion: row.roomVersion,
      settings: row.settings,
      snapshot: row.snapshot,
      notes: [],
      warnings: [],
      ...resultColumns(snapshot, c),
    },
    tx,
  );
}

export const proofJobHandler: JobHandler = {
  async run(job, ctx) {
    const row = await store.findPlan(job.planId!);
    if (!row) throw new JobFailure('The plan was deleted.');
    const snapshot = parseSnapshot(row);
    const resume = await savedSearchOf(row);
    const task = {
      ...plannerTask(snapshot, row),
      method: 'exhaustive' as const,
      timeLimitMs: config.PROOF_SECONDS * 1000,
      ...(resume ? { resume } : {}),
    };
    const outcome = (await runInPlanPool(task, {
      signal: ctx.signal,
      stopEarly: ctx.stopEarly,
      hardLimitMs: (config.PROOF_SECONDS + 60) * 1000,
      onProgress: (f, search) => ctx.progress(f, undefined, undefined, search ? { search } : undefined),
    })) as ComputeOutcome<PlanComputation>;
    if ('error' in outcome) throw new JobFailure(outcome.error.message);
    const c = outcome.ok;
    return async (tx) => {
      await recordComputation(row, c, snapshot.personIds, tx);
      await recordSearch(row, c, tx);
      await fasterPlan(row, c, tx);
    };
  },
};

/** What the plan page shows about proving: the open proof of the key, a faster plan of it, the searches so far. */
export async function proofFacts(
  row: PlanRow,
  bound: BoundRow | undefined,
): Promise<Pick<PlanDetail, 'proving' | 'fasterPlanId' | 'searchSoFar'>> {
  if (row.status !== 'ready' || row.kind !== 'computed') return { proving: null, fasterPlanId: null, searchSoFar: null };
  const open = (await store.openProofsOfRoom(row.roomId)).find((p) => sameKey(p.plan, row));
  let faster: { id: number; total: number } | null = null;
  if (row.total !== null)
    for (const p of await store.readyPlansOfRoom(row.roomId))
      if (
        p.id !== row.id &&
        sameKey(p, row) &&
        p.total !== null &&
        p.total < row.total * (1 - SAME_TOTAL) &&
        (!faster || p.total < faster.total)
      )
        faster = { id: p.id, total: p.total };
  const s = bound?.searchState;
  return {
    proving: open ? { jobId: open.job.id, status: open.job.status, progress: open.job.progress } : null,
    fasterPlanId: faster?.id ?? null,
    searchSoFar: s
      ? {
          nodes: s.nodes,
          runs: s.runs,
          left: Math.min(1, Math.max(0, 1 - s.closed / Math.max(1, s.space))),
          finished: s.open.length === 0 && s.from === s.pieces,
        }
      : null,
  };
}
