/**
 * Node-only entry (worker threads): the ergodic fundamental matrix computed on several cores,
 * and plans that use it. Import from 'shared/engine/parallel/index', never from browser code.
 */
import {
  ergodicFromWalk,
  generalErgodicFinish,
  generalErgodicMatrix,
  isReversibleErgodic,
  symmetricErgodicFinish,
  symmetricErgodicMatrix,
  type ErgodicData,
} from '../ergodic';
import { planFinish, planStart, sparseGreedyWanted } from '../plan';
import { exhaustiveSearch } from '../plan-exhaustive';
import { exhaustiveParallel } from './parallel-branch';
import type { PlanOptions, PlanResult } from '../plan-types';
import { classStructure } from '../reachability';
import { DEFAULT_DENSE_LIMIT } from '../reach';
import { prepareRoom, type RoomInput } from '../room';
import { denseWalk } from '../walk';
import { invertParallel } from './parallel-inverse';

export { invertParallel };

/** Ergodic data on `threads` threads; null when the room has several closed classes. */
export async function ergodicDataParallel(
  input: RoomInput,
  options: PlanOptions | Record<string, never> = {},
  threads = 2,
): Promise<ErgodicData | null> {
  const room = prepareRoom(input, options);
  if (classStructure(room).closedClasses.length !== 1) return null;
  if (threads <= 1) return ergodicFromWalk(denseWalk(room), room.n, 1 / (1 - room.laziness));
  if (isReversibleErgodic(room, 1))
    return symmetricErgodicFinish(room, await invertParallel(symmetricErgodicMatrix(room), room.n, true, threads));
  const g = await invertParallel(generalErgodicMatrix(denseWalk(room), room.n), room.n, false, threads);
  return generalErgodicFinish(g, room.n, 1 / (1 - room.laziness));
}

/**
 * plan() on worker threads: the O(n^3) ergodic step spread over threads (dense rooms of 300+
 * people) and the branch and bound of exhaustive and auto plans run on `threads` threads
 * (parallel-branch.ts). Same options and result as plan(); onProgress, signal and shouldStop work
 * as there (the signal is honoured within 100 ms because this thread stays free during the search).
 */
export async function planWithWorkers(input: RoomInput, options: PlanOptions, threads = 2): Promise<PlanResult> {
  const room = prepareRoom(input, options);
  const started = performance.now();
  const dense = room.n <= (options.denseLimit ?? DEFAULT_DENSE_LIMIT);
  // Method greedy on a sparse factor (sparseGreedyWanted) needs no dense ergodic step.
  const sparse = options.method === 'greedy' && sparseGreedyWanted(room.n, options.k, room.directed, options.sparseFrom);
  const ergodic = dense && !sparse && room.n >= 300 && threads > 1 ? await ergodicDataParallel(room, {}, threads) : null;
  const step = planStart(room, ergodic ? { ...options, ergodic } : options);
  const result =
    'result' in step
      ? step.result
      : planFinish(step, threads > 1 ? await exhaustiveParallel(step.ctx, step.start, threads) : exhaustiveSearch(step.ctx, step.start));
  return { ...result, elapsedMs: performance.now() - started };
}
