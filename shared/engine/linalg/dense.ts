/**
 * Dense kernels over row-major Float64Array matrices: LU with partial pivoting
 * (Golub & Van Loan, Matrix Computations, alg. 3.4.1; (2/3) n^3 flops), Cholesky
 * (alg. 4.2.1; n^3 / 3 flops) and Gauss-Jordan inversion with partial pivoting (2 n^3 flops).
 * Inner loops run along rows so they stay cache-friendly.
 */
import { EngineError } from '../errors';

/** y[from..to) -= f * x[xFrom + (j - from)], unrolled by four (V8 does not vectorise). */
export function axpySub(y: Float64Array, yOff: number, x: Float64Array, xOff: number, len: number, f: number): void {
  let j = 0;
  const end = len - 3;
  for (; j < end; j += 4) {
    y[yOff + j] -= f * x[xOff + j];
    y[yOff + j + 1] -= f * x[xOff + j + 1];
    y[yOff + j + 2] -= f * x[xOff + j + 2];
    y[yOff + j + 3] -= f * x[xOff + j + 3];
  }
  for (; j < len; j++) y[yOff + j] -= f * x[xOff + j];
}

export interface LuFactors {
  readonly n: number;
  readonly lu: Float64Array;
  readonly piv: Int32Array;
}

/** Partial pivoting: the row at or below k with the largest entry in column k; SOLVER_FAILED when that column is all zero. */
function pivotRow(a: Float64Array, n: number, k: number, what: 'system' | 'matrix'): number {
  let p = k;
  let best = Math.abs(a[k * n + k]);
  for (let i = k + 1; i < n; i++) {
    const v = Math.abs(a[i * n + k]);
    if (v > best) {
      best = v;
      p = i;
    }
  }
  if (!(best > 0)) throw new EngineError('SOLVER_FAILED', `The ${what} is singular: some people cannot reach any starter.`);
  return p;
}

/** Factors a (overwritten) as P A = L U. Throws SOLVER_FAILED on a singular matrix. */
export function luFactor(a: Float64Array, n: number): LuFactors {
  const piv = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const p = pivotRow(a, n, k, 'system');
    piv[k] = p;
    if (p !== k) {
      const rk = k * n;
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        const t = a[rk + j];
        a[rk + j] = a[rp + j];
        a[rp + j] = t;
      }
    }
    const rk = k * n;
    const inv = 1 / a[rk + k];
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const l = a[ri + k] * inv;
      a[ri + k] = l;
      if (l === 0) continue;
      axpySub(a, ri + k + 1, a, rk + k + 1, n - k - 1, l);
    }
  }
  return { n, lu: a, piv };
}

/**
 * LU without pivoting for diagonally dominant M-matrices such as I - Q (Gaussian elimination is
 * stable there without pivoting: Wilkinson 1961; Golub & Van Loan section 3.4.3). Zero
 * multipliers are skipped and sparse pivot rows are applied entry by entry, so a room put in
 * minimum degree order keeps its factor sparse for longer.
 */
export function luFactorDominant(a: Float64Array, n: number): LuFactors {
  const piv = new Int32Array(n);
  const list = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    piv[k] = k;
    const rk = k * n;
    const d = a[rk + k];
    if (!(d > 0)) throw new EngineError('SOLVER_FAILED', 'The system is singular: some people cannot reach any starter.');
    const inv = 1 / d;
    let cnt = 0;
    for (let j = k + 1; j < n; j++) if (a[rk + j] !== 0) list[cnt++] = j;
    const dense = cnt * 4 > n - k;
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      if (a[ri + k] === 0) continue;
      const l = a[ri + k] * inv;
      a[ri + k] = l;
      if (cnt === 0) continue;
      if (dense) axpySub(a, ri + k + 1, a, rk + k + 1, n - k - 1, l);
      else for (let q = 0; q < cnt; q++) a[ri + list[q]] -= l * a[rk + list[q]];
    }
  }
  return { n, lu: a, piv };
}

