/**
 * Sparse LDL^T factorisation of a symmetric positive definite matrix in a fill-reducing order
 * (up-looking, row by row along the elimination tree: Davis, "Algorithm 849: A concise sparse
 * Cholesky factorization package", ACM TOMS 31, 2005; Liu, "The role of elimination trees in
 * sparse factorization", SIAM J. Matrix Anal. Appl. 11, 1990).
 *
 * `analyse` is the symbolic step: the elimination tree and the exact count of nonzeros of
 * every column of L, before any number is computed, so a caller can refuse a factor whose
 * fill would be too large. `factor` computes L (unit lower, stored by columns with sorted row
 * indices) and D. Work happens in the permuted numbering k = pinv[i].
 */
/*
 * The records below are classes rather than object literals: the JavaScript engine (V8) retypes
 * the fields of an object literal when the literal is evaluated a second time, which throws away
 * the compiled code of every loop that reads them, so the second plan of a session would run
 * slowly again. Class instances keep their field types.
 */
export class SpdMatrix {
  constructor(
    readonly n: number,
    /** Off-diagonal entries as symmetric CSR rows (row i lists j != i with value a_ij). */
    readonly rowStart: Int32Array,
    readonly col: Int32Array,
    readonly val: Float64Array,
    readonly diag: Float64Array,
  ) {}
}

export class Symbolic {
  constructor(
    readonly n: number,
    readonly perm: Int32Array,
    readonly pinv: Int32Array,
    readonly parent: Int32Array,
    /** Nonzeros below the diagonal per column of L. */
    readonly colCount: Int32Array,
    /** Column starts of L (length n + 1). */
    readonly colStart: Int32Array,
    /** Nonzeros of L below the diagonal (the fill estimate), and sum of squared column counts (work). */
    readonly nnz: number,
    readonly flops: number,
  ) {}
}

export class LdlFactor {
  constructor(
    readonly sym: Symbolic,
    readonly rowIdx: Int32Array,
    readonly lx: Float64Array,
    readonly d: Float64Array,
    /** 1 for the columns of dense trailing blocks (rows of column j: j + 1 up to the block's last). */
    readonly inBlock: Uint8Array,
    /** The dense trailing blocks as column ranges, ascending: [b0, b1 + 1, b0', b1' + 1, ...]. */
    readonly blockRanges: Int32Array,
  ) {}
}

export function analyse(a: SpdMatrix, perm: Int32Array): Symbolic {
  return analyseWithin(a, perm, Infinity, Infinity)!;
}

/**
 * The symbolic step on the pattern alone; null as soon as the factor is known to have more than
 * `maxNnz` nonzeros or more work (sum of squared column counts, counted as they grow) than `maxWork`.
 */
export function analyseWithin(
  a: Pick<SpdMatrix, 'n' | 'rowStart' | 'col'>,
  perm: Int32Array,
  maxNnz: number,
  maxWork: number,
): Symbolic | null {
  const n = a.n;
  const pinv = new Int32Array(n);
  invertPermutation(perm, pinv);
  const parent = new Int32Array(n).fill(-1);
  const count = new Int32Array(n);
  if (!eliminationTree(a, perm, pinv, parent, count, new Int32Array(n), maxNnz, maxWork)) return null;
  const colStart = new Int32Array(n + 1);
  const flops = columnStarts(count, colStart);
  return new Symbolic(n, perm, pinv, parent, count, colStart, colStart[n], flops);
}

function invertPermutation(perm: Int32Array, pinv: Int32Array): void {
  for (let k = 0; k < perm.length; k++) pinv[perm[k]] = k;
}

/**
 * The elimination tree (parent) and the count of every column of L below the diagonal, by walking
 * the row subtrees; false as soon as the nonzeros so far pass `maxNnz` or the work (sum of squared
 * column counts, counted as they grow) passes `maxWork`.
 */
