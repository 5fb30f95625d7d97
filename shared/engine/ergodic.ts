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
import { invertInPlace, invertSymmetricInPlace } from './linalg/dense';
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
  return generalErgodicFinish(invertInPlace(generalErgodicMatrix(p1, n), n), n, scale);
}

function columnSums(g: Float64Array, n: number): Float64Array {
  const colSum = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = i * n;
    for (let j = 0; j < n; j++) colSum[j] += g[r + j];
  }
  return colSum;
}

function withTotals(g: Float64Array, pi: Float64Array, colSum: Float64Array, n: number, scale: number): ErgodicData {
  const singleTotals = new Float64Array(n);
  for (let j = 0; j < n; j++) singleTotals[j] = pi[j] > 0 ? (scale * (n * g[j * n + j] - colSum[j])) / pi[j] : Infinity;
  return { n, g, pi, singleTotals, scale };
}

/**
 * Undirected connected room without mixing: the walk is reversible, so with S = D^-1/2 W D^-1/2
 * and pi = d / vol, Z = D^-1/2 (I - S + sqrt(pi) sqrt(pi)^T)^-1 D^1/2 (Kemeny & Snell's Z, u = pi).
 * The middle matrix is symmetric positive definite: inverted by the sweep operator at half
 * the cost of Gauss-Jordan.
 */
export function ergodicSymmetric(room: PreparedRoom): ErgodicData {
  const m = symmetricErgodicMatrix(room);
  return symmetricErgodicFinish(room, invertSymmetricInPlace(m, room.n));
}

/** The symmetric positive definite matrix I - S + sqrt(pi) sqrt(pi)^T (row-major). */
export function symmetricErgodicMatrix(room: PreparedRoom): Float64Array {
  const { n, csr } = room;
  const d = csr.outStrength;
  let vol = 0;
  for (let i = 0; i < n; i++) vol += d[i];
  const sq = new Float64Array(n);
  for (let i = 0; i < n; i++) sq[i] = Math.sqrt(d[i]);
  const m = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    const a = sq[i] / vol;
    for (let j = 0; j < n; j++) m[ri + j] = a * sq[j];
    m[ri + i] += 1;
    for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) m[ri + csr.col[e]] -= csr.weight[e] / (sq[i] * sq[csr.col[e]]);
  }
  return m;
}

/** Z from the inverse of symmetricErgodicMatrix (overwritten). */
export function symmetricErgodicFinish(room: PreparedRoom, inv: Float64Array): ErgodicData {
  const { n, csr } = room;
  const d = csr.outStrength;
  let vol = 0;
  for (let i = 0; i < n; i++) vol += d[i];
  const g = inv;
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    const f = 1 / Math.sqrt(d[i]);
    for (let j = 0; j < n; j++) g[ri + j] *= f * Math.sqrt(d[j]);
  }
  const pi = new Float64Array(n);
  for (let i = 0; i < n; i++) pi[i] = d[i] / vol;
  return withTotals(g, pi, columnSums(g, n), n, 1 / (1 - room.laziness));
}

/** The matrix I - P + (1/n) 1 1^T of ergodicFromWalk (row-major). */
export function generalErgodicMatrix(p1: Float64Array, n: number): Float64Array {
  const a = new Float64Array(n * n);
  const u = 1 / n;
  for (let k = 0; k < n * n; k++) a[k] = u - p1[k];
  for (let i = 0; i < n; i++) a[i * n + i] += 1;
  return a;
}

/** Ergodic data from the inverse G of generalErgodicMatrix. */
export function generalErgodicFinish(g: Float64Array, n: number, scale: number): ErgodicData {
  const u = 1 / n;
  const pi = new Float64Array(n);
  const colSum = columnSums(g, n);
  let piSum = 0;
  for (let j = 0; j < n; j++) {
    let v = colSum[j] * u;
    if (v < 1e-14) v = 0; // transient people: pi is zero up to rounding
    pi[j] = v;
    piSum += v;
  }
  for (let j = 0; j < n; j++) pi[j] /= piSum;
  return withTotals(g, pi, colSum, n, scale);
}

/** True when the room's walk is reversible with every person recurrent (undirected, connected, no mixing). */
export function isReversibleErgodic(room: PreparedRoom, closedClasses: number): boolean {
  if (room.directed || room.mixing > 0 || closedClasses !== 1) return false;
  for (let i = 0; i < room.n; i++) if (!(room.csr.outStrength[i] > 0)) return false;
  return true;
}

/** Ergodic data of the room (laziness applied to totals). Throws when the room has several closed classes. */
export function ergodicData(room: PreparedRoom): ErgodicData {
  const cs = classStructure(room);
  if (cs.closedClasses.length !== 1) {
    throw new EngineError(
      'NO_FEASIBLE_PLAN',
      `No single starter can reach everyone: the room has ${cs.closedClasses.length} closed groups, each needs its own starter.`,
      { closedGroups: cs.closedClasses.length },
    );
  }
  if (isReversibleErgodic(room, 1)) return ergodicSymmetric(room);
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
