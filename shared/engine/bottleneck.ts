/**
 * The bottleneck-ratio surrogate of docs/engine.md section 7, identity 7, for undirected rooms:
 *   Phi(S) = Q(S, S^c) / pi(S) = w(S, S^c) / vol(S)
 * with pi the stationary distribution (pi_i = d_i / vol) and Q(x, y) = pi_x P_xy (Levin, Peres
 * & Wilmer, Markov Chains and Mixing Times, 2nd ed., 2017, section 7.2), and the stationary
 * bound for reversible chains E_pi tau_A >= pi(A^c)^2 / Q(A, A^c) (Aldous & Fill, Reversible
 * Markov Chains and Random Walks on Graphs, chapter 3). Degrees and cut sizes only: O(sum of
 * degrees of S).
 */
import type { Csr } from './graph';

export interface CutData {
  /** Strength of ties leaving S, w(S, S^c). */
  readonly cut: number;
  /** vol(S) = sum of strengths of the people in S. */
  readonly volume: number;
  /** vol of the whole room. */
  readonly total: number;
}

export function cutOf(csr: Csr, set: readonly number[]): CutData {
  const inS = new Uint8Array(csr.n);
  for (const p of set) inS[p] = 1;
  let cut = 0;
  let volume = 0;
  for (const p of new Set(set)) {
    volume += csr.outStrength[p];
    for (let e = csr.rowStart[p]; e < csr.rowStart[p + 1]; e++) if (!inS[csr.col[e]]) cut += csr.weight[e];
  }
  let total = 0;
  for (let i = 0; i < csr.n; i++) total += csr.outStrength[i];
  return { cut, volume, total };
}

/** Phi(S) = w(S, S^c) / vol(S). */
export function bottleneckRatio(csr: Csr, set: readonly number[]): number {
  const c = cutOf(csr, set);
  return c.cut / c.volume;
}

/**
 * Lower bound on E_pi tau_A: pi(A^c)^2 / Q(A, A^c) with Q(A, A^c) = w(A, A^c) / vol; Infinity
 * when no tie leaves A (the rest cannot hear). The screen minimises it.
 */
export function stationaryBound(c: CutData): number {
  const rest = (c.total - c.volume) / c.total;
  return c.cut > 0 ? (rest * rest * c.total) / c.cut : Infinity;
}
