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
export interface SpdMatrix {
  readonly n: number;
  /** Off-diagonal entries as symmetric CSR rows (row i lists j != i with value a_ij). */
  readonly rowStart: Int32Array;
  readonly col: Int32Array;
  readonly val: Float64Array;
  readonly diag: Float64Array;
}

export interface Symbolic {
  readonly n: number;
  readonly perm: Int32Array;
  readonly pinv: Int32Array;
  readonly parent: Int32Array;
  /** Nonzeros below the diagonal per column of L. */
  readonly colCount: Int32Array;
  /** Column starts of L (length n + 1). */
  readonly colStart: Int32Array;
  /** Nonzeros of L below the diagonal (the fill estimate), and sum of squared column counts (work). */
  readonly nnz: number;
  readonly flops: number;
}

export interface LdlFactor {
  readonly sym: Symbolic;
  readonly rowIdx: Int32Array;
  readonly lx: Float64Array;
  readonly d: Float64Array;
  /** 1 for the columns of dense trailing blocks (rows of column j: j + 1 up to the block's last). */
  readonly inBlock: Uint8Array;
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
  let seen = 0;
  let work = 0;
  const pinv = new Int32Array(n);
  for (let k = 0; k < n; k++) pinv[perm[k]] = k;
  const parent = new Int32Array(n).fill(-1);
  const flag = new Int32Array(n);
  const count = new Int32Array(n);
  for (let k = 0; k < n; k++) {
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
    if (seen > maxNnz || work > maxWork) return null;
  }
  const colStart = new Int32Array(n + 1);
  let flops = 0;
  for (let k = 0; k < n; k++) {
    colStart[k + 1] = colStart[k] + count[k];
    flops += count[k] * count[k];
  }
  return { n, perm, pinv, parent, colCount: count, colStart, nnz: colStart[n], flops };
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

/** Numeric LDL^T; throws when a pivot is not positive (the matrix is not positive definite). */
export function factor(a: SpdMatrix, sym: Symbolic): LdlFactor {
  const { n, perm, pinv, parent, colStart } = sym;
  const rowIdx = new Int32Array(sym.nnz);
  const lx = new Float64Array(sym.nnz);
  const d = new Float64Array(n);
  const y = new Float64Array(n);
  const pattern = new Int32Array(n);
  const flag = new Int32Array(n);
  const fillAt = new Int32Array(n);
  const inBlock = new Uint8Array(n);
  const blockStart = trailingBlocks(sym);
  for (let b1 = 0; b1 < n; b1++) if (blockStart[b1] >= 0) inBlock.fill(1, blockStart[b1], b1 + 1);
  for (let k = 0; k < n; k++) {
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
    let dk = y[k];
    y[k] = 0;
    for (; top < n; top++) {
      const i = pattern[top];
      const yi = y[i];
      y[i] = 0;
      const p2 = colStart[i] + fillAt[i];
      if (inBlock[i]) {
        // Column i of a dense trailing block: its rows so far are i + 1, ..., k - 1.
        const shift = i + 1 - colStart[i];
        for (let p = colStart[i]; p < p2; p++) y[p + shift] -= lx[p] * yi;
      } else for (let p = colStart[i]; p < p2; p++) y[rowIdx[p]] -= lx[p] * yi;
      const lki = yi / d[i];
      dk -= lki * yi;
      rowIdx[p2] = k;
      lx[p2] = lki;
      fillAt[i]++;
    }
    if (!(dk > 0)) throw new Error(`The matrix is not positive definite (pivot ${dk} at step ${k}).`);
    d[k] = dk;
  }
  return { sym, rowIdx, lx, d, inBlock };
}

/** x = A^-1 b (original numbering); `work` (length n) may be passed to avoid allocation. */
export function ldlSolve(f: LdlFactor, b: Float64Array, out?: Float64Array, work?: Float64Array): Float64Array {
  const { n, perm, colStart } = f.sym;
  const { rowIdx, lx, d, inBlock } = f;
  const y = work ?? new Float64Array(n);
  for (let k = 0; k < n; k++) y[k] = b[perm[k]];
  for (let j = 0; j < n; j++) {
    const yj = y[j];
    if (yj === 0) continue;
    const p1 = colStart[j + 1];
    if (inBlock[j]) {
      const shift = j + 1 - colStart[j];
      for (let p = colStart[j]; p < p1; p++) y[p + shift] -= lx[p] * yj;
    } else for (let p = colStart[j]; p < p1; p++) y[rowIdx[p]] -= lx[p] * yj;
  }
  for (let j = 0; j < n; j++) y[j] /= d[j];
  for (let j = n - 1; j >= 0; j--) {
    let s = y[j];
    const p1 = colStart[j + 1];
    if (inBlock[j]) {
      const shift = j + 1 - colStart[j];
      for (let p = colStart[j]; p < p1; p++) s -= lx[p] * y[p + shift];
    } else for (let p = colStart[j]; p < p1; p++) s -= lx[p] * y[rowIdx[p]];
    y[j] = s;
  }
  const x = out ?? new Float64Array(n);
  for (let k = 0; k < n; k++) x[perm[k]] = y[k];
  return x;
}

/** y = A x. */
export function spdMul(a: SpdMatrix, x: Float64Array, y: Float64Array): void {
  for (let i = 0; i < a.n; i++) {
    let s = a.diag[i] * x[i];
    for (let p = a.rowStart[i]; p < a.rowStart[i + 1]; p++) s += a.val[p] * x[a.col[p]];
    y[i] = s;
  }
}
