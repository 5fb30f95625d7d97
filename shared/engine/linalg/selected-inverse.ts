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

/** A dense trailing block's inverse: columns b0..b0 + s - 1, z row-major s x s. */
class DenseInverse {
  constructor(
    readonly b0: number,
    readonly s: number,
    readonly z: Float64Array,
  ) {}
}

/** The entries of Z computed so far: zx on the pattern of L, zd the diagonal, and the inverted blocks. */
class Inversion {
  readonly zx: Float64Array;
  readonly zd: Float64Array;
  /** Position in zx of row i of the current column (-1 when i is not in it). */
  readonly pos: Int32Array;
  /** For people inside an inverted block: its index in `blocks`. */
  readonly blockOf: Int32Array;
  readonly blocks: DenseInverse[] = [];
  constructor(readonly f: LdlFactor) {
    const n = f.sym.n;
    this.zx = new Float64Array(f.lx.length);
    this.zd = new Float64Array(n);
    this.pos = new Int32Array(n).fill(-1);
    this.blockOf = new Int32Array(n).fill(-1);
  }
}

/*
 * As in sparse-ldl.ts, each loop is a small function of its own, called once per column or
 * block, so that it is compiled with complete type information early; the arithmetic and its
 * order are those of the plain loops.
 */
export function inverseDiagonal(f: LdlFactor): Float64Array {
  const { n, perm } = f.sym;
  const w = new Inversion(f);
  const r = f.blockRanges;
  let j1 = n;
  for (let q = r.length - 2; q >= 0; q -= 2) {
    invertSparse(w, r[q + 1], j1);
    invertDense(w, r[q], r[q + 1]);
    j1 = r[q];
  }
  invertSparse(w, 0, j1);
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) out[perm[k]] = w.zd[k];
  return out;
}

/** Columns j1 - 1 down to j0 (none of them in a dense block). */
function invertSparse(w: Inversion, j0: number, j1: number): void {
  for (let j = j1 - 1; j >= j0; j--) invertColumn(w, j);
}

/** Z_ij for the rows i of column j, then Z_jj. */
function invertColumn(w: Inversion, j: number): void {
  const { f, zx, pos } = w;
  const { colStart } = f.sym;
  const { rowIdx, lx } = f;
  const a = colStart[j];
  const b = colStart[j + 1];
  for (let p = a; p < b; p++) {
    pos[rowIdx[p]] = p;
    zx[p] = 0;
  }
  for (let p = a; p < b; p++) {
    const l = rowIdx[p];
    const blk = w.blockOf[l];
    // l and every later row of S_j lie in a dense block: Z_il read from it directly.
    if (blk >= 0) zx[p] = fromBlock(w.blocks[blk], l, lx[p], zx[p] - w.zd[l] * lx[p], p + 1, b, rowIdx, lx, zx);
    else zx[p] = fromPattern(w, l, p, b);
  }
  let s = 1 / f.d[j];
  for (let p = a; p < b; p++) {
    s -= lx[p] * zx[p];
    pos[rowIdx[p]] = -1;
  }
  w.zd[j] = s;
}

/**
 * Pairs (i, l) with i > l, both in S_j (l = row of position p): Z_il sits in column l of the
 * pattern. Rows are sorted and S_j after l lies inside S_l, so the scan stops once the b - p - 1
 * rows of S_j after l have been met. Returns Z_lj.
 */
function fromPattern(w: Inversion, l: number, p: number, b: number): number {
  const { f, zx, pos } = w;
  const { rowIdx, lx } = f;
  const llj = lx[p];
  let zlj = zx[p] - w.zd[l] * llj;
  let left = b - p - 1;
  const end = f.sym.colStart[l + 1];
  for (let q = f.sym.colStart[l]; left > 0 && q < end; q++) {
    const at = pos[rowIdx[q]];
    if (at < 0) continue;
    left--;
    const zil = zx[q];
    zx[at] -= zil * llj;
    zlj -= zil * lx[at];
  }
  return zlj;
}

/** Selected inversion of the dense trailing block b0..b1 - 1 (rows of column j: j + 1..b1 - 1, in order). */
function invertDense(w: Inversion, b0: number, b1: number): void {
  const s = b1 - b0;
  const z = new Float64Array(s * s);
  for (let jj = s - 1; jj >= 0; jj--) invertBlockColumn(w, z, b0, s, jj);
  w.blocks.push(new DenseInverse(b0, s, z));
  w.blockOf.fill(w.blocks.length - 1, b0, b1);
}

/** Column jj of the block's inverse from the columns after it (Z_ij = -sum_l Z_il L_lj over contiguous rows). */
function invertBlockColumn(w: Inversion, z: Float64Array, b0: number, s: number, jj: number): void {
  const { lx, d } = w.f;
  const { zx } = w;
  const c = w.f.sym.colStart[b0 + jj] - jj - 1; // lx[c + l] = L(b0 + l, b0 + jj) for l > jj
  let djj = 1 / d[b0 + jj];
  for (let i = jj + 1; i < s; i++) {
    const acc = dotFrom(z, i * s, lx, c, jj + 1, s);
    z[i * s + jj] = -acc;
    z[jj * s + i] = -acc;
    djj += acc * lx[c + i];
  }
  z[jj * s + jj] = djj;
  w.zd[b0 + jj] = djj;
  for (let i = jj + 1; i < s; i++) zx[c + i] = z[i * s + jj];
}

/** Sum of z[row + l] lx[c + l] for l from l0 to l1 - 1, in order. */
function dotFrom(z: Float64Array, row: number, lx: Float64Array, c: number, l0: number, l1: number): number {
  let acc = 0;
  for (let l = l0; l < l1; l++) acc += z[row + l] * lx[c + l];
  return acc;
}

/** Z_ij -= Z_il L_lj and Z_lj -= Z_il L_ij for the rows i of column j at positions from..to - 1, Z_il from the dense block. Returns Z_lj. */
function fromBlock(
  blk: DenseInverse,
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
