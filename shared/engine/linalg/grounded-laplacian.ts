/**
 * The grounded Laplacian K = (D - W)_TT of an undirected room as its own compact CSR (rows of
 * the grounded people empty, their columns dropped), with a fused Jacobi-preconditioned
 * conjugate-gradient solve (Hestenes & Stiefel 1952; Saad, Iterative Methods for Sparse Linear
 * Systems, 2003, alg. 9.1). Vectors are full length; grounded entries stay 0.
 * Cost: O(m) to build, O(m) per iteration.
 */
import type { Csr } from '../graph';

export interface CgOutcome {
  readonly iterations: number;
  readonly relativeResidual: number;
  readonly converged: boolean;
}

export class GroundedLaplacian {
  readonly n: number;
  readonly active: Uint8Array;
  readonly diag: Float64Array;
  readonly rowStart: Int32Array;
  readonly col: Int32Array;
  /** Off-diagonal entries, already negated: K_ij = -w_ij. */
  readonly val: Float64Array;
  iterations = 0;
  solves = 0;
  private readonly r: Float64Array;
  private readonly z: Float64Array;
  private readonly p: Float64Array;
  private readonly q: Float64Array;
  private readonly minv: Float64Array;
  /** r^T r and r^T z of the last step. */
  private readonly sums = new Float64Array(2);

  constructor(csr: Csr, grounded: Uint8Array) {
    const n = (this.n = grounded.length);
    const active = (this.active = new Uint8Array(n));
    for (let i = 0; i < n; i++) active[i] = grounded[i] ? 0 : 1;
    this.diag = new Float64Array(n);
    this.rowStart = new Int32Array(n + 1);
    const nnz = countKept(csr, active);
    this.col = new Int32Array(nnz);
    this.val = new Float64Array(nnz);
    fillRows(csr, active, this.diag, this.rowStart, this.col, this.val);
    this.minv = new Float64Array(n);
    for (let i = 0; i < n; i++) this.minv[i] = this.diag[i] > 0 ? 1 / this.diag[i] : 0;
    this.r = new Float64Array(n);
    this.z = new Float64Array(n);
    this.p = new Float64Array(n);
    this.q = new Float64Array(n);
  }

  /** y = K x (y is 0 on grounded people). */
  mul(x: Float64Array, y: Float64Array): void {
    const { n, diag, rowStart, col, val } = this;
    for (let i = 0; i < n; i++) {
      let acc = diag[i] * x[i];
      for (let e = rowStart[i]; e < rowStart[i + 1]; e++) acc += val[e] * x[col[e]];
      y[i] = acc;
    }
  }

  /** q = K p; returns p^T q (one pass). */
  private mulDot(p: Float64Array, q: Float64Array): number {
    const { n, diag, rowStart, col, val } = this;
    let pq = 0;
    for (let i = 0; i < n; i++) {
      const pi = p[i];
      let acc = diag[i] * pi;
      for (let e = rowStart[i]; e < rowStart[i + 1]; e++) acc += val[e] * p[col[e]];
      q[i] = acc;
      pq += pi * acc;
    }
    return pq;
  }

  /**
   * x with K x = b to relative residual `tol` (x0 = 0 unless given; b must be 0 on grounded
   * people). Returns the outcome; `x` holds the solution.
   */
  solve(b: Float64Array, x: Float64Array, tol: number, maxIterations = 20_000): CgOutcome {
    const { n, r, z, p, q, minv } = this;
    this.mul(x, q);
    let bb = 0;
    for (let i = 0; i < n; i++) {
      const ri = b[i] - q[i];
      r[i] = ri;
      bb += b[i] * b[i];
    }
    const bnorm = Math.sqrt(bb) || 1;
    let rz = precondition(r, minv, z, p);
    let res = norm(r) / bnorm;
    let it = 0;
    const sums = this.sums;
    while (res > tol && it < maxIterations) {
      const pq = this.mulDot(p, q);
      if (!(pq > 0)) break;
      step(rz / pq, x, p, q, r, z, minv, sums);
      res = Math.sqrt(sums[0]) / bnorm;
      it++;
      if (res <= tol) break;
      const rzNew = sums[1];
      direction(z, rzNew / rz, p);
      rz = rzNew;
    }
    this.iterations += it;
    this.solves++;
    return { iterations: it, relativeResidual: res, converged: res <= tol };
  }
}

function countKept(csr: Csr, active: Uint8Array): number {
  let nnz = 0;
  for (let i = 0; i < active.length; i++) {
    if (!active[i]) continue;
    for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) if (csr.col[e] !== i && active[csr.col[e]]) nnz++;
  }
  return nnz;
}

/** The kept rows: K_ii = d_i - w_ii (a self-tie keeps the walk in place), K_ij = -w_ij. */
function fillRows(csr: Csr, active: Uint8Array, diag: Float64Array, rowStart: Int32Array, col: Int32Array, val: Float64Array): void {
  let at = 0;
  for (let i = 0; i < active.length; i++) {
    rowStart[i] = at;
    if (!active[i]) continue;
    let dii = csr.outStrength[i];
    for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) {
      const j = csr.col[e];
      if (j === i) dii -= csr.weight[e];
      else if (active[j]) {
        col[at] = j;
        val[at++] = -csr.weight[e];
      }
    }
    diag[i] = dii;
  }
  rowStart[active.length] = at;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

function norm(a: Float64Array): number {
  return Math.sqrt(dot(a, a));
}

/** z = M^-1 r, p = z; returns r^T z. */
function precondition(r: Float64Array, minv: Float64Array, z: Float64Array, p: Float64Array): number {
  let rz = 0;
  for (let i = 0; i < r.length; i++) {
    const zi = minv[i] * r[i];
    z[i] = zi;
    p[i] = zi;
    rz += r[i] * zi;
  }
  return rz;
}

/** x += alpha p, r -= alpha q, z = M^-1 r; sums = [r^T r, r^T z]. */
function step(
  alpha: number,
  x: Float64Array,
  p: Float64Array,
  q: Float64Array,
  r: Float64Array,
  z: Float64Array,
  minv: Float64Array,
  sums: Float64Array,
): void {
  let rr = 0;
  let rz = 0;
  for (let i = 0; i < x.length; i++) {
    x[i] += alpha * p[i];
    const ri = (r[i] -= alpha * q[i]);
    const zi = minv[i] * ri;
    rr += ri * ri;
    rz += ri * zi;
    z[i] = zi;
  }
  sums[0] = rr;
  sums[1] = rz;
}

function direction(z: Float64Array, beta: number, p: Float64Array): void {
  for (let i = 0; i < p.length; i++) p[i] = z[i] + beta * p[i];
}