/** Solves A x = b in place of b using the factors. */
export function luSolve(f: LuFactors, b: Float64Array): Float64Array {
  const { n, lu, piv } = f;
  for (let k = 0; k < n; k++) {
    const p = piv[k];
    if (p !== k) {
      const t = b[k];
      b[k] = b[p];
      b[p] = t;
    }
  }
  for (let i = 0; i < n; i++) {
    let s = b[i];
    const ri = i * n;
    for (let j = 0; j < i; j++) s -= lu[ri + j] * b[j];
    b[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i];
    const ri = i * n;
    for (let j = i + 1; j < n; j++) s -= lu[ri + j] * b[j];
    b[i] = s / lu[ri + i];
  }
  return b;
}

/** Solves A^T x = b in place of b using the factors of A. */
export function luSolveTransposed(f: LuFactors, b: Float64Array): Float64Array {
  const { n, lu, piv } = f;
  // A^T = U^T L^T P, so solve U^T z = b, L^T y = z, x = P^T y.
  for (let i = 0; i < n; i++) {
    b[i] /= lu[i * n + i];
    subtractRow(lu, n, i, b, i + 1, n);
  }
  for (let i = n - 1; i >= 0; i--) subtractRowLower(lu, n, i, b);
  for (let k = n - 1; k >= 0; k--) {
    const p = piv[k];
    if (p !== k) {
      const t = b[k];
      b[k] = b[p];
      b[p] = t;
    }
  }
  return b;
}

function subtractRow(lu: Float64Array, n: number, i: number, b: Float64Array, from: number, to: number): void {
  const ri = i * n;
  const bi = b[i];
  if (bi === 0) return;
  for (let j = from; j < to; j++) b[j] -= lu[ri + j] * bi;
}

function subtractRowLower(lu: Float64Array, n: number, i: number, b: Float64Array): void {
  const ri = i * n;
  const bi = b[i];
  if (bi === 0) return;
  for (let j = 0; j < i; j++) b[j] -= lu[ri + j] * bi;
}

/** Cholesky A = L L^T of a symmetric positive definite matrix (lower triangle used, overwritten). */
export function choleskyFactor(a: Float64Array, n: number): Float64Array {
  for (let j = 0; j < n; j++) {
    const rj = j * n;
    let d = a[rj + j];
    for (let k = 0; k < j; k++) d -= a[rj + k] * a[rj + k];
    if (!(d > 0)) throw new EngineError('SOLVER_FAILED', 'The system is not positive definite: some people cannot reach any starter.');
    const ljj = Math.sqrt(d);
    a[rj + j] = ljj;
    const inv = 1 / ljj;
    for (let i = j + 1; i < n; i++) {
      const ri = i * n;
      let s = a[ri + j];
      for (let k = 0; k < j; k++) s -= a[ri + k] * a[rj + k];
      a[ri + j] = s * inv;
    }
  }
  return a;
}

export function choleskySolve(l: Float64Array, n: number, b: Float64Array): Float64Array {
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    let s = b[i];
    for (let k = 0; k < i; k++) s -= l[ri + k] * b[k];
    b[i] = s / l[ri + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    const bi = (b[i] /= l[i * n + i]);
    const ri = i * n;
    if (bi !== 0) for (let k = 0; k < i; k++) b[k] -= l[ri + k] * bi;
  }
  return b;
}

/**
 * Symmetric positive definite factor by right-looking elimination on the upper triangle
 * (LDL^T without pivoting, equivalent to Cholesky; n^3 / 6 multiply-adds). Row-oriented
 * updates stay contiguous, and zero multipliers (no tie) are skipped.
 */
export function symmetricFactor(a: Float64Array, n: number): Float64Array {
  const list = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const rk = k * n;
    const piv = a[rk + k];
    if (!(piv > 0)) throw new EngineError('SOLVER_FAILED', 'The system is not positive definite: some people cannot reach any starter.');
    const inv = 1 / piv;
    // Pattern of row k beyond the diagonal: sparse rows (early pivots of a well-ordered
    // sparse room) are updated entry by entry, dense rows with contiguous axpy.
    let cnt = 0;
    for (let j = k + 1; j < n; j++) if (a[rk + j] !== 0) list[cnt++] = j;
    if (cnt === 0) continue;
    if (cnt * 4 > n - k) {
      for (let p = 0; p < cnt; p++) {
        const i = list[p];
        axpySub(a, i * n + i, a, rk + i, n - i, a[rk + i] * inv);
      }
    } else {
      for (let p = 0; p < cnt; p++) {
        const i = list[p];
        const l = a[rk + i] * inv;
        const ri = i * n;
        for (let q = p; q < cnt; q++) {
          const j = list[q];
          a[ri + j] -= l * a[rk + j];
        }
      }
    }
  }
  return a;
}

