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
 * A trailing supernode (columns b0..b1 whose rows below the diagonal are exactly the block's later
 * columns: the dense separator at the top of the elimination tree) is inverted as a dense block,
 * Z_ij = -sum_l Z_il L_lj over contiguous rows, which is several times faster than looking each
 * entry up in the pattern; its entries are then stored on the pattern for the columns below.
 * Returns diag(A^-1) in the original numbering.
 */
import { trailingBlocks, type LdlFactor } from './sparse-ldl';

export function inverseDiagonal(f: LdlFactor): Float64Array {
  const { n, perm, colStart } = f.sym;
  const { rowIdx, lx, d } = f;
  const zx = new Float64Array(lx.length);
  const zd = new Float64Array(n);
  const pos = new Int32Array(n).fill(-1);
  const blockStart = trailingBlocks(f.sym);
  // For people inside an inverted block: its first column and its dense inverse.
  const blockOf = new Int32Array(n).fill(-1);
  const blocks: { b0: number; s: number; z: Float64Array }[] = [];
  for (let j = n - 1; j >= 0; j--) {
    if (blockStart[j] >= 0) {
      const b0 = blockStart[j];
      blocks.push({ b0, s: j - b0 + 1, z: invertBlock(f, b0, j, zx, zd) });
      blockOf.fill(blocks.length - 1, b0, j + 1);
      j = b0;
      continue;
    }
    const a = colStart[j];
    const b = colStart[j + 1];
    for (let p = a; p < b; p++) {
      pos[rowIdx[p]] = p;
      zx[p] = 0;
    }
    for (let p = a; p < b; p++) {
      const l = rowIdx[p];
      const llj = lx[p];
      let zlj = zx[p] - zd[l] * llj;
      if (blockOf[l] >= 0) {
        // l and every later row of S_j lie in a dense block: Z_il read from it directly.
        zlj = fromBlock(blocks[blockOf[l]], l, llj, zlj, p + 1, b, rowIdx, lx, zx);
        zx[p] = zlj;
        continue;
      }
      // Pairs (i, l) with i > l, both in S_j: Z_il sits in column l of the pattern. Rows are
      // sorted and S_j after l lies inside S_l, so the scan stops once the b - p - 1 rows of S_j
      // after l have been met.
      let left = b - p - 1;
      const end = colStart[l + 1];
      for (let q = colStart[l]; left > 0 && q < end; q++) {
        const at = pos[rowIdx[q]];
        if (at < 0) continue;
        left--;
        const zil = zx[q];
        zx[at] -= zil * llj;
        zlj -= zil * lx[at];
      }
      zx[p] = zlj;
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

/** Selected inversion of the dense trailing block b0..b1 (rows of column j: j + 1..b1, in order). */
function invertBlock(f: LdlFactor, b0: number, b1: number, zx: Float64Array, zd: Float64Array): Float64Array {
  const { colStart } = f.sym;
  const { lx, d } = f;
  const s = b1 - b0 + 1;
  const z = new Float64Array(s * s);
  for (let jj = s - 1; jj >= 0; jj--) {
    const c = colStart[b0 + jj] - jj - 1; // lx[c + l] = L(b0 + l, b0 + jj) for l > jj
    let djj = 1 / d[b0 + jj];
    for (let i = jj + 1; i < s; i++) {
      const row = i * s;
      let acc = 0;
      for (let l = jj + 1; l < s; l++) acc += z[row + l] * lx[c + l];
      z[row + jj] = -acc;
      z[jj * s + i] = -acc;
      djj += acc * lx[c + i];
    }
    z[jj * s + jj] = djj;
    zd[b0 + jj] = djj;
    for (let i = jj + 1; i < s; i++) zx[c + i] = z[i * s + jj];
  }
  return z;
}

/** Z_ij -= Z_il L_lj and Z_lj -= Z_il L_ij for the rows i of column j at positions from..to - 1, Z_il from the dense block. Returns Z_lj. */
function fromBlock(
  blk: { b0: number; s: number; z: Float64Array },
  l: number,
  llj: number,
  zlj: number,
  from: number,
  to: number,
  rowIdx: Int32Array,
  lx: Float64Array,
  zx: Float64Array,
): number {
  const { b0, s, z } = blk;
  const base = (l - b0) * s - b0;
  for (let t = from; t < to; t++) {
    const zil = z[base + rowIdx[t]];
    zx[t] -= zil * llj;
    zlj -= zil * lx[t];
  }
  return zlj;
}
