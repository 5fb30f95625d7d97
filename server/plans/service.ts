/**
 * Plans: create (computed now, or as a background job), read, list, rename, choose, delete,
 * compare, k-sweep. Heavy work always goes to the plan worker pool; small plans are awaited in
 * the request, large ones (and exhaustive / auto) are queued as jobs with progress.
 */
import type { CreatePlanRequest, KSweepResult, PlanComparison, PlanDetail, PlanStarted, PlanSummary } from '../../shared/api/plans';
import { PLAN_LIMITS } from '../../shared/api/plans';
import { HttpError, notFound } from '../core/http-error';
import { logger } from '../core/logging';
import { db } from '../db';
import { roomAccess } from '../jobs/access';
import { idOf } from '../core/ids';
import { jobDto } from '../jobs/dto';
import { onJobEvent } from '../jobs/events';
import { runInPlanPool, TimeLimitError } from '../jobs/pools';
import { checkJobQuota, checkPlanQuota } from '../jobs/quotas';
import { JobFailure, jobRunner, type JobHandler } from '../jobs/runner';
import { findJob, insertJob } from '../jobs/service';
import { loadRoomGraph, type RoomNeed } from '../rooms/access';
import type { SignedInUser } from '../types';
import { prepared, type ComputeOutcome, type PlanComputation, type RoomSnapshot } from './compute';
import { hardLimitMs, plannerTask } from './planner-task';
import { parseResults, parseSnapshot, planDetail, planSummary } from './dto';
import { resultColumns } from './result-columns';
import { placement } from './where-it-runs';
import type { NewPlan, PlanRow } from './store';
import * as store from './store';

/** Plan rows as other features (rehearsals, workshops) read them. */
export { findPlan, roomVersion } from './store';
import { config } from '../config';
import { boundForRow, boundOf, boundsFor, recordComputation, recordSearch, recordSweepBounds, savedSearchOf } from './bounds';
import { addProofRow, proofFacts, queueProof, yieldProofs } from './proof';
import { mergeSweeps } from './sweep';
import { personAt } from './snapshot';
import { checkHandMade, checkPlannerRequest, indicesOfPeople, planError } from './validate';

export type LoadedPlan = PlanRow & { createdByName: string };

export async function loadPlanFor(user: SignedInUser | undefined, raw: unknown, need: RoomNeed): Promise<LoadedPlan> {
  const plan = await store.findPlan(idOf(raw, 'That plan'));
  if (!plan) throw notFound('That plan');
  await roomAccess(user, plan.roomId, need, 'That plan');
  return plan;
}

async function snapshotOf(roomId: number): Promise<RoomSnapshot> {
  const r = await loadRoomGraph(roomId);
  return { graph: r.graph, personIds: r.personIds, names: r.names, settings: r.settings, version: r.version };
}

function unwrap(outcome: ComputeOutcome<PlanComputation>): PlanComputation {
  if ('error' in outcome) throw planError(outcome.error.code, outcome.error.message, outcome.error.detail);
  return outcome.ok;
}

/** An automatic plan the caller did not ask to run in the background, of a room awaited inline otherwise. */
function answersInline(body: CreatePlanRequest, n: number): boolean {
  return !body.background && (body.method ?? 'auto') === 'auto' && n <= PLAN_LIMITS.inlineMaxPeople;
}

/** How a job ended, if it ends within `ms` (listening starts before the job is queued); null otherwise. */
function jobEnd(jobId: number, ms: number): Promise<string | null> {
  return new Promise((resolve) => {
    const stop = onJobEvent(jobId, (e) => {
      if (e.type === 'queued' || e.type === 'started' || e.type === 'progress') return;
      settle(e.type);
    });
    const timer = setTimeout(() => settle(null), ms);
    function settle(v: string | null) {
      clearTimeout(timer);
      stop();
      resolve(v);
    }
  });
}

