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
}

export function analyse(a: SpdMatrix, perm: Int32Array): Symbolic {
  const n = a.n;
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
        count[i]++;
        flag[i] = k;
      }
    }
  }
  const colStart = new Int32Array(n + 1);
  let flops = 0;
  for (let k = 0; k < n; k++) {
    colStart[k + 1] = colStart[k] + count[k];
    flops += count[k] * count[k];
  }
  return { n, perm, pinv, parent, colCount: count, colStart, nnz: colStart[n], flops };
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
      for (let p = colStart[i]; p < p2; p++) y[rowIdx[p]] -= lx[p] * yi;
      const lki = yi / d[i];
      dk -= lki * yi;
      rowIdx[p2] = k;
      lx[p2] = lki;
      fillAt[i]++;
    }
    if (!(dk > 0)) throw new Error(`The matrix is not positive definite (pivot ${dk} at step ${k}).`);
    d[k] = dk;
  }
  return { sym, rowIdx, lx, d };
}

/** x = A^-1 b (original numbering); `work` (length n) may be passed to avoid allocation. */
export function ldlSolve(f: LdlFactor, b: Float64Array, out?: Float64Array, work?: Float64Array): Float64Array {
  const { n, perm, colStart } = f.sym;
  const { rowIdx, lx, d } = f;
  const y = work ?? new Float64Array(n);
  for (let k = 0; k < n; k++) y[k] = b[perm[k]];
  for (let j = 0; j < n; j++) {
    const yj = y[j];
    if (yj === 0) continue;
    for (let p = colStart[j]; p < colStart[j + 1]; p++) y[rowIdx[p]] -= lx[p] * yj;
  }
  for (let j = 0; j < n; j++) y[j] /= d[j];
  for (let j = n - 1; j >= 0; j--) {
    let s = y[j];
    for (let p = colStart[j]; p < colStart[j + 1]; p++) s -= lx[p] * y[rowIdx[p]];
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
