/**
 * The two thread pools of a process that runs jobs (created on first use): planners and k-sweeps
 * in a piscina pool of plan-worker.ts, rehearsal runs in a piscina pool of the engine's chunk
 * worker. Both have config.WORKERS threads. The engine is synchronous, so nothing heavy ever runs
 * on the request thread.
 */
import { setMaxListeners } from 'node:events';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { SimPartial } from '../../shared/engine/simulate/partial';
import type { SimTask } from '../../shared/engine/simulate/pool';
import { prepareRoom } from '../../shared/engine/room';
import type { PlanSearchProgress } from '../../shared/api/plans';
import { config } from '../config';
import { JobFailure } from './handlers';
import type { PlanPoolResult, PlanPoolTask } from './plan-worker';

let planPool: Piscina | undefined;
let simPool: Piscina | undefined;

function workerFile(): string {
  const here = import.meta.url;
  return new URL(here.endsWith('.ts') ? './plan-worker.ts' : './plan-worker.js', here).href;
}

function simWorkerFile(): string {
  const here = import.meta.url;
  const file = here.endsWith('.ts') ? 'worker.ts' : 'worker.js';
  return new URL(`../../shared/engine/simulate/${file}`, here).href;
}

function sims(): Piscina {
  simPool ??= new Piscina({ filename: simWorkerFile(), minThreads: config.WORKERS, maxThreads: config.WORKERS, idleTimeout: 30_000 });
  return simPool;
}

/** Runs one range of runs in a thread of the rehearsal pool; an abort ends the task. */
export async function runSimTask(task: SimTask, signal?: AbortSignal): Promise<SimPartial> {
  if (signal) setMaxListeners(64, signal);
  return (await sims().run(task, signal ? { signal } : {})) as SimPartial;
}

function plans(): Piscina {
  planPool ??= new Piscina({ filename: workerFile(), minThreads: config.WORKERS, maxThreads: config.WORKERS, idleTimeout: 60_000 });
  return planPool;
}

export class TimeLimitError extends Error {
  constructor(readonly seconds: number) {
    super(`The computation did not finish within ${seconds} seconds and was stopped.`);
    this.name = 'TimeLimitError';
  }
}

export interface PlanRunControl {
  /** Cancel: the worker thread is ended and nothing is returned. */
  signal?: AbortSignal;
  /**
   * Stop early: a running search returns the best plan found so far with its proven gap (the
   * engine checks the flag between search steps); a task that has not returned STOP_GRACE_MS
   * later is ended as on cancel.
   */
  stopEarly?: AbortSignal;
  /** Hard stop (the worker thread is ended), in ms. */
  hardLimitMs: number;
  /** `search`: what a plan search has found and proven so far (plan tasks only). */
  onProgress?: (fraction: number, search?: PlanSearchProgress) => void;
}

/** How long a stopped search may take to hand back its best plan before its thread is ended. */
export const STOP_GRACE_MS = 10_000;

/** Runs one task in the plan pool; a cancel or the hard time limit ends the worker thread. */
export async function runInPlanPool(task: PlanPoolTask, control: PlanRunControl): Promise<PlanPoolResult> {
  const stop = new AbortController();
  setMaxListeners(32, stop.signal);
  const timer = setTimeout(() => stop.abort(new TimeLimitError(Math.round(control.hardLimitMs / 1000))), control.hardLimitMs);
  const onCancel = () => stop.abort(control.signal?.reason);
  control.signal?.addEventListener('abort', onCancel, { once: true });
  const stopFlag = task.kind === 'planner' ? new SharedArrayBuffer(4) : undefined;
  let grace: ReturnType<typeof setTimeout> | undefined;
  const onStopEarly = () => {
    if (stopFlag) Atomics.store(new Int32Array(stopFlag), 0, 1);
    const late = new JobFailure(`The search was asked to stop but did not hand back its plan within ${STOP_GRACE_MS / 1000} s.`);
    grace ??= setTimeout(() => stop.abort(late), STOP_GRACE_MS);
  };
  if (control.stopEarly?.aborted) onStopEarly();
  else control.stopEarly?.addEventListener('abort', onStopEarly, { once: true });
  const channel = control.onProgress ? new MessageChannel() : undefined;
  channel?.port1.on('message', (m: { fraction: number; search?: PlanSearchProgress }) => control.onProgress?.(m.fraction, m.search));
  try {
    const payload = { ...task, ...(stopFlag ? { stopFlag } : {}), ...(channel ? { port: channel.port2 } : {}) };
    return (await plans().run(payload, { signal: stop.signal, transferList: channel ? [channel.port2] : [] })) as PlanPoolResult;
  } catch (e) {
    if (stop.signal.aborted && (stop.signal.reason instanceof TimeLimitError || stop.signal.reason instanceof JobFailure))
      throw stop.signal.reason;
    throw e;
  } finally {
    clearTimeout(timer);
    clearTimeout(grace);
    control.signal?.removeEventListener('abort', onCancel);
    control.stopEarly?.removeEventListener('abort', onStopEarly);
    channel?.port1.close();
  }
}

/** Starts both pools and loads the worker code with a tiny task each. */
export async function warmPools(): Promise<void> {
  const graph = {
    ids: ['a', 'b', 'c'],
    directed: false,
    ties: [
      { source: 0, target: 1, strength: 1 },
      { source: 1, target: 2, strength: 1 },
    ],
  };
  const snapshot = {
    graph,
    personIds: [1, 2, 3],
    names: ['a', 'b', 'c'],
    settings: { directed: false, minutesPerHop: 1, laziness: 0, mixing: 0 },
    version: 0,
  };
  const room = prepareRoom(graph, {});
  await Promise.all([
    runInPlanPool({ kind: 'planner', snapshot, k: 1, method: 'greedy', mustInclude: [], exclude: [] }, { hardLimitMs: 60_000 }),
    runSimTask({ room, starters: [1], options: { samples: 0 }, seed: 'warm-up', runFrom: 0, runTo: 4 }),
  ]);
}

export async function closePools(): Promise<void> {
  const p = planPool;
  const s = simPool;
  planPool = undefined;
  simPool = undefined;
  await Promise.all([p?.destroy(), s?.destroy()]);
}
