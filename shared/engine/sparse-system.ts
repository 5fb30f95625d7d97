/**
 * The absorbing system I - Q of a starter set as a matrix-free sparse operator, with solves
 * against it and its transpose: Jacobi-preconditioned CG on the symmetric form L_T = (D - W)_T
 * for undirected rooms without mixing (identity 5: (I - Q) = D^-1 L on T), BiCGSTAB otherwise
 * (mixing kept as a rank-one term). O(m) per iteration. Laziness is not applied here.
 */
import { EngineError } from './errors';
import { bicgstab, gmres, pcg, type IterativeResult, type MatVec } from './linalg/iterative';
import type { PreparedRoom } from './room';
import { sparseWalk, type SparseWalk } from './walk';

export class SparseSystem {
  readonly n: number;
  readonly active: Uint8Array;
  readonly symmetric: boolean;
  private readonly walk: SparseWalk;
  private readonly diagQ: Float64Array;
  iterations = 0;
  solves = 0;
  lastResidual = 0;

  constructor(
    private readonly room: PreparedRoom,
    excluded: readonly number[],
    private readonly tol = 1e-10,
  ) {
    const n = (this.n = room.n);
    this.symmetric = !room.directed && room.mixing === 0;
    this.walk = sparseWalk(room, excluded);
    this.active = this.walk.inT;
    const { csr } = room;
    const b = room.mixing;
    this.diagQ = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let self = b / n;
      if (this.walk.stay[i]) self += 1 - b;
      else for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) if (csr.col[e] === i) self += (1 - b) * this.walk.prob[e];
      this.diagQ[i] = self;
    }
  }

  private check(r: IterativeResult): Float64Array {
    this.iterations += r.iterations;
    this.lastResidual = r.relativeResidual;
    this.solves++;
    if (!r.converged)
      throw new EngineError(
        'SOLVER_FAILED',
        `The iterative solver did not converge (relative residual ${r.relativeResidual.toExponential(2)} after ${r.iterations} iterations).`,
      );
    return r.x;
  }

  private laplacianMul = (x: Float64Array, y: Float64Array): void => {
    const { rowStart, col, weight, outStrength } = this.room.csr;
    const act = this.active;
    for (let i = 0; i < this.n; i++) {
      if (!act[i]) {
        y[i] = 0;
        continue;
      }
      let acc = outStrength[i] * x[i];
      for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
        const j = col[e];
        if (act[j]) acc -= weight[e] * x[j];
      }
      y[i] = acc;
    }
  };

  private laplacianDiag(): Float64Array {
    const { csr } = this.room;
    const d = new Float64Array(this.n);
    for (let i = 0; i < this.n; i++) if (this.active[i]) d[i] = csr.outStrength[i] * (1 - this.diagQ[i]);
    return d;
  }

  /** x with (I - Q) x = rhs on the active people. */
  solve(rhs: Float64Array, x0?: Float64Array): Float64Array {
    const n = this.n;
    if (this.symmetric) {
      const b = new Float64Array(n);
      const d = this.room.csr.outStrength;
      for (let i = 0; i < n; i++) if (this.active[i]) b[i] = rhs[i] * d[i];
      return this.check(pcg(this.laplacianMul, b, this.laplacianDiag(), { tol: this.tol, x0 }));
    }
    const t = new Float64Array(n);
    const mul = (x: Float64Array, y: Float64Array) => {
      this.walk.mulQ(x, t);
      for (let i = 0; i < n; i++) y[i] = this.active[i] ? x[i] - t[i] : 0;
    };
    return this.nonsymmetric(mul, this.masked(rhs), x0);
  }

  /** BiCGSTAB, falling back to restarted GMRES from its iterate when it stagnates. */
  private nonsymmetric(mul: MatVec, b: Float64Array, x0?: Float64Array): Float64Array {
    const first = bicgstab(mul, b, this.diagI(), { tol: this.tol, x0 });
    if (first.converged) return this.check(first);
    this.iterations += first.iterations;
    const start = first.x.every(Number.isFinite) && first.relativeResidual < 1 ? first.x : x0?.every(Number.isFinite) ? x0 : undefined;
    return this.check(gmres(mul, b, this.diagI(), { tol: this.tol, x0: start }));
  }

  /** y with (I - Q)^T y = rhs on the active people. */
  solveTransposed(rhs: Float64Array, x0?: Float64Array): Float64Array {
    const n = this.n;
    if (this.symmetric) {
      // (I - Q)^T = L D^-1, so y = D L^-1 rhs.
      const z0 = x0 ? x0.map((v, i) => (this.room.csr.outStrength[i] > 0 ? v / this.room.csr.outStrength[i] : 0)) : undefined;
      const z = this.check(pcg(this.laplacianMul, this.masked(rhs), this.laplacianDiag(), { tol: this.tol, x0: z0 }));
      const d = this.room.csr.outStrength;
      for (let i = 0; i < n; i++) z[i] *= d[i];
      return z;
    }
    const t = new Float64Array(n);
    const mul = (x: Float64Array, y: Float64Array) => {
      this.walk.mulQt(x, t);
      for (let i = 0; i < n; i++) y[i] = this.active[i] ? x[i] - t[i] : 0;
    };
    return this.nonsymmetric(mul, this.masked(rhs), x0);
  }

  /** Lower bound on N_jj = 1 / (1 - return probability): returns in one or two hops only. O(m log d). */
  diagLowerBound(): Float64Array {
    const { csr } = this.room;
    const { rowStart, col } = csr;
    const prob = this.walk.prob;
    const keep = 1 - this.room.mixing;
    const out = new Float64Array(this.n);
    for (let j = 0; j < this.n; j++) {
      if (!this.active[j]) continue;
      let f = this.diagQ[j];
      if (!this.walk.stay[j]) {
        for (let e = rowStart[j]; e < rowStart[j + 1]; e++) {
          const l = col[e];
          if (l === j || !this.active[l]) continue;
          // Q_lj by binary search in l's sorted row.
          let lo = rowStart[l];
          let hi = rowStart[l + 1] - 1;
          while (lo <= hi) {
            const mid = (lo + hi) >> 1;
            if (col[mid] < j) lo = mid + 1;
            else if (col[mid] > j) hi = mid - 1;
            else {
              f += keep * prob[e] * keep * prob[mid];
              break;
            }
          }
        }
      }
      out[j] = 1 / (1 - Math.min(f, 1 - 1e-15));
    }
    return out;
  }

  private masked(v: Float64Array): Float64Array {
    const b = new Float64Array(this.n);
    for (let i = 0; i < this.n; i++) if (this.active[i]) b[i] = v[i];
    return b;
  }

  private diagI(): Float64Array {
    const d = new Float64Array(this.n);
    for (let i = 0; i < this.n; i++) if (this.active[i]) d[i] = 1 - this.diagQ[i];
    return d;
  }
}
