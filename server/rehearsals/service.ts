/**
 * Rehearsals: start R seeded cascades for a plan (idempotent, capped, within the user's quotas,
 * queued per user), results shown once complete, the verdict, history, re-run from the seed,
 * cancel. The job itself (chunks shared by the workers) is in job.ts.
 */
import { randomBytes } from 'node:crypto';
import {
  IDEMPOTENCY_WINDOW_MS,
  type RehearsalDetail,
  type RehearsalStarted,
  type RehearsalSummary,
  type StartRehearsalRequest,
} from '../../shared/api/plans';
import { runsProblem, seedProblem } from '../../shared/api/plan-rules';
import { itemAt } from '../../shared/checked';
import { Z99 } from '../../shared/engine/index';
import { config } from '../config';
import { conflict, notFound } from '../core/http-error';
import { db } from '../db';
import { roomAccess } from '../jobs/access';
import { idOf } from '../core/ids';
import { jobDto } from '../jobs/dto';
import { queuePositions } from '../jobs/positions';
import { checkJobQuota } from '../jobs/quotas';
import { jobRunner } from '../jobs/runner';
import { clearJobKey, findJob, findJobByKey, insertJob, updateJob } from '../jobs/service';
import { parseSnapshot } from '../plans/dto';
import type { LoadedPlan } from '../plans/service';
import { personAt } from '../plans/snapshot';
import { findPlan } from '../plans/service';
import { planError } from '../plans/validate';
import type { RoomNeed } from '../rooms/access';
import type { SignedInUser } from '../types';
import type { StoredRehearsalResults } from './results';
import * as store from './store';

export type LoadedRehearsal = NonNullable<Awaited<ReturnType<typeof store.findRehearsal>>>;

export async function loadRehearsalFor(user: SignedInUser | undefined, raw: unknown, need: RoomNeed): Promise<LoadedRehearsal> {
  const row = await store.findRehearsal(idOf(raw, 'That rehearsal'));
  if (!row) throw notFound('That rehearsal');
  await roomAccess(user, row.rehearsal.roomId, need, 'That rehearsal');
  return row;
}

export function randomSeed(): string {
  return randomBytes(8).toString('hex');
}

/** Same rules and words as the rehearsal form (shared/api/plan-rules.ts). */
export function checkRuns(runs: number): void {
  const p = runsProblem(runs, config.MAX_CASCADES);
  if (p) throw planError(p.code, p.message, { runs, max: config.MAX_CASCADES, field: p.field });
}

export function checkSeed(seed: string): void {
  const p = seedProblem(seed);
  if (p) throw planError(p.code, p.message, { seed: seed.slice(0, 80), field: p.field });
}

// Starts of one user are serialised in this process, so the idempotency check and the insert cannot interleave.
const userLocks = new Map<number, Promise<unknown>>();
function withUserLock<T>(userId: number, work: () => Promise<T>): Promise<T> {
  const previous = userLocks.get(userId) ?? Promise.resolve();
  const next = previous.catch(() => undefined).then(work);
  userLocks.set(userId, next);
  void next.finally(() => userLocks.get(userId) === next && userLocks.delete(userId)).catch(() => undefined);
  return next;
}

export async function startRehearsal(
  user: SignedInUser,
  plan: LoadedPlan,
  body: StartRehearsalRequest,
  rerunOf: { id: number } | null = null,
): Promise<RehearsalStarted> {
  if (plan.status !== 'ready') throw planError('not_ready', 'This plan is not computed yet: rehearse it once it is ready.');
  checkRuns(body.runs);
  if (body.seed !== undefined) checkSeed(body.seed);
  const seed = body.seed ?? randomSeed();
  const key = body.idempotencyKey
    ? `key:${body.idempotencyKey}`
    : rerunOf
      ? `rerun:${rerunOf.id}`
      : `auto:${plan.id}:${body.seed ?? '*'}:${body.runs}`;
  return withUserLock(user.id, async () => {
    const existing = await findJobByKey(user.id, key);
    if (existing) {
      const reusable =
        body.idempotencyKey !== undefined ||
        (Date.now() - existing.createdAt.getTime() < IDEMPOTENCY_WINDOW_MS &&
          !['failed', 'cancelled', 'interrupted'].includes(existing.status));
      if (reusable) {
        const row = existing.rehearsalId ? await store.findRehearsal(existing.rehearsalId) : undefined;
        if (!row) throw conflict('That idempotency key was already used for something else.');
        if (
          row.rehearsal.planId !== plan.id ||
          row.rehearsal.runs !== body.runs ||
          (body.seed !== undefined && row.rehearsal.seed !== body.seed)
        ) {
          throw conflict('That idempotency key was already used for a different rehearsal: send a new key.');
        }
        const position = await jobRunner.positionOf(row.job);
        return { rehearsal: summaryOf(row, position), job: jobDto(row.job, position), reused: true };
      }
      await clearJobKey(existing.id);
    }
    await checkJobQuota(user.id, body.runs);
    const rehearsalId = await db.transaction(async (tx) => {
      const jobId = await insertJob({ userId: user.id, roomId: plan.roomId, kind: 'rehearsal', planId: plan.id, idempotencyKey: key }, tx);
      const id = await store.insertRehearsal(
        { planId: plan.id, roomId: plan.roomId, createdBy: user.id, jobId, runs: body.runs, seed, rerunOf: rerunOf?.id ?? null },
        tx,
      );
      await updateJob(jobId, { rehearsalId: id }, tx);
      return id;
    });
    const row = (await store.findRehearsal(rehearsalId))!;
    await jobRunner.enqueue(row.job);
    const fresh = (await store.findRehearsal(rehearsalId))!;
    const position = await jobRunner.positionOf(fresh.job);
    return { rehearsal: summaryOf(fresh, position), job: jobDto(fresh.job, position), reused: false };
  });
}