export async function createPlan(
  user: SignedInUser,
  roomId: number,
  body: CreatePlanRequest,
): Promise<{ status: 201; body: PlanDetail } | { status: 202; body: PlanStarted }> {
  await roomAccess(user, roomId, 'edit', 'That room');
  const snapshot = await snapshotOf(roomId);
  const room = prepared(snapshot);
  const starters = checkedRequest(room, snapshot, body);
  await checkPlanQuota(user.id);
  const base = newPlanRow(user.id, roomId, snapshot, body, starters);
  const mustCount = base.mustBrief?.length ?? 0;
  const excludeCount = base.cannotBrief?.length ?? 0;
  const where = placement(body, room.n, mustCount, excludeCount);
  if (where === 'background') return startInBackground(user.id, base, body, room.n);
  if (where === 'search-now') return searchNow(user.id, base, snapshot);
  const task =
    starters !== null
      ? { kind: 'hand-made' as const, snapshot, starters }
      : plannerTask(snapshot, {
          k: base.k,
          methodRequested: base.methodRequested,
          nu: base.nu ?? null,
          timeLimitSeconds: base.timeLimitSeconds ?? null,
          mustBrief: base.mustBrief ?? [],
          cannotBrief: base.cannotBrief ?? [],
          noShow: base.noShow ?? null,
        });
  const computed = await computeNow(task, base.timeLimitSeconds ?? null);
  const row = await db.transaction(async (tx) => {
    const id = await store.insertPlan({ ...base, ...resultColumns(snapshot, computed) }, tx);
    await recordComputation({ ...base, noShow: base.noShow ?? null }, computed, snapshot.personIds, tx);
    return (await store.findPlan(id, tx))!;
  });
  return { status: 201, body: await detailOf(row, snapshot.version) };
}

/** Runs a task in the plan pool within the request; a failure is a 4xx with the engine's words. */
async function computeNow(task: Parameters<typeof runInPlanPool>[0], timeLimitSeconds: number | null): Promise<PlanComputation> {
  try {
    return unwrap((await runInPlanPool(task, { hardLimitMs: hardLimitMs(timeLimitSeconds) })) as ComputeOutcome<PlanComputation>);
  } catch (e) {
    if (e instanceof TimeLimitError)
      throw new HttpError(503, 'plan_too_slow', `${e.message} Try again, or ask for the plan to run in the background.`);
    throw e;
  }
}

/**
 * A small automatic plan (autoRunsNow), computed in the request with what its job would do: the
 * job quota is checked and the user's background proofs step aside, the search continues the
 * key's saved search, and the plan, its bound, its saved search and (when a gap is left) its
 * background proof are stored in one transaction, the proof queued once it commits.
 */
async function searchNow(userId: number, base: NewPlan, snapshot: RoomSnapshot): Promise<{ status: 201; body: PlanDetail }> {
  await checkJobQuota(userId);
  await yieldProofs(userId);
  const keyed = { ...base, noShow: base.noShow ?? null, mustBrief: base.mustBrief ?? [], cannotBrief: base.cannotBrief ?? [] };
  const resume = await savedSearchOf(keyed);
  const task = {
    ...plannerTask(snapshot, { ...keyed, k: base.k, nu: base.nu ?? null, timeLimitSeconds: base.timeLimitSeconds ?? null }),
    ...(resume ? { resume } : {}),
  };
  const computed = await computeNow(task, base.timeLimitSeconds ?? null);
  let proof: number | null = null;
  const row = await db.transaction(async (tx) => {
    const id = await store.insertPlan({ ...base, ...resultColumns(snapshot, computed) }, tx);
    const stored = (await store.findPlan(id, tx))!;
    await recordComputation(stored, computed, snapshot.personIds, tx);
    await recordSearch(stored, computed, tx);
    proof = await addProofRow(stored, computed, userId, tx);
    return stored;
  });
  await queueProof(proof).catch((err: unknown) => logger.warn({ err, planId: row.id }, 'queueing the background proof failed'));
  return { status: 201, body: await detailOf(row, snapshot.version) };
}

