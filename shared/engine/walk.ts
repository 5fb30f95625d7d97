/**
 * Walk matrix of engine.md section 1.
 *
 *   P0_ij = w_ij / sum_j w_ij            (a person with no outgoing tie stays put: P0_ii = 1)
 *   P1    = (1 - b) P0 + (b / n) 1 1^T   (background mixing b)
 *   P     = (1 - a) P1 + a I             (laziness a, applied last)
 *
 * Laziness is applied last, so every hitting time of P is exactly that of P1 divided by
 * (1 - a); the solvers therefore work with P1 and scale. Dense form for rooms of up to a
 * few thousand people (row-major Float64Array, O(n^2) memory); the sparse operator keeps
 * the mixing as a rank-one term and never densifies it (O(m) per product).
 */
import type { PreparedRoom } from './room';

/** Dense row-major P1 (mixing included, laziness excluded unless `withLaziness`). */
export function denseWalk(room: PreparedRoom, withLaziness = false): Float64Array {
  const { n, csr, mixing: b, laziness: a } = room;
  const p = new Float64Array(n * n);
  const base = b / n;
  if (base > 0) p.fill(base);
  for (let i = 0; i < n; i++) {
    const s = csr.outStrength[i];
    const row = i * n;
    if (s > 0) {
      const f = (1 - b) / s;
      for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) p[row + csr.col[e]] += f * csr.weight[e];
    } else {
      p[row + i] += 1 - b;
    }
  }
  if (withLaziness && a > 0) {
    for (let k = 0; k < n * n; k++) p[k] *= 1 - a;
    for (let i = 0; i < n; i++) p[i * n + i] += a;
  }
  return p;
}

/**
 * Sparse walk operator restricted to the people not in `absorbing` (the starters).
 * `mulQ(x, y)`: y = Q1 x on T (entries on starters are left 0); `mulQt`: y = Q1^T x.
 */
export interface SparseWalk {
  readonly n: number;
  readonly inT: Uint8Array;
  /** Out-probabilities per CSR entry (without mixing): w_ij / s_i, self-loop handled by `stay`. */
  readonly prob: Float64Array;
  /** 1 for people with no outgoing tie (they stay put under P0). */
  readonly stay: Uint8Array;
  readonly mixing: number;
  mulQ(x: Float64Array, y: Float64Array): void;
  mulQt(x: Float64Array, y: Float64Array): void;
}

export function sparseWalk(room: PreparedRoom, starters: readonly number[]): SparseWalk {
  const { n, csr, mixing: b } = room;
  const inT = new Uint8Array(n).fill(1);
  for (const s of starters) inT[s] = 0;
  const prob = new Float64Array(csr.col.length);
  const stay = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const s = csr.outStrength[i];
    if (s > 0) for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) prob[e] = csr.weight[e] / s;
    else stay[i] = 1;
  }
  const { rowStart, col } = csr;
  const keep = 1 - b;
  const mulQ = (x: Float64Array, y: Float64Array) => {
    let sumT = 0;
    if (b > 0) for (let i = 0; i < n; i++) if (inT[i]) sumT += x[i];
    const r1 = (b / n) * sumT;
    for (let i = 0; i < n; i++) {
      if (!inT[i]) {
        y[i] = 0;
        continue;
      }
      let acc = 0;
      if (stay[i]) acc = x[i];
      else
        for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
          const j = col[e];
          if (inT[j]) acc += prob[e] * x[j];
        }
      y[i] = keep * acc + r1;
    }
  };
  const mulQt = (x: Float64Array, y: Float64Array) => {
    y.fill(0);
    let sumT = 0;
    for (let i = 0; i < n; i++) {
      if (!inT[i]) continue;
      const xi = x[i];
      sumT += xi;
      if (stay[i]) y[i] += keep * xi;
      else
        for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
          const j = col[e];
          if (inT[j]) y[j] += keep * prob[e] * xi;
        }
    }
    if (b > 0) {
      const r1 = (b / n) * sumT;
      for (let i = 0; i < n; i++) if (inT[i]) y[i] += r1;
    }
    for (let i = 0; i < n; i++) if (!inT[i]) y[i] = 0;
  };
  return { n, inT, prob, stay, mixing: b, mulQ, mulQt };
}