/** Solves with the factor of symmetricFactor, in place of b. */
export function symmetricSolve(u: Float64Array, n: number, b: Float64Array): Float64Array {
  for (let k = 0; k < n; k++) {
    const bk = b[k];
    if (bk === 0) continue;
    const rk = k * n;
    const f = bk / u[rk + k];
    for (let i = k + 1; i < n; i++) b[i] -= u[rk + i] * f;
  }
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * n;
    let s = b[i];
    for (let j = i + 1; j < n; j++) s -= u[ri + j] * b[j];
    b[i] = s / u[ri + i];
  }
  return b;
}

/**
 * Inverse of a symmetric positive definite matrix by the sweep operator (Beaton 1964;
 * Goodnight, "A tutorial on the SWEEP operator", 1979) on the upper triangle only:
 * n^3 / 2 multiply-adds, half of Gauss-Jordan. a is overwritten by the full inverse.
 */
export function invertSymmetricInPlace(a: Float64Array, n: number): Float64Array {
  const col = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const rk = k * n;
    const d = a[rk + k];
    if (!(d > 0)) throw new EngineError('SOLVER_FAILED', 'The matrix is not positive definite.');
    // col[j] = a_jk (upper-triangle storage), the pivot row/column of the sweep.
    for (let j = 0; j < k; j++) col[j] = a[j * n + k];
    for (let j = k; j < n; j++) col[j] = a[rk + j];
    const inv = 1 / d;
    for (let i = 0; i < n; i++) {
      if (i === k) continue;
      const f = col[i] * inv;
      if (f === 0) continue;
      const ri = i * n;
      axpySub(a, ri + i, col, i, n - i, f);
    }
    // Pivot row and column: a_ik <- a_ik / d (sign fixed at the end), a_kk <- -1 / d.
    for (let j = 0; j < k; j++) a[j * n + k] = col[j] * inv;
    for (let j = k + 1; j < n; j++) a[rk + j] = col[j] * inv;
    a[rk + k] = -inv;
  }
  // The sweep leaves -A^-1; negate and mirror the upper triangle.
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    for (let j = i; j < n; j++) {
      const v = -a[ri + j];
      a[ri + j] = v;
      a[j * n + i] = v;
    }
  }
  return a;
}

/** Gauss-Jordan step k: swaps in the row of largest pivot, scales it, copies it into `row`; returns 1 / pivot. */
export function gaussJordanPivot(a: Float64Array, row: Float64Array, perm: Int32Array, n: number, k: number): number {
  const rk = k * n;
  const p = pivotRow(a, n, k, 'matrix');
  if (p !== k) {
    const rp = p * n;
    for (let j = 0; j < n; j++) {
      const t = a[rk + j];
      a[rk + j] = a[rp + j];
      a[rp + j] = t;
    }
    const t = perm[k];
    perm[k] = perm[p];
    perm[p] = t;
  }
  const inv = 1 / a[rk + k];
  a[rk + k] = 1;
  for (let j = 0; j < n; j++) a[rk + j] *= inv;
  for (let j = 0; j < n; j++) row[j] = a[rk + j];
  return inv;
}

/** Inverts a (overwritten) by Gauss-Jordan elimination with partial pivoting. */
export function invertInPlace(a: Float64Array, n: number): Float64Array {
  const perm = new Int32Array(n);
  const row = new Float64Array(n);
  for (let i = 0; i < n; i++) perm[i] = i;
  for (let k = 0; k < n; k++) {
    gaussJordanPivot(a, row, perm, n, k);
    for (let i = 0; i < n; i++) {
      if (i === k) continue;
      const ri = i * n;
      const f = a[ri + k];
      if (f === 0) continue;
      a[ri + k] = 0;
      axpySub(a, ri, row, 0, n, f);
    }
  }
  // Row swaps of A become column swaps of A^-1, undone in reverse order.
  const tmp = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    for (let j = 0; j < n; j++) tmp[perm[j]] = a[ri + j];
    a.set(tmp, ri);
  }
  return a;
}