/** A rehearsal for lists and answers; `position` is its job's queue position (queuePosition). */
export function summaryOf(row: LoadedRehearsal | store.RehearsalListRow, position: number | null = null): RehearsalSummary {
  const r = row.rehearsal;
  const done = row.job.status === 'done';
  return {
    id: r.id,
    number: Number(row.number),
    planId: r.planId,
    planName: row.planName,
    roomId: r.roomId,
    status: row.job.status,
    runs: r.runs,
    seed: r.seed,
    jobId: r.jobId,
    progress: row.job.progress,
    queuePosition: row.job.status === 'queued' ? position : null,
    average: done ? r.average : null,
    averageStderr: done ? r.averageStderr : null,
    analyticAverage: r.analyticAverage,
    capped: done ? r.capped : null,
    elapsedMs: done ? r.elapsedMs : null,
    verdict: done ? (r.verdict as RehearsalSummary['verdict']) : null,
    rerunOf: r.rerunOf,
    message: row.job.message,
    createdBy: row.createdByName,
    createdAt: r.createdAt.toISOString(),
    finishedAt: row.job.finishedAt ? row.job.finishedAt.toISOString() : null,
  };
}

export async function rehearsalDetail(row: LoadedRehearsal): Promise<RehearsalDetail> {
  const plan = await findPlan(row.rehearsal.planId);
  const snap = parseSnapshot(plan!);
  const base = summaryOf(row, await jobRunner.positionOf(row.job));
  const mph = snap.settings.minutesPerHop;
  const results = row.job.status === 'done' && row.rehearsal.results ? (JSON.parse(row.rehearsal.results) as StoredRehearsalResults) : null;
  if (!results) return { ...base, people: [], reach: null, hopCap: null, hops: null, samples: 0, minutesPerHop: mph };
  const starters = new Set((plan!.starters ?? []).map((s) => s.personId));
  const people = snap.personIds.map((personId, i) => {
    // The stored columns were written for this snapshot, one entry per person.
    const of = <T>(column: readonly T[], name: string): T => itemAt(column, i, `rehearsal ${name}`);
    const mean = of(results.mean, 'mean');
    const stderr = of(results.stderr, 'stderr');
    const half = Z99 * stderr;
    const { name, group } = personAt(snap, i);
    return {
      personId,
      name,
      group,
      starter: starters.has(personId),
      walked: of(results.walked, 'walked') === 1,
      mean,
      sd: of(results.sd, 'sd'),
      stderr,
      low95: of(results.low95, 'low95'),
      high95: of(results.high95, 'high95'),
      low99: mean - half,
      high99: mean + half,
      analytic: results.analytic[i] ?? Infinity,
      capped: of(results.capped, 'capped'),
      inInterval99: results.inside99[i] === 1,
    };
  });
  const sampleCount = row.rehearsal.samples ? (JSON.parse(row.rehearsal.samples) as unknown[]).length : 0;
  return {
    ...base,
    people,
    reach: { simulated: results.reachSimulated, analytic: results.reachAnalytic },
    hopCap: row.rehearsal.hopCap,
    hops: row.rehearsal.hops,
    samples: sampleCount,
    minutesPerHop: mph,
  };
}

export async function cancelRehearsal(row: LoadedRehearsal): Promise<RehearsalSummary> {
  const job = await findJob(row.rehearsal.jobId);
  if (job) await jobRunner.cancel(job);
  const fresh = (await store.findRehearsal(row.rehearsal.id))!;
  return summaryOf(fresh, await jobRunner.positionOf(fresh.job));
}

export async function deleteRehearsal(row: LoadedRehearsal): Promise<void> {
  const job = await findJob(row.rehearsal.jobId);
  if (job && (job.status === 'queued' || job.status === 'running')) await jobRunner.cancel(job);
  await store.deleteRehearsal(row.rehearsal.id);
}

/** The room's history, with queue positions of the waiting ones. */
export async function summaries(rows: store.RehearsalListRow[]): Promise<RehearsalSummary[]> {
  const positions = await queuePositions(rows.map((r) => r.job));
  return rows.map((r) => summaryOf(r, positions.get(r.job.id) ?? null));
}