/** Checks a plan request against the room; the hand-made plan's starters (indices), or null for a planner request. */
function checkedRequest(room: ReturnType<typeof prepared>, snapshot: RoomSnapshot, body: CreatePlanRequest): number[] | null {
  const must = indicesOfPeople(snapshot, body.mustBrief ?? [], 'People who must be briefed');
  const exclude = indicesOfPeople(snapshot, body.cannotBrief ?? [], 'People who cannot be briefed');
  if (body.starters === undefined) {
    checkPlannerRequest(room, snapshot, body, must, exclude);
    return null;
  }
  const starters = indicesOfPeople(snapshot, body.starters, 'Starters');
  checkHandMade(room, snapshot, starters);
  return starters;
}

/** The plan's row before it is computed (status computing). */
function newPlanRow(
  userId: number,
  roomId: number,
  snapshot: RoomSnapshot,
  body: CreatePlanRequest,
  starters: number[] | null,
): NewPlan & { k: number; methodRequested: PlanRow['methodRequested'] } {
  const k = starters !== null ? starters.length : body.k!;
  const method = starters !== null ? 'hand-made' : (body.method ?? 'auto');
  return {
    roomId,
    createdBy: userId,
    name: body.name?.trim() || defaultName(method, k),
    kind: starters !== null ? 'hand-made' : 'computed',
    status: 'computing',
    k,
    methodRequested: method,
    nu: body.nu ?? null,
    timeLimitSeconds: body.timeLimitSeconds ?? null,
    mustBrief: body.mustBrief ?? [],
    cannotBrief: body.cannotBrief ?? [],
    noShow: body.noShow && body.noShow > 0 ? body.noShow : null,
    people: snapshot.personIds.length,
    roomVersion: snapshot.version,
    settings: snapshot.settings,
    snapshot: JSON.stringify(snapshot),
    notes: [],
    warnings: [],
  };
}

/** Queues the plan as a job; a quick automatic plan is still answered in this request (one round trip instead of a stream). */
async function startInBackground(
  userId: number,
  base: NewPlan,
  body: CreatePlanRequest,
  people: number,
): Promise<{ status: 201; body: PlanDetail } | { status: 202; body: PlanStarted }> {
  await checkJobQuota(userId);
  await yieldProofs(userId);
  const { planId, jobId } = await db.transaction(async (tx) => {
    const planId = await store.insertPlan(base, tx);
    const jobId = await insertJob({ userId, roomId: base.roomId, kind: 'plan', planId }, tx);
    await store.updatePlan(planId, { jobId }, tx);
    return { planId, jobId };
  });
  const job = (await findJob(jobId))!;
  const ended = answersInline(body, people) ? jobEnd(jobId, PLAN_LIMITS.autoAnswerWithinMs) : null;
  await jobRunner.enqueue(job);
  if ((await ended) === 'done') {
    const row = await store.findPlan(planId);
    if (row?.status === 'ready') return { status: 201, body: await detailOf(row, base.roomVersion) };
  }
  const plan = (await store.findPlan(planId))!;
  const started = planSummary(plan, base.roomVersion, await boundOf(plan));
  return { status: 202, body: { plan: started, job: jobDto(job, await jobRunner.positionOf(job)) } };
}

function defaultName(method: string, k: number): string {
  const label: Record<string, string> = {
    auto: 'Auto',
    greedy: 'Greedy',
    widened: 'Widened greedy',
    swap: 'Swap polish',
    exhaustive: 'Exhaustive',
    'hand-made': 'Hand-made',
  };
  return `${label[method] ?? method}, k = ${k}`;
}

