/** Dense kernels against ml-matrix (an independent general-purpose linear-algebra package). */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { inverse, Matrix } from 'ml-matrix';
import {
  bicgstab,
  gmres,
  invertInPlace,
  invertSymmetricInPlace,
  luFactor,
  luSolve,
  luSolveTransposed,
  symmetricFactor,
  symmetricSolve,
  choleskyFactor,
  choleskySolve,
} from '../../shared/engine/index';
import { relClose, rng } from './engine-fixtures';

function randomMatrix(n: number, seed: number, spd: boolean): Float64Array {
  const r = rng(seed);
  const a = new Float64Array(n * n);
  for (let q = 0; q < n * n; q++) a[q] = r() - 0.5;
  if (!spd) {
    for (let i = 0; i < n; i++) a[i * n + i] += 2;
    return a;
  }
  const s = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let v = 0;
      for (let k = 0; k < n; k++) v += a[i * n + k] * a[j * n + k];
      s[i * n + j] = v + (i === j ? 0.5 : 0);
    }
  return s;
}
const toMl = (a: Float64Array, n: number) => new Matrix(Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n))));

describe('dense kernels agree with ml-matrix', () => {
  for (const n of [1, 7, 40]) {
    it(`inverses, n = ${n}`, () => {
      const a = randomMatrix(n, n, false);
      const ref = inverse(toMl(a, n));
      const mine = invertInPlace(Float64Array.from(a), n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) assert.ok(relClose(mine[i * n + j], ref.get(i, j), 1e-10));
      const s = randomMatrix(n, 100 + n, true);
      const refS = inverse(toMl(s, n));
      const sym = invertSymmetricInPlace(Float64Array.from(s), n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) assert.ok(relClose(sym[i * n + j], refS.get(i, j), 1e-10));
    });
    it(`solves (LU, LU transposed, LDL^T, Cholesky), n = ${n}`, () => {
      const a = randomMatrix(n, 7 * n, false);
      const b = Float64Array.from({ length: n }, (_, i) => 1 + (i % 3));
      const inv = inverse(toMl(a, n));
      const f = luFactor(Float64Array.from(a), n);
      const x = luSolve(f, Float64Array.from(b));
      const xt = luSolveTransposed(f, Float64Array.from(b));
      for (let i = 0; i < n; i++) {
        let v = 0;
        let vt = 0;
        for (let j = 0; j < n; j++) {
          v += inv.get(i, j) * b[j];
          vt += inv.get(j, i) * b[j];
        }
        assert.ok(relClose(x[i], v, 1e-10));
        assert.ok(relClose(xt[i], vt, 1e-10));
      }
      const s = randomMatrix(n, 9 * n, true);
      const invS = inverse(toMl(s, n));
      const y1 = symmetricSolve(symmetricFactor(Float64Array.from(s), n), n, Float64Array.from(b));
      const y2 = choleskySolve(choleskyFactor(Float64Array.from(s), n), n, Float64Array.from(b));
      for (let i = 0; i < n; i++) {
        let v = 0;
        for (let j = 0; j < n; j++) v += invS.get(i, j) * b[j];
        assert.ok(relClose(y1[i], v, 1e-9));
        assert.ok(relClose(y2[i], v, 1e-9));
      }
    });
  }
  it('GMRES and BiCGSTAB solve a nonsymmetric diagonally dominant system like ml-matrix', () => {
    const n = 60;
    const a = randomMatrix(n, 77, false);
    for (let i = 0; i < n; i++) a[i * n + i] += 10;
    const mul = (x: Float64Array, y: Float64Array) => {
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s += a[i * n + j] * x[j];
        y[i] = s;
      }
    };
    const b = Float64Array.from({ length: n }, (_, i) => Math.cos(i));
    const diag = Float64Array.from({ length: n }, (_, i) => a[i * n + i]);
    const inv = inverse(toMl(a, n));
    for (const solve of [gmres, bicgstab]) {
      const r = solve(mul, b, diag, { tol: 1e-13 });
      assert.ok(r.converged);
      for (let i = 0; i < n; i++) {
        let v = 0;
        for (let j = 0; j < n; j++) v += inv.get(i, j) * b[j];
        assert.ok(relClose(r.x[i], v, 1e-10));
      }
    }
  });
});
