/**
 * Sparse LDL^T, its fill estimate, the AMD order and selected inversion against a
 * general-purpose dense reference (ml-matrix: LU inverse and Cholesky) on seeded random sparse
 * symmetric positive definite matrices.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { CholeskyDecomposition, inverse, Matrix } from 'ml-matrix';
import { amdOrder } from '../../shared/engine/linalg/amd';
import { analyse, factor, ldlSolve, type SpdMatrix } from '../../shared/engine/linalg/sparse-ldl';
import { inverseDiagonal } from '../../shared/engine/linalg/selected-inverse';
import { rng } from '../bench/bench-rooms';
import { gridEdges, roomFromEdges } from '../bench/large-rooms';

/** Random sparse SPD matrix: a weighted graph Laplacian plus a positive diagonal shift. */
function randomSpd(n: number, edges: number, seed: number): SpdMatrix {
  const r = rng(seed);
  const rows: Map<number, number>[] = Array.from({ length: n }, () => new Map());
  const diag = new Float64Array(n);
  for (let e = 0; e < edges; e++) {
    const i = Math.floor(r() * n);
    const j = Math.floor(r() * n);
    if (i === j) continue;
    const w = 0.1 + r() * (r() < 0.2 ? 100 : 1);
    rows[i].set(j, (rows[i].get(j) ?? 0) - w);
    rows[j].set(i, (rows[j].get(i) ?? 0) - w);
    diag[i] += w;
    diag[j] += w;
  }
  for (let i = 0; i < n; i++) diag[i] += 0.01 + r();
  const rowStart = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) rowStart[i + 1] = rowStart[i] + rows[i].size;
  const col = new Int32Array(rowStart[n]);
  const val = new Float64Array(rowStart[n]);
  for (let i = 0; i < n; i++) {
    let p = rowStart[i];
    for (const [j, v] of [...rows[i]].sort((a, b) => a[0] - b[0])) {
      col[p] = j;
      val[p++] = v;
    }
  }
  return { n, rowStart, col, val, diag };
}

function dense(a: SpdMatrix, perm?: Int32Array): Matrix {
  const m = Matrix.zeros(a.n, a.n);
  const pinv = new Int32Array(a.n);
  for (let k = 0; k < a.n; k++) pinv[perm ? perm[k] : k] = k;
  for (let i = 0; i < a.n; i++) {
    m.set(pinv[i], pinv[i], a.diag[i]);
    for (let p = a.rowStart[i]; p < a.rowStart[i + 1]; p++) m.set(pinv[i], pinv[a.col[p]], a.val[p]);
  }
  return m;
}

const isPermutation = (o: Int32Array) => [...o].sort((a, b) => a - b).every((v, i) => v === i);

describe('sparse LDL^T and selected inversion', () => {
  it('diag of the inverse by selected inversion equals the dense inverse (ml-matrix) on 40 random SPD matrices', () => {
    for (let t = 0; t < 40; t++) {
      const n = 5 + (t % 8) * 9;
      const a = randomSpd(n, Math.floor(n * (1 + (t % 4))), 100 + t);
      const order = amdOrder(a);
      assert.ok(isPermutation(order));
      const f = factor(a, analyse(a, order));
      const z = inverseDiagonal(f);
      const ref = inverse(dense(a));
      for (let i = 0; i < n; i++) assert.ok(Math.abs(z[i] - ref.get(i, i)) <= 1e-10 * Math.abs(ref.get(i, i)), `case ${t}, entry ${i}`);
      const b = Float64Array.from({ length: n }, (_, i) => Math.sin(i + t));
      const x = ldlSolve(f, b);
      const xr = ref.mmul(Matrix.columnVector([...b]));
      for (let i = 0; i < n; i++) assert.ok(Math.abs(x[i] - xr.get(i, 0)) <= 1e-9 * (1 + Math.abs(xr.get(i, 0))));
    }
  });

  it('the fill estimate (symbolic step) equals the nonzeros of the dense Cholesky factor of the permuted matrix', () => {
    for (let t = 0; t < 20; t++) {
      const n = 10 + t * 3;
      const a = randomSpd(n, 2 * n, 500 + t);
      const order = amdOrder(a);
      const sym = analyse(a, order);
      const l = new CholeskyDecomposition(dense(a, order)).lowerTriangularMatrix;
      let nz = 0;
      for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) if (l.get(i, j) !== 0) nz++;
      assert.equal(sym.nnz, nz, `case ${t}`);
      assert.equal(factor(a, sym).rowIdx.length, nz);
    }
  });

  it('AMD keeps a 30 x 30 grid factor far below the natural order fill', () => {
    const room = roomFromEdges(gridEdges(30, 1));
    const a: SpdMatrix = {
      n: room.n,
      rowStart: room.csr.rowStart,
      col: room.csr.col,
      val: room.csr.weight.map((w) => -w),
      diag: room.csr.outStrength.map((d) => d + 1),
    };
    const natural = analyse(
      a,
      Int32Array.from({ length: room.n }, (_, i) => i),
    ).nnz;
    const amd = analyse(a, amdOrder(a)).nnz;
    // Natural (banded) order of a side-s grid fills about s^3 = 27 000; minimum degree orders give
    // O(n log n) fill (George & Liu, Computer Solution of Large Sparse Positive Definite Systems, 1981).
    assert.ok(natural > 25_000, `natural ${natural}`);
    assert.ok(amd < natural / 2, `amd ${amd} vs natural ${natural}`);
  });

  it('a matrix that is not positive definite is refused', () => {
    const a: SpdMatrix = {
      n: 2,
      rowStart: Int32Array.from([0, 1, 2]),
      col: Int32Array.from([1, 0]),
      val: Float64Array.from([2, 2]),
      diag: Float64Array.from([1, 1]),
    };
    assert.throws(() => factor(a, analyse(a, Int32Array.from([0, 1]))), /not positive definite/);
  });
});