/** Background job of a plan: runs the planner in the pool with progress and a hard time limit. */
export const planJobHandler: JobHandler = {
  async run(job, ctx) {
    const row = await store.findPlan(job.planId!);
    if (!row) throw new JobFailure('The plan was deleted.');
    const snapshot = parseSnapshot(row);
    // Exhaustive and automatic plans continue the saved search of their problem.
    const searches = row.methodRequested === 'exhaustive' || row.methodRequested === 'auto';
    const resume = searches ? await savedSearchOf(row) : null;
    const outcome = (await runInPlanPool(
      { ...plannerTask(snapshot, row), ...(resume ? { resume } : {}) },
      {
        signal: ctx.signal,
        stopEarly: ctx.stopEarly,
        hardLimitMs: hardLimitMs(row.timeLimitSeconds),
        onProgress: (f, search) => ctx.progress(f, undefined, undefined, search ? { search } : undefined),
      },
    )) as ComputeOutcome<PlanComputation>;
    if ('error' in outcome) throw new JobFailure(outcome.error.message);
    const columns = resultColumns(snapshot, outcome.ok);
    return async (tx) => {
      await store.updatePlan(row.id, columns, tx);
      await recordComputation(row, outcome.ok, snapshot.personIds, tx);
      await recordSearch(row, outcome.ok, tx);
      const proof = await addProofRow(row, outcome.ok, job.userId, tx);
      return () => queueProof(proof);
    };
  },
  async onEnd(job, status, message, tx) {
    if (job.planId) await store.updatePlan(job.planId, { status, error: message }, tx);
  },
};

/** Runs an interrupted, failed or cancelled plan again on its stored snapshot. */
export async function rerunPlan(user: SignedInUser, plan: LoadedPlan): Promise<PlanStarted> {
  if (plan.kind !== 'computed' || plan.status === 'ready' || plan.status === 'computing') {
    throw planError(
      'not_rerunnable',
      plan.status === 'computing' ? 'This plan is still being computed.' : 'Only a computed plan that did not finish can be run again.',
    );
  }
  await checkJobQuota(user.id);
  const jobId = await db.transaction(async (tx) => {
    const jobId = await insertJob({ userId: user.id, roomId: plan.roomId, kind: 'plan', planId: plan.id }, tx);
    await store.updatePlan(plan.id, { status: 'computing', jobId, error: null }, tx);
    return jobId;
  });
  const job = (await findJob(jobId))!;
  await jobRunner.enqueue(job);
  const version = (await store.roomVersion(plan.roomId)) ?? plan.roomVersion;
  const fresh = (await store.findPlan(plan.id))!;
  return { plan: planSummary(fresh, version, await boundOf(fresh)), job: jobDto(job, await jobRunner.positionOf(job)) };
}

export async function getPlan(plan: LoadedPlan): Promise<PlanDetail> {
  return detailOf(plan, (await store.roomVersion(plan.roomId)) ?? plan.roomVersion);
}

/** A plan's detail with its key's shared bound and what the page shows about proving it. */
async function detailOf(row: LoadedPlan, version: number): Promise<PlanDetail> {
  const bound = await boundOf(row);
  return { ...planDetail(row, version, bound), ...(await proofFacts(row, bound)) };
}

export async function listPlans(user: SignedInUser, roomId: number): Promise<PlanSummary[]> {
  const { room } = await roomAccess(user, roomId, 'view', 'That room');
  const rows = await store.listPlans(roomId);
  const bounds = await boundsFor(rows);
  return rows.map((r) => planSummary(r, room.version, boundForRow(bounds, r)));
}

export async function updatePlan(plan: LoadedPlan, patch: { name?: string; chosen?: boolean }): Promise<PlanSummary> {
  if (patch.name !== undefined) await store.updatePlan(plan.id, { name: patch.name.trim() });
  if (patch.chosen !== undefined) {
    if (patch.chosen && plan.status !== 'ready') throw planError('not_ready', 'Only a finished plan can be marked as chosen.');
    await store.setChosen(plan.id, plan.roomId, patch.chosen);
  }
  const fresh = (await store.findPlan(plan.id))!;
  return planSummary(fresh, (await store.roomVersion(plan.roomId)) ?? plan.roomVersion, await boundOf(fresh));
}

export async function deletePlan(plan: LoadedPlan): Promise<void> {
  for (const job of await store.openJobsOfPlan(plan.id)) await jobRunner.cancel(job);
  await store.deletePlan(plan.id);
}

