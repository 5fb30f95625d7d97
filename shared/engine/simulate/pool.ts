/**
 * Node-only rehearsal pool over worker threads (piscina). Runs are cut into the fixed chunks of
 * run-local.ts and merged in run order, so 1, 2 or W workers give bit-identical results. Reports
 * progress after each chunk and stops on an AbortSignal (the promise rejects with an AbortError).
 */
import { setMaxListeners } from 'node:events';
import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import { EngineError } from '../errors';
import { prepareRoom, type PreparedRoom, type RoomInput } from '../room';
import { mergePartials, type SimPartial } from './partial';
import { planSimulation, type SimulateOptions } from './plan';
import { checkRuns, chunkRanges } from './run-local';
import { summarize, type SimulationSummary } from './summary';

export interface SimTask {
  readonly room: PreparedRoom;
  readonly starters: readonly number[];
  readonly options: SimulateOptions;
  readonly seed: string | number;
  readonly runFrom: number;
  readonly runTo: number;
}

export interface PoolRunOptions {
  readonly onProgress?: (done: number, runs: number) => void;
  readonly signal?: AbortSignal;
}

/** The worker next to this file: worker.ts when run through tsx, worker.js once compiled. */
function workerFile(): string {
  const here = import.meta.url;
  return new URL(here.endsWith('.ts') ? './worker.ts' : './worker.js', here).href;
}

export class SimulationPool {
  private readonly pool: Piscina;
  readonly workers: number;

  constructor(workers = Math.max(1, availableParallelism())) {
    if (!Number.isInteger(workers) || workers < 1 || workers > 64) {
      throw new EngineError('INVALID_OPTION', `workers must be a whole number from 1 to 64 (got ${String(workers)})`);
    }
    this.workers = workers;
    this.pool = new Piscina({ filename: workerFile(), minThreads: workers, maxThreads: workers, idleTimeout: 30_000 });
  }

  async simulate(
    graph: RoomInput,
    starters: readonly number[],
    runs: number,
    seed: string | number,
    options: SimulateOptions = {},
    control: PoolRunOptions = {},
  ): Promise<SimulationSummary> {
    checkRuns(runs);
    const room = prepareRoom(graph, options);
    // Validates in this thread, so bad input gives an EngineError with its code.
    const plan = planSimulation(room, starters, options);
    const signal = control.signal;
    if (signal?.aborted) throw abortError();
    const chunks = chunkRanges(runs, room.n);
    // Each queued task listens on the signal.
    if (signal) setMaxListeners(chunks.length + 16, signal);
    let done = 0;
    const parts = await Promise.all(
      chunks.map(async (r): Promise<SimPartial> => {
        const task: SimTask = { room, starters: plan.starters, options, seed, runFrom: r.from, runTo: r.to };
        const part = (await this.pool.run(task, signal ? { signal } : {})) as SimPartial;
        done += r.to - r.from;
        control.onProgress?.(done, runs);
        return part;
      }),
    ).catch((e: unknown) => {
      if (signal?.aborted) throw abortError();
      throw e;
    });
    return summarize(plan, mergePartials(parts), seed);
  }

  async close(): Promise<void> {
    await this.pool.destroy();
  }
}

function abortError(): Error {
  const e = new Error('The rehearsal was cancelled.');
  e.name = 'AbortError';
  return e;
}

/** One-off rehearsal on a fresh pool of `workers` threads. */
export async function simulateInPool(
  graph: RoomInput,
  starters: readonly number[],
  runs: number,
  seed: string | number,
  options: SimulateOptions = {},
  workers = 2,
  control: PoolRunOptions = {},
): Promise<SimulationSummary> {
  const pool = new SimulationPool(workers);
  try {
    return await pool.simulate(graph, starters, runs, seed, options, control);
  } finally {
    await pool.close();
  }
}
