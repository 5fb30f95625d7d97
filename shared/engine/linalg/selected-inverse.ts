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
import type { LdlFactor } from './sparse-ldl';

export function inverseDiagonal(f: LdlFactor): Float64Array {
  const { n, perm, colStart } = f.sym;
  const { rowIdx, lx, d } = f;
  const zx = new Float64Array(lx.length);
  const zd = new Float64Array(n);
  const pos = new Int32Array(n).fill(-1);
  const blockStart = trailingBlocks(f);
  for (let j = n - 1; j >= 0; j--) {
    if (blockStart[j] >= 0) {
      invertBlock(f, blockStart[j], j, zx, zd);
      j = blockStart[j];
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

/** Smallest and largest dense trailing block handled by invertBlock (s^2 doubles of work space). */
const MIN_BLOCK = 16;
const MAX_BLOCK = 2048;

/**
 * For every root b1 of the elimination tree with an empty column: the first column b0 of the
 * longest chain b0..b1 with parent j + 1 and one more row than the next column (so the rows of
 * column j are exactly j + 1..b1). blockStart[b1] = b0 for chains of MIN_BLOCK..MAX_BLOCK columns, else -1.
 */
function trailingBlocks(f: LdlFactor): Int32Array {
  const { n, parent, colCount } = f.sym;
  const start = new Int32Array(n).fill(-1);
  for (let b1 = 0; b1 < n; b1++) {
    if (parent[b1] !== -1 || colCount[b1] !== 0) continue;
    let b0 = b1;
    while (b0 > 0 && parent[b0 - 1] === b0 && colCount[b0 - 1] === colCount[b0] + 1 && b1 - b0 + 1 < MAX_BLOCK) b0--;
    if (b1 - b0 + 1 >= MIN_BLOCK) start[b1] = b0;
  }
  return start;
}

/** Selected inversion of the dense trailing block b0..b1 (rows of column j: j + 1..b1, in order). */
function invertBlock(f: LdlFactor, b0: number, b1: number, zx: Float64Array, zd: Float64Array): void {
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
}