export async function comparePlans(a: LoadedPlan, b: LoadedPlan): Promise<PlanComparison> {
  if (a.roomId !== b.roomId) throw planError('invalid_input', 'Compare two plans of the same room.');
  const version = (await store.roomVersion(a.roomId)) ?? a.roomVersion;
  const hops = (p: LoadedPlan) => {
    const r = parseResults(p);
    const s = parseSnapshot(p);
    return { map: new Map(s.personIds.map((id, i) => [id, r?.h[i] ?? null])), snapshot: s };
  };
  const hopsA = hops(a);
  const hopsB = hops(b);
  const ids = [...hopsA.snapshot.personIds, ...hopsB.snapshot.personIds.filter((id) => !hopsA.map.has(id))];
  const nameOf = new Map<number, string>();
  hopsB.snapshot.personIds.forEach((id, i) => nameOf.set(id, personAt(hopsB.snapshot, i).name));
  hopsA.snapshot.personIds.forEach((id, i) => nameOf.set(id, personAt(hopsA.snapshot, i).name));
  const people = ids.map((personId) => {
    const inA = hopsA.map.get(personId) ?? null;
    const inB = hopsB.map.get(personId) ?? null;
    return { personId, name: nameOf.get(personId) ?? '', a: inA, b: inB, difference: inA !== null && inB !== null ? inB - inA : null };
  });
  const startersA = new Set((a.starters ?? []).map((s) => s.personId));
  const startersB = new Set((b.starters ?? []).map((s) => s.personId));
  const diff = a.average !== null && b.average !== null ? b.average - a.average : null;
  let line = 'One of the plans is not finished yet.';
  if (diff !== null && a.average) {
    const pct = Math.abs(diff / a.average) * 100;
    line =
      Math.abs(diff) <= 1e-9 * a.average
        ? `Both plans give the same room average (${a.average.toFixed(2)} hops).`
        : `"${b.name}" gives a room average ${Math.abs(diff).toFixed(2)} hops (${pct.toFixed(1)}%) ${diff < 0 ? 'lower' : 'higher'} than "${a.name}".`;
  }
  return {
    a: planSummary(a, version, await boundOf(a)),
    b: planSummary(b, version, await boundOf(b)),
    people,
    onlyInA: [...startersA].filter((id) => !startersB.has(id)),
    onlyInB: [...startersB].filter((id) => !startersA.has(id)),
    inBoth: [...startersA].filter((id) => startersB.has(id)),
    averageDifference: diff,
    sameRoomVersion: a.roomVersion === b.roomVersion,
    line,
  };
}

export async function sweep(user: SignedInUser, roomId: number, maxK: number, seed: string): Promise<KSweepResult> {
  await roomAccess(user, roomId, 'view', 'That room');
  const snapshot = await snapshotOf(roomId);
  const n = snapshot.personIds.length;
  const cap = Math.min(n - 1, PLAN_LIMITS.sweepMaxK);
  if (n < 2) throw planError('invalid_k', 'A k-sweep needs a room of at least two people.');
  if (maxK < 1 || maxK > cap) {
    throw planError(
      'invalid_k',
      `The k-sweep goes up to k = ${cap} for this room (${n} people, at most ${PLAN_LIMITS.sweepMaxK}); got ${maxK}.`,
      { maxK, cap },
    );
  }
  // Split the values of k over the pool's threads (larger k cost more, so deal them round-robin).
  const started = performance.now();
  const lanes = Math.max(1, Math.min(config.WORKERS, maxK));
  const ks = Array.from({ length: lanes }, (_, lane) =>
    Array.from({ length: maxK }, (_, i) => i + 1).filter((k) => (k - 1) % lanes === lane),
  );
  const outs = await Promise.all(
    ks.map((part) => runInPlanPool({ kind: 'sweep', snapshot, maxK, ks: part, seed }, { hardLimitMs: 180_000 })),
  );
  const parts = outs.map((out) => {
    if ('error' in out) throw planError(out.error.code, out.error.message, out.error.detail);
    return out.ok as KSweepResult;
  });
  const merged = mergeSweeps(parts, performance.now() - started);
  await recordSweepBounds(roomId, snapshot.version, merged);
  return merged;
}
