/**
 * Ripplehall analytic engine: one public entry. Pure TypeScript over typed arrays (no DOM,
 * no I/O); runs in Node, worker threads and the browser bundle.
 *
 * API summary (people are indices 0..n-1 in input order; map ids with `indicesOf`):
 *   prepareRoom(graph, { laziness, mixing })          -> PreparedRoom (validated once, reusable)
 *   exactReach(room, starters, opts?)                   -> { h, total, average, unreachable, solver, ... }
 *        h[i] = expected hops to hear (0 on starters; Infinity only for people listed in `unreachable`,
 *        each with reason and message). total/average are Infinity exactly when `unreachable` is non-empty;
 *        reachableTotal/reachableAverage cover the rest.
 *   plan(room, { k, method: 'greedy'|'widened'|'swap'|'exhaustive'|'auto'|'lazy-greedy', nu, timeLimitMs,
 *        mustInclude, exclude, laziness, mixing, onProgress, signal, shouldStop, noShow, boundMs })
 *        -> { method, k, starters (order chosen), total, average, rank, lowerBound, certified, gap, relativeGap,
 *             elapsedMs, coverSize, rankScale, gainShare, bestSingle, fewestForOneHop, fewestToReachAll,
 *             stopped?, nodes?, searchLeft?, noShow?, notes, warnings: [{ code, text }] }   (bounds: docs/bounds.md;
 *        warning codes: PLAN_WARNING_CODES in plan-types.ts)
 *   vertexCover(room)                                   -> { size, cover, exact }
 *   reachCurve(room, starters, { maxHops, quantiles, minutesPerHop, people }) -> reach-time distribution
 *   classStructure(room) / unreachablePeople(room, A)   -> closed classes, unreachable people with reasons
 *   ergodicData(room), allPairsTotals(e), hittingTime(e, i, j), kemenyFrom(e, i)
 *   denseWalk(room), sparseWalk(room, A)                -> walk matrix (dense) / operator (sparse, mixing rank-one)
 *   Node only (worker threads, not exported here): shared/engine/parallel/index.ts has
 *   planWithWorkers(room, options, threads) and ergodicDataParallel(room, {}, threads).
 * Plan methods: greedy O(n^3 + k n^2); widened (nu, maxSeeds); swap (greedy + swap polish);
 *   exhaustive (branch and bound, certified or a proven gap at timeLimitMs); lazy-greedy (large
 *   sparse rooms, lazyChecks exact checks per round, error stated in notes); auto chooses by size.
 * Errors: every validation failure throws EngineError { code, message } (see errors.ts).
 * Walk definition: P = (1 - a) [(1 - b) P0 + (b / n) 1 1^T] + a I; a person with no outgoing tie stays put.
 */
export * from './errors';
export * from './graph';
export * from './room';
export * from './walk';
export * from './reachability';
export * from './reach';
export * from './ergodic';
export * from './pairs';
export * from './quality';
export * from './cover';
export * from './plan-types';
export * from './plan';
export * from './reach-time';
export { AbsorbingState, beats, tieTolerance, TIE_TOLERANCE } from './dense-state';
export { SparseSystem } from './sparse-system';
export {
  luFactor,
  luSolve,
  luSolveTransposed,
  choleskyFactor,
  choleskySolve,
  invertInPlace,
  invertSymmetricInPlace,
  symmetricFactor,
  symmetricSolve,
} from './linalg/dense';
export { pcg, bicgstab, gmres } from './linalg/iterative';
export * from './io/index';
export * from './simulate/index';
