/**
 * Ergodic fundamental matrix and every single-starter total (identity 3).
 *
 *   G = (I - P + 1 u^T)^-1 with u = 1/n,  pi^T = u^T G,
 *   H(i, j) = (G_jj - G_ij) / pi_j   (i != j),
 *   total({j}) = sum_i H(i, j) = (n G_jj - sum_i G_ij) / pi_j.
 * With u = pi this is Kemeny and Snell's Z (Aldous & Fill, Reversible Markov Chains, ch. 2);
 * any u with u^T 1 = 1 gives the same hitting times (Hunter, "Simple procedures for finding
 * mean first passage times in Markov chains", 2007). One dense inverse: 2 n^3 flops.
 * Requires one closed class (the chain may have transient people); transient people get an
 * infinite single-starter total because the closed class never reaches them.
 */
import { EngineError } from './errors';
import { invertInPlace } from './linalg/dense';
import { classStructure } from './reachability';
import type { PreparedRoom } from './room';
import { denseWalk } from './walk';

export interface ErgodicData {
  readonly n: number;
  /** Generalised fundamental matrix, row-major n x n (laziness not applied). */
  readonly g: Float64Array;
  /** Stationary distribution (0 on transient people). */
  readonly pi: Float64Array;
  /** total({j}) per person, laziness applied; Infinity for transient people. */
  readonly singleTotals: Float64Array;
  /** 1 / (1 - laziness): the factor already applied to singleTotals. */
  readonly scale: number;
}

/** Fundamental data of a walk matrix p1 (row-major, stochastic). */
export function ergodicFromWalk(p1: Float64Array, n: number, scale = 1): ErgodicData {
  const a = new Float64Array(n * n);
  const u = 1 / n;
  for (let k = 0; k < n * n; k++) a[k] = u - p1[k];
  for (let i = 0; i < n; i++) a[i * n + i] += 1;
  const g = invertInPlace(a, n);
  const pi = new Float64Array(n);
  const colSum = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = i * n;
    for (let j = 0; j < n; j++) colSum[j] += g[r + j];
  }
  let piSum = 0;
  for (let j = 0; j < n; j++) {
    let v = colSum[j] * u;
    if (v < 1e-14) v = 0; // transient people: pi is zero up to rounding
    pi[j] = v;
    piSum += v;
  }
  for (let j = 0; j < n; j++) pi[j] /= piSum;
  const singleTotals = new Float64Array(n);
  for (let j = 0; j < n; j++) singleTotals[j] = pi[j] > 0 ? (scale * (n * g[j * n + j] - colSum[j])) / pi[j] : Infinity;
  return { n, g, pi, singleTotals, scale };
}

/** Ergodic data of the room (laziness applied to totals). Throws when the room has several closed classes. */
export function ergodicData(room: PreparedRoom): ErgodicData {
  const cs = classStructure(room);
  if (cs.closedClasses.length !== 1) {
    throw new EngineError('NO_FEASIBLE_PLAN', `No single starter can reach everyone: the room has ${cs.closedClasses.length} closed groups, each needs its own starter.`, { closedGroups: cs.closedClasses.length });
  }
  return ergodicFromWalk(denseWalk(room), room.n, 1 / (1 - room.laziness));
}

/** Hitting time H(i, j) in hops (laziness applied). */
export function hittingTime(e: ErgodicData, i: number, j: number): number {
  if (i === j) return 0;
  if (!(e.pi[j] > 0)) return Infinity;
  const n = e.n;
  return (e.scale * (e.g[j * n + j] - e.g[i * n + j])) / e.pi[j];
}

/** Full hitting-time matrix H (row-major, laziness applied). O(n^2). */
export function hittingTimes(e: ErgodicData): Float64Array {
  const n = e.n;
  const h = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) h[i * n + j] = hittingTime(e, i, j);
  return h;
}

/** Kemeny's constant sum_j pi_j H(i, j) seen from start i (the same for every i). */
export function kemenyFrom(e: ErgodicData, i: number): number {
  let s = 0;
  for (let j = 0; j < e.n; j++) if (j !== i && e.pi[j] > 0) s += e.pi[j] * hittingTime(e, i, j);
  return s;
}
