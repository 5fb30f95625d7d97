/**
 * Krylov solvers for large sparse rooms, matrix-free (the caller supplies y = A x):
 * - preconditioned conjugate gradient with a Jacobi preconditioner for symmetric
 *   positive definite systems (Hestenes & Stiefel 1952; Saad, Iterative Methods for Sparse
 *   Linear Systems, 2003, alg. 9.1). Cost O(m) per iteration.
 * - BiCGSTAB with a Jacobi preconditioner for nonsymmetric systems (van der Vorst 1992;
 *   Saad alg. 7.7), used for directed rooms and for mixing (a rank-one term).
 * Both stop at relative residual ||b - A x|| <= tol ||b|| and report whether they converged.
 */
export type MatVec = (x: Float64Array, y: Float64Array) => void;

export interface IterativeResult {
  readonly x: Float64Array;
  readonly iterations: number;
  readonly relativeResidual: number;
  readonly converged: boolean;
}

export interface IterativeOptions {
  readonly tol?: number;
  readonly maxIterations?: number;
  /** Indices taking part in the system; the others stay 0 (starters). */
  readonly active?: Uint8Array;
  readonly x0?: Float64Array;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

export function pcg(mul: MatVec, b: Float64Array, diag: Float64Array, opts: IterativeOptions = {}): IterativeResult {
  const n = b.length;
  const tol = opts.tol ?? 1e-12;
  const maxIt = opts.maxIterations ?? Math.max(1000, 10 * Math.ceil(Math.sqrt(n)) * 10);
  const x = opts.x0 ? Float64Array.from(opts.x0) : new Float64Array(n);
  const r = new Float64Array(n);
  const z = new Float64Array(n);
  const p = new Float64Array(n);
  const q = new Float64Array(n);
  const minv = new Float64Array(n);
  for (let i = 0; i < n; i++) minv[i] = diag[i] > 0 ? 1 / diag[i] : 0;
  mul(x, q);
  for (let i = 0; i < n; i++) r[i] = b[i] - q[i];
  const bnorm = Math.sqrt(dot(b, b)) || 1;
  for (let i = 0; i < n; i++) z[i] = minv[i] * r[i];
  p.set(z);
  let rz = dot(r, z);
  let res = Math.sqrt(dot(r, r)) / bnorm;
  let it = 0;
  while (res > tol && it < maxIt) {
    mul(p, q);
    const pq = dot(p, q);
    if (!(pq > 0)) break;
    const alpha = rz / pq;
    let rr = 0;
    for (let i = 0; i < n; i++) {
      x[i] += alpha * p[i];
      const ri = (r[i] -= alpha * q[i]);
      rr += ri * ri;
      z[i] = minv[i] * ri;
    }
    it++;
    res = Math.sqrt(rr) / bnorm;
    if (res <= tol) break;
    const rzNew = dot(r, z);
    const beta = rzNew / rz;
    rz = rzNew;
    for (let i = 0; i < n; i++) p[i] = z[i] + beta * p[i];
  }
  return { x, iterations: it, relativeResidual: res, converged: res <= tol };
}

// eslint-disable-next-line max-lines-per-function -- the iteration reads as the textbook recurrence, step for step; split, its vectors would be passed around each step.
export function bicgstab(mul: MatVec, b: Float64Array, diag: Float64Array, opts: IterativeOptions = {}): IterativeResult {
  const n = b.length;
  const tol = opts.tol ?? 1e-12;
  const maxIt = opts.maxIterations ?? Math.max(2000, 20 * Math.ceil(Math.sqrt(n)) * 10);
  const x = opts.x0 ? Float64Array.from(opts.x0) : new Float64Array(n);
  const minv = new Float64Array(n);
  for (let i = 0; i < n; i++) minv[i] = diag[i] !== 0 ? 1 / diag[i] : 0;
  const r = new Float64Array(n);
  const t = new Float64Array(n);
  mul(x, t);
  for (let i = 0; i < n; i++) r[i] = b[i] - t[i];
  const rhat = Float64Array.from(r);
  const p = new Float64Array(n);
  const v = new Float64Array(n);
  const y = new Float64Array(n);
  const s = new Float64Array(n);
  const zz = new Float64Array(n);
  const bnorm = Math.sqrt(dot(b, b)) || 1;
  let rho = 1;
  let alpha = 1;
  let omega = 1;
  let res = Math.sqrt(dot(r, r)) / bnorm;
  let it = 0;
  let restarts = 0;
  while (res > tol && it < maxIt) {
    const rhoNew = dot(rhat, r);
    if (Math.abs(rhoNew) < 1e-300 || omega === 0) {
      // Breakdown: restart from the current iterate with a fresh shadow residual.
      if (++restarts > 20) break;
      rhat.set(r);
      p.fill(0);
      v.fill(0);
      rho = alpha = omega = 1;
      continue;
    }
    const beta = (rhoNew / rho) * (alpha / omega);
    rho = rhoNew;
    for (let i = 0; i < n; i++) p[i] = r[i] + beta * (p[i] - omega * v[i]);
    for (let i = 0; i < n; i++) y[i] = minv[i] * p[i];
    mul(y, v);
    const rv = dot(rhat, v);
    if (rv === 0) {
      omega = 0; // breakdown: the next pass restarts
      continue;
    }
    alpha = rho / rv;
    for (let i = 0; i < n; i++) s[i] = r[i] - alpha * v[i];
    const snorm = Math.sqrt(dot(s, s)) / bnorm;
    if (snorm <= tol) {
      for (let i = 0; i < n; i++) x[i] += alpha * y[i];
      res = snorm;
      it++;
      break;
    }
    for (let i = 0; i < n; i++) zz[i] = minv[i] * s[i];
    mul(zz, t);
    const tt = dot(t, t);
    omega = tt > 0 ? dot(t, s) / tt : 0;
    let rr = 0;
    for (let i = 0; i < n; i++) {
      x[i] += alpha * y[i] + omega * zz[i];
      const ri = (r[i] = s[i] - omega * t[i]);
      rr += ri * ri;
    }
    res = Math.sqrt(rr) / bnorm;
    it++;
  }
  // Report the true residual, not the recursively updated one.
  mul(x, t);
  let rr = 0;
  for (let i = 0; i < n; i++) {
    const d = b[i] - t[i];
    rr += d * d;
  }
  res = Math.sqrt(rr) / bnorm;
  return { x, iterations: it, relativeResidual: res, converged: res <= Math.max(tol * 10, 1e-10) };
}

/**
 * Restarted GMRES(m) with right Jacobi preconditioning and Givens rotations (Saad & Schultz,
 * "GMRES: a generalized minimal residual algorithm", SIAM J. Sci. Stat. Comput. 1986): the
 * residual never grows, so it serves as the fallback when BiCGSTAB stagnates (for example on
 * chains of one-way ties). O(m n) memory, O(nnz + j n) per iteration.
 */
// eslint-disable-next-line max-lines-per-function -- one restart cycle (Arnoldi, Givens rotations, back substitution) reads best as the textbook's single loop over shared work arrays.
export function gmres(
  mul: MatVec,
  b: Float64Array,
  diag: Float64Array,
  opts: IterativeOptions & { restart?: number } = {},
): IterativeResult {
  const n = b.length;
  const tol = opts.tol ?? 1e-12;
  const m = Math.max(2, Math.min(opts.restart ?? 50, n));
  const maxIt = opts.maxIterations ?? Math.max(5000, 4 * n);
  const x = opts.x0 ? Float64Array.from(opts.x0) : new Float64Array(n);
  const minv = new Float64Array(n);
  for (let i = 0; i < n; i++) minv[i] = diag[i] !== 0 ? 1 / diag[i] : 0;
  const V: Float64Array[] = Array.from({ length: m + 1 }, () => new Float64Array(n));
  const H = new Float64Array((m + 1) * m);
  const cs = new Float64Array(m);
  const sn = new Float64Array(m);
  const g = new Float64Array(m + 1);
  const y = new Float64Array(m);
  const w = new Float64Array(n);
  const z = new Float64Array(n);
  const bnorm = Math.sqrt(dot(b, b)) || 1;
  let it = 0;
  let res = Infinity;
  while (it < maxIt) {
    mul(x, w);
    for (let i = 0; i < n; i++) V[0][i] = b[i] - w[i];
    const beta = Math.sqrt(dot(V[0], V[0]));
    res = beta / bnorm;
    if (res <= tol) break;
    for (let i = 0; i < n; i++) V[0][i] /= beta;
    g.fill(0);
    g[0] = beta;
    H.fill(0);
    let j = 0;
    for (; j < m && it < maxIt;) {
      for (let i = 0; i < n; i++) z[i] = minv[i] * V[j][i];
      mul(z, w);
      for (let i = 0; i <= j; i++) {
        const h = dot(w, V[i]);
        H[i * m + j] = h;
        const vi = V[i];
        for (let q = 0; q < n; q++) w[q] -= h * vi[q];
      }
      const hn = Math.sqrt(dot(w, w));
      H[(j + 1) * m + j] = hn;
      if (hn > 0) for (let q = 0; q < n; q++) V[j + 1][q] = w[q] / hn;
      for (let i = 0; i < j; i++) {
        const a = H[i * m + j];
        const c = H[(i + 1) * m + j];
        H[i * m + j] = cs[i] * a + sn[i] * c;
        H[(i + 1) * m + j] = -sn[i] * a + cs[i] * c;
      }
      const a = H[j * m + j];
      const c = H[(j + 1) * m + j];
      const r = Math.hypot(a, c);
      cs[j] = r > 0 ? a / r : 1;
      sn[j] = r > 0 ? c / r : 0;
      H[j * m + j] = r;
      H[(j + 1) * m + j] = 0;
      g[j + 1] = -sn[j] * g[j];
      g[j] = cs[j] * g[j];
      j++;
      it++;
      res = Math.abs(g[j]) / bnorm;
      if (res <= tol || hn === 0) break;
    }
    for (let i = j - 1; i >= 0; i--) {
      let s = g[i];
      for (let q = i + 1; q < j; q++) s -= H[i * m + q] * y[q];
      y[i] = H[i * m + i] !== 0 ? s / H[i * m + i] : 0;
    }
    w.fill(0);
    for (let i = 0; i < j; i++) {
      const vi = V[i];
      const yi = y[i];
      for (let q = 0; q < n; q++) w[q] += yi * vi[q];
    }
    for (let q = 0; q < n; q++) x[q] += minv[q] * w[q];
    if (res <= tol) break;
  }
  mul(x, w);
  let rr = 0;
  for (let i = 0; i < n; i++) {
    const d = b[i] - w[i];
    rr += d * d;
  }
  res = Math.sqrt(rr) / bnorm;
  return { x, iterations: it, relativeResidual: res, converged: res <= Math.max(tol * 10, 1e-10) };
}
