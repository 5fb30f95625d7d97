/**
 * Alias tables on the CSR rows (Walker 1977, "An efficient method for generating discrete random
 * variables with general distributions"; construction by Vose 1991, "A linear algorithm for
 * generating random numbers with a given distribution"). One table per row, aligned with the CSR
 * entries: a draw picks entry k of the row uniformly and keeps its column with probability
 * `keep[k]`, else takes `alias[k]`. Build O(m); each draw O(1).
 */
import type { Csr } from '../graph';

export interface AliasRows {
  readonly n: number;
  readonly rowStart: Int32Array;
  /** Probability of keeping the entry's own column. */
  readonly keep: Float64Array;
  /** Column of the entry itself. */
  readonly col: Int32Array;
  /** Column taken otherwise. */
  readonly alias: Int32Array;
}

export function buildAliasRows(csr: Csr): AliasRows {
  const { n, rowStart, col, weight } = csr;
  const m = col.length;
  const keep = new Float64Array(m);
  const alias = new Int32Array(m);
  let maxDeg = 0;
  for (let i = 0; i < n; i++) maxDeg = Math.max(maxDeg, rowStart[i + 1] - rowStart[i]);
  const scaled = new Float64Array(maxDeg);
  const small = new Int32Array(maxDeg);
  const large = new Int32Array(maxDeg);
  for (let i = 0; i < n; i++) {
    const start = rowStart[i];
    const d = rowStart[i + 1] - start;
    if (d === 0) continue;
    let total = 0;
    for (let k = 0; k < d; k++) total += weight[start + k];
    let ns = 0;
    let nl = 0;
    for (let k = 0; k < d; k++) {
      scaled[k] = (weight[start + k] * d) / total;
      alias[start + k] = col[start + k];
      if (scaled[k] < 1) small[ns++] = k;
      else large[nl++] = k;
    }
    while (ns > 0 && nl > 0) {
      const s = small[--ns];
      const l = large[nl - 1];
      keep[start + s] = scaled[s];
      alias[start + s] = col[start + l];
      scaled[l] = scaled[l] + scaled[s] - 1;
      if (scaled[l] < 1) {
        nl--;
        small[ns++] = l;
      }
    }
    // What is left is 1 up to rounding.
    while (nl > 0) keep[start + large[--nl]] = 1;
    while (ns > 0) keep[start + small[--ns]] = 1;
  }
  return { n, rowStart, keep, col, alias };
}