function eliminationTree(
  a: Pick<SpdMatrix, 'n' | 'rowStart' | 'col'>,
  perm: Int32Array,
  pinv: Int32Array,
  parent: Int32Array,
  count: Int32Array,
  flag: Int32Array,
  maxNnz: number,
  maxWork: number,
): boolean {
  let seen = 0;
  let work = 0;
  for (let k = 0; k < a.n; k++) {
    flag[k] = k;
    const kk = perm[k];
    for (let p = a.rowStart[kk]; p < a.rowStart[kk + 1]; p++) {
      let i = pinv[a.col[p]];
      if (i >= k) continue;
      for (; flag[i] !== k; i = parent[i]) {
        if (parent[i] === -1) parent[i] = k;
        work += 2 * count[i] + 1;
        count[i]++;
        flag[i] = k;
        seen++;
      }
    }
    if (seen > maxNnz || work > maxWork) return false;
  }
  return true;
}

/** colStart from the column counts; returns the sum of their squares (the work). */
function columnStarts(count: Int32Array, colStart: Int32Array): number {
  let flops = 0;
  for (let k = 0; k < count.length; k++) {
    colStart[k + 1] = colStart[k] + count[k];
    flops += count[k] * count[k];
  }
  return flops;
}

/** Smallest and largest dense trailing block given dense treatment (the selected inversion keeps s^2 doubles). */
const MIN_BLOCK = 16;
const MAX_BLOCK = 2048;

/**
 * For every root b1 of the elimination tree with an empty column: the first column b0 of the
 * longest chain b0..b1 with parent j + 1 and one more row than the next column (so the rows of
 * column j are exactly j + 1..b1). blockStart[b1] = b0 for chains of MIN_BLOCK..MAX_BLOCK columns, else -1.
 */
export function trailingBlocks(sym: Symbolic): Int32Array {
  const { n, parent, colCount } = sym;
  const start = new Int32Array(n).fill(-1);
  for (let b1 = 0; b1 < n; b1++) {
    if (parent[b1] !== -1 || colCount[b1] !== 0) continue;
    let b0 = b1;
    while (b0 > 0 && parent[b0 - 1] === b0 && colCount[b0 - 1] === colCount[b0] + 1 && b1 - b0 + 1 < MAX_BLOCK) b0--;
    if (b1 - b0 + 1 >= MIN_BLOCK) start[b1] = b0;
  }
  return start;
}

/** The dense trailing blocks of `trailingBlocks` as ascending column ranges [b0, b1 + 1, ...]. */
export function blockRanges(sym: Symbolic): Int32Array {
  const start = trailingBlocks(sym);
  const out: number[] = [];
  for (let b1 = 0; b1 < sym.n; b1++) if (start[b1] >= 0) out.push(start[b1], b1 + 1);
  return Int32Array.from(out);
}

/*
 * The loops below are written as small functions of one loop each, called once per row, column or
 * block: the JavaScript engine then compiles each with complete type information within the first
 * factorisation (a long function with several loops is compiled while it runs, before its later
 * loops have run, and falls back to slow code at every call). The arithmetic and its order are
 * those of the plain loops.
 */

/** Numeric LDL^T; throws when a pivot is not positive (the matrix is not positive definite). */
export function factor(a: SpdMatrix, sym: Symbolic): LdlFactor {
  const n = sym.n;
  const ranges = blockRanges(sym);
  const inBlock = new Uint8Array(n);
  for (let q = 0; q < ranges.length; q += 2) inBlock.fill(1, ranges[q], ranges[q + 1]);
  const f = new LdlFactor(sym, new Int32Array(sym.nnz), new Float64Array(sym.nnz), new Float64Array(n), inBlock, ranges);
  const w = new RowWork(n);
  for (let k = 0; k < n; k++) factorRow(a, f, w, k);
  return f;
}

