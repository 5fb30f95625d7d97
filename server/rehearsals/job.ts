/**
 * The rehearsal job, cut into chunks that any worker on any machine may compute. A chunk is a
 * (seed, run range) and its runs are the engine's own chunks (chunkRanges), computed in this
 * process's threads and folded in run order; the job's merge folds the chunks in run order too.
 * The cut depends only on the run count and the room size, so the stored numbers are the same
 * for any number of workers and machines; up to 128 engine chunks it is exactly the engine's own
 * fold, so a rehearsal of that size equals simulate() in one thread.
 */
import { REHEARSAL_LIMITS } from '../../shared/api/plans';
import { firstOf, lastOf } from '../../shared/checked';
import { prepareRoom, type PreparedRoom } from '../../shared/engine/room';
import { mergePartials } from '../../shared/engine/simulate/partial';
import { planSimulation, type SimulateOptions } from '../../shared/engine/simulate/plan';
import { chunkRanges, type RunRange } from '../../shared/engine/simulate/run-local';
import { summarize } from '../../shared/engine/simulate/summary';
import type { ChunkedJobHandler, ChunkRange } from '../jobs/handlers';
import { JobFailure } from '../jobs/handlers';
import { runSimTask } from '../jobs/pools';
import type { JobRow } from '../jobs/service';
import { parseResults, parseSnapshot } from '../plans/dto';
import { findPlan } from '../plans/service';
import { decodePartial, encodePartial } from './partial-codec';
import { SAMPLE_PATH_CAP, storedResults, storedSamples } from './results';
import * as store from './store';
import { verdictOf } from './verdict';

/** At most this many queue chunks per rehearsal (each holds n numbers three times over in Redis). */
export const MAX_QUEUE_CHUNKS = 128;

/** Groups the engine's chunks into at most MAX_QUEUE_CHUNKS consecutive queue chunks. */
export function queueChunks(runs: number, n: number): RunRange[][] {
  const engine = chunkRanges(runs, n);
  const per = Math.max(1, Math.ceil(engine.length / MAX_QUEUE_CHUNKS));
  const out: RunRange[][] = [];
  for (let i = 0; i < engine.length; i += per) out.push(engine.slice(i, i + per));
  return out;
}

interface Inputs {
  rehearsal: store.RehearsalRow;
  plan: NonNullable<Awaited<ReturnType<typeof findPlan>>>;
  room: PreparedRoom;
  starters: number[];
  options: SimulateOptions;
}

// A worker computes many chunks of the same rehearsal: read and prepare its room once.
const cache = new Map<number, Promise<Inputs>>();

async function load(jobId: number): Promise<Inputs> {
  const r = await store.findRehearsalByJob(jobId);
  if (!r) throw new JobFailure('The rehearsal was deleted.');
  const plan = await findPlan(r.planId);
  if (!plan) throw new JobFailure('The plan was deleted.');
  const snap = parseSnapshot(plan);
  const index = new Map(snap.personIds.map((id, i) => [id, i]));
  const starters = (plan.starters ?? []).map((s) => index.get(s.personId)!);
  const options: SimulateOptions = {
    laziness: snap.settings.laziness,
    mixing: snap.settings.mixing,
    samples: REHEARSAL_LIMITS.samples,
    samplePathCap: SAMPLE_PATH_CAP,
  };
  return { rehearsal: r, plan, room: prepareRoom(snap.graph, options), starters, options };
}

function inputs(jobId: number): Promise<Inputs> {
  let hit = cache.get(jobId);
  if (!hit) {
    hit = load(jobId);
    cache.set(jobId, hit);
    hit.catch(() => cache.delete(jobId));
    while (cache.size > 16) cache.delete(cache.keys().next().value!);
  }
  return hit;
}

export const rehearsalJobHandler: ChunkedJobHandler = {
  async chunks(job: JobRow): Promise<ChunkRange[]> {
    const { rehearsal, room } = await inputs(job.id);
    return queueChunks(rehearsal.runs, room.n).map((group) => ({
      from: firstOf(group, 'chunk group').from,
      to: lastOf(group, 'chunk group').to,
    }));
  },

  async runChunk(job: JobRow, range: ChunkRange, signal: AbortSignal): Promise<string> {
    const { rehearsal, room, starters, options } = await inputs(job.id);
    const engine = chunkRanges(rehearsal.runs, room.n).filter((c) => c.from >= range.from && c.to <= range.to);
    const parts = await Promise.all(
      engine.map((c) => runSimTask({ room, starters, options, seed: rehearsal.seed, runFrom: c.from, runTo: c.to }, signal)),
    );
    return encodePartial(mergePartials(parts));
  },

  async merge(job: JobRow, results: readonly string[]) {
    const { rehearsal: r, plan, room, starters, options } = await inputs(job.id);
    cache.delete(job.id);
    const merged = mergePartials(results.map(decodePartial));
    if (merged.runFrom !== 0 || merged.runTo !== r.runs)
      throw new Error(`rehearsal ${r.id}: chunks cover runs ${merged.runFrom}..${merged.runTo}`);
    const summary = summarize(planSimulation(room, starters, options), merged, r.seed);
    const planResults = parseResults(plan)!;
    const analyticAverage = plan.average!;
    const { inside, ...verdict } = verdictOf({
      mean: summary.mean,
      stderr: summary.stderr,
      walked: summary.walked,
      analytic: planResults.h,
      average: summary.average,
      averageStderr: summary.averageStderr,
      analyticAverage,
      runs: summary.runs,
      capped: summary.capped,
    });
    const results_ = JSON.stringify(storedResults(summary, planResults.h, planResults.curve.byHop, inside));
    const samples = JSON.stringify(storedSamples(summary));
    const elapsedMs = Date.now() - (job.startedAt ?? job.createdAt).getTime();
    return async (tx) =>
      store.updateRehearsal(
        r.id,
        {
          average: summary.average,
          averageStderr: summary.averageStderr,
          analyticAverage,
          capped: summary.capped,
          hops: summary.hops,
          hopCap: summary.hopCap,
          elapsedMs,
          verdict,
          results: results_,
          samples,
          finishedAt: new Date(),
        },
        tx,
      );
  },
};
