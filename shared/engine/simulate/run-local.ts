/**
 * Rehearsal in this thread (browser or Node). Runs are cut into fixed chunks that depend only on
 * the room size and the run count, never on the number of workers; the worker pool (pool.ts) uses
 * the same chunks and the same merge order, so both give bit-identical results.
 */
import { EngineError } from '../errors';
import type { RoomInput } from '../room';
import { mergePartials, type SimPartial } from './partial';
import { planSimulation, type SimulateOptions } from './plan';
import { simulateRange } from './simulate-range';
import { summarize, type SimulationSummary } from './summary';

export interface RunRange {
  readonly from: number;
  readonly to: number;
}

/** About 200 000 walks per chunk: large enough to amortise a task, small enough for progress. */
export function chunkRanges(runs: number, n: number): RunRange[] {
  const size = Math.max(1, Math.min(1000, Math.floor(200_000 / Math.max(1, n))));
  const out: RunRange[] = [];
  for (let from = 0; from < runs; from += size) out.push({ from, to: Math.min(runs, from + size) });
  return out;
}

export function checkRuns(runs: number): void {
  if (!Number.isInteger(runs) || runs < 1 || runs > 10_000_000) {
    throw new EngineError('INVALID_OPTION', `runs must be a whole number from 1 to 10000000 (got ${String(runs)})`);
  }
}

export function simulate(
  graph: RoomInput,
  starters: readonly number[],
  runs: number,
  seed: string | number,
  options: SimulateOptions = {},
  onProgress?: (done: number, runs: number) => void,
): SimulationSummary {
  checkRuns(runs);
  const plan = planSimulation(graph, starters, options);
  const parts: SimPartial[] = [];
  for (const r of chunkRanges(runs, plan.room.n)) {
    parts.push(simulateRange(graph, starters, options, seed, r.from, r.to));
    onProgress?.(r.to, runs);
  }
  return summarize(plan, mergePartials(parts), seed);
}