/** Work arrays of the up-looking factorisation (y all zero between rows). */
class RowWork {
  readonly y: Float64Array;
  readonly pattern: Int32Array;
  readonly flag: Int32Array;
  /** Entries of each column of L computed so far. */
  readonly fillAt: Int32Array;
  constructor(n: number) {
    this.y = new Float64Array(n);
    this.pattern = new Int32Array(n);
    this.flag = new Int32Array(n);
    this.fillAt = new Int32Array(n);
  }
}

/** Row k of L and d_k: scatter row k of A, find its pattern (row subtree), eliminate along it. */
function factorRow(a: SpdMatrix, f: LdlFactor, w: RowWork, k: number): void {
  const top = scatterRow(a, f.sym, w, k);
  const dk = eliminateRow(f, w, k, top);
  if (!(dk > 0)) throw new Error(`The matrix is not positive definite (pivot ${dk} at step ${k}).`);
  f.d[k] = dk;
}

/** y = row k of A (columns up to k); the nonzero pattern of row k of L in pattern[top..n), topologically ordered. Returns top. */
function scatterRow(a: SpdMatrix, sym: Symbolic, w: RowWork, k: number): number {
  const { n, perm, pinv, parent } = sym;
  const { y, pattern, flag } = w;
  let top = n;
  flag[k] = k;
  const kk = perm[k];
  y[k] = a.diag[kk];
  for (let p = a.rowStart[kk]; p < a.rowStart[kk + 1]; p++) {
    let i = pinv[a.col[p]];
    if (i > k) continue;
    y[i] += a.val[p];
    let len = 0;
    for (; flag[i] !== k; i = parent[i]) {
      pattern[len++] = i;
      flag[i] = k;
    }
    while (len > 0) pattern[--top] = pattern[--len];
  }
  return top;
}

/** The up-looking step for row k along pattern[top..n): appends L_ki to each column i; returns d_k. */
function eliminateRow(f: LdlFactor, w: RowWork, k: number, top: number): number {
  const { rowIdx, lx, d, inBlock } = f;
  const { colStart } = f.sym;
  const { y, pattern, fillAt } = w;
  const n = pattern.length;
  let dk = y[k];
  y[k] = 0;
  for (; top < n; top++) {
    const i = pattern[top];
    const yi = y[i];
    y[i] = 0;
    const p0 = colStart[i];
    const p2 = p0 + fillAt[i];
    // Column i of a dense trailing block: its rows so far are i + 1, ..., k - 1.
    if (inBlock[i]) subtractShifted(y, lx, p0, p2, i + 1 - p0, yi);
    else subtractScattered(y, rowIdx, lx, p0, p2, yi);
    const lki = yi / d[i];
    dk -= lki * yi;
    rowIdx[p2] = k;
    lx[p2] = lki;
    fillAt[i]++;
  }
  return dk;
}

/** y[rowIdx[p]] -= lx[p] t for p in [p0, p1). */
function subtractScattered(y: Float64Array, rowIdx: Int32Array, lx: Float64Array, p0: number, p1: number, t: number): void {
  for (let p = p0; p < p1; p++) y[rowIdx[p]] -= lx[p] * t;
}

/** y[p + shift] -= lx[p] t for p in [p0, p1) (a column of a dense block). */
function subtractShifted(y: Float64Array, lx: Float64Array, p0: number, p1: number, shift: number, t: number): void {
  for (let p = p0; p < p1; p++) y[p + shift] -= lx[p] * t;
}

/** s - sum of lx[p] y[rowIdx[p]] for p in [p0, p1), subtracted in order. */
function gatherScattered(s: number, y: Float64Array, rowIdx: Int32Array, lx: Float64Array, p0: number, p1: number): number {
  for (let p = p0; p < p1; p++) s -= lx[p] * y[rowIdx[p]];
  return s;
}

/** s - sum of lx[p] y[p + shift] for p in [p0, p1), subtracted in order. */
function gatherShifted(s: number, y: Float64Array, lx: Float64Array, p0: number, p1: number, shift: number): number {
  for (let p = p0; p < p1; p++) s -= lx[p] * y[p + shift];
  return s;
}

