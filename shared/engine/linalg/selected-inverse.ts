/**
 * Selected inversion: the entries of Z = A^-1 on the pattern of the LDL^T factor, in
 * particular its diagonal, without forming the dense inverse (Takahashi, Fagan & Chen,
 * "Formation of a sparse bus impedance matrix and its application to short circuit study",
 * 1973; Erisman & Tinney, "On computing certain elements of the inverse of a sparse matrix",
 * CACM 18, 1975). With S_j the row indices of column j of L, going from the last column back:
 *   Z_ij = - sum_{l in S_j} Z_il L_lj      (i in S_j)
 *   Z_jj = 1 / d_j - sum_{l in S_j} L_lj Z_lj
 * Every Z_il needed lies on the pattern, because S_j minus anything up to l is contained in
 * S_l (elimination-tree property). Work of the order of the factorisation's.
 * Returns diag(A^-1) in the original numbering.
 */
import type { LdlFactor } from './sparse-ldl';

export function inverseDiagonal(f: LdlFactor): Float64Array {
  const { n, perm, colStart } = f.sym;
  const { rowIdx, lx, d } = f;
  const zx = new Float64Array(lx.length);
  const zd = new Float64Array(n);
  const pos = new Int32Array(n).fill(-1);
  for (let j = n - 1; j >= 0; j--) {
    const a = colStart[j];
    const b = colStart[j + 1];
    for (let p = a; p < b; p++) {
      pos[rowIdx[p]] = p;
      zx[p] = 0;
    }
    for (let p = a; p < b; p++) {
      const l = rowIdx[p];
      const llj = lx[p];
      zx[p] -= zd[l] * llj;
      // Pairs (i, l) with i > l, both in S_j: Z_il sits in column l of the pattern.
      for (let q = colStart[l]; q < colStart[l + 1]; q++) {
        const at = pos[rowIdx[q]];
        if (at < 0) continue;
        const zil = zx[q];
        zx[at] -= zil * llj;
        zx[p] -= zil * lx[at];
      }
    }
    let s = 1 / d[j];
    for (let p = a; p < b; p++) {
      s -= lx[p] * zx[p];
      pos[rowIdx[p]] = -1;
    }
    zd[j] = s;
  }
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) out[perm[k]] = zd[k];
  return out;
}