/** x = A^-1 b (original numbering); `work` (length n) may be passed to avoid allocation. */
export function ldlSolve(f: LdlFactor, b: Float64Array, out?: Float64Array, work?: Float64Array): Float64Array {
  const { n, perm } = f.sym;
  const y = work ?? new Float64Array(n);
  const x = out ?? new Float64Array(n);
  gather(y, b, perm);
  forwardSolve(f, y);
  divide(y, f.d);
  backSolve(f, y);
  scatter(x, y, perm);
  return x;
}

/** y[k] = b[perm[k]]. */
function gather(y: Float64Array, b: Float64Array, perm: Int32Array): void {
  for (let k = 0; k < perm.length; k++) y[k] = b[perm[k]];
}

/** x[perm[k]] = y[k]. */
function scatter(x: Float64Array, y: Float64Array, perm: Int32Array): void {
  for (let k = 0; k < perm.length; k++) x[perm[k]] = y[k];
}

function divide(y: Float64Array, d: Float64Array): void {
  for (let j = 0; j < d.length; j++) y[j] /= d[j];
}

/** y = L^-1 y, by runs of sparse columns and dense blocks. */
function forwardSolve(f: LdlFactor, y: Float64Array): void {
  const r = f.blockRanges;
  let j = 0;
  for (let q = 0; q < r.length; q += 2) {
    forwardSparse(f, y, j, r[q]);
    forwardDense(f, y, r[q], r[q + 1]);
    j = r[q + 1];
  }
  forwardSparse(f, y, j, f.sym.n);
}

function forwardSparse(f: LdlFactor, y: Float64Array, j0: number, j1: number): void {
  const { rowIdx, lx } = f;
  const { colStart } = f.sym;
  for (let j = j0; j < j1; j++) {
    const yj = y[j];
    if (yj !== 0) subtractScattered(y, rowIdx, lx, colStart[j], colStart[j + 1], yj);
  }
}

function forwardDense(f: LdlFactor, y: Float64Array, j0: number, j1: number): void {
  const { lx } = f;
  const { colStart } = f.sym;
  for (let j = j0; j < j1; j++) {
    const yj = y[j];
    if (yj !== 0) subtractShifted(y, lx, colStart[j], colStart[j + 1], j + 1 - colStart[j], yj);
  }
}

/** y = L^-T y, from the last column back. */
function backSolve(f: LdlFactor, y: Float64Array): void {
  const r = f.blockRanges;
  let j = f.sym.n;
  for (let q = r.length - 2; q >= 0; q -= 2) {
    backSparse(f, y, r[q + 1], j);
    backDense(f, y, r[q], r[q + 1]);
    j = r[q];
  }
  backSparse(f, y, 0, j);
}

function backSparse(f: LdlFactor, y: Float64Array, j0: number, j1: number): void {
  const { rowIdx, lx } = f;
  const { colStart } = f.sym;
  for (let j = j1 - 1; j >= j0; j--) y[j] = gatherScattered(y[j], y, rowIdx, lx, colStart[j], colStart[j + 1]);
}

function backDense(f: LdlFactor, y: Float64Array, j0: number, j1: number): void {
  const { lx } = f;
  const { colStart } = f.sym;
  for (let j = j1 - 1; j >= j0; j--) y[j] = gatherShifted(y[j], y, lx, colStart[j], colStart[j + 1], j + 1 - colStart[j]);
}

/** y = A x. */
export function spdMul(a: SpdMatrix, x: Float64Array, y: Float64Array): void {
  for (let i = 0; i < a.n; i++) {
    let s = a.diag[i] * x[i];
    for (let p = a.rowStart[i]; p < a.rowStart[i + 1]; p++) s += a.val[p] * x[a.col[p]];
    y[i] = s;
  }
}
