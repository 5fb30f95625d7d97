/**
 * Sparse LDL^T, its fill estimate, the AMD order and selected inversion against a
 * general-purpose dense reference (ml-matrix: LU inverse and Cholesky) on seeded random sparse
 * symmetric positive definite matrices.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { CholeskyDecomposition, inverse, Matrix } from 'ml-matrix';
import { amdOrder, amdOrderWithin } from '../../shared/engine/linalg/amd';
import { nestedDissectionOrder } from '../../shared/engine/linalg/nested-dissection';
import { analyse, analyseWithin, factor, ldlSolve, type SpdMatrix } from '../../shared/engine/linalg/sparse-ldl';
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

/** The grid room of side s as an SPD matrix (Laplacian plus unit diagonal). */
function gridSpd(side: number): SpdMatrix {
  const room = roomFromEdges(gridEdges(side, 1));
  return {
    n: room.n,
    rowStart: room.csr.rowStart,
    col: room.csr.col,
    val: room.csr.weight.map((w) => -w),
    diag: room.csr.outStrength.map((d) => d + 1),
  };
}

/** Nonzeros below the diagonal of the dense Cholesky factor (ml-matrix) of the matrix in this order. */
function denseFill(a: SpdMatrix, order: Int32Array): number {
  const l = new CholeskyDecomposition(dense(a, order)).lowerTriangularMatrix;
  let nz = 0;
  for (let i = 0; i < a.n; i++) for (let j = 0; j < i; j++) if (l.get(i, j) !== 0) nz++;
  return nz;
}

describe('nested dissection order', () => {
  it('is a permutation: random patterns, several parts, isolated people, grids, every leaf size', () => {
    for (let t = 0; t < 30; t++) {
      const n = 5 + t * 13;
      // Few edges: several parts and isolated people.
      const a = randomSpd(n, Math.floor(n * (t % 3 === 0 ? 0.6 : 2)), 900 + t);
      for (const leaf of [1, 4, 32, 256]) assert.ok(isPermutation(nestedDissectionOrder(a, leaf)), `case ${t} leaf ${leaf}`);
    }
    assert.ok(isPermutation(nestedDissectionOrder(gridSpd(45))));
  });

  it('its fill estimate (symbolic step) equals the nonzeros of the dense Cholesky factor in that order', () => {
    for (let t = 0; t < 20; t++) {
      const n = 20 + t * 9;
      const a = randomSpd(n, 2 * n, 700 + t);
      const order = nestedDissectionOrder(a, 8);
      assert.equal(analyse(a, order).nnz, denseFill(a, order), `case ${t}`);
    }
    const g = gridSpd(18);
    const order = nestedDissectionOrder(g, 8);
    const sym = analyse(g, order);
    assert.equal(sym.nnz, denseFill(g, order), 'grid 18 x 18');
    assert.equal(factor(g, sym).rowIdx.length, sym.nnz);
  });

  it('solves and selected inversion in nested-dissection order agree with the dense inverse (ml-matrix)', () => {
    for (let t = 0; t < 6; t++) {
      const a = t < 5 ? randomSpd(60 + 20 * t, 150 + 40 * t, 1300 + t) : gridSpd(12);
      const f = factor(a, analyse(a, nestedDissectionOrder(a, 6)));
      const inv = inverse(dense(a));
      const diag = inverseDiagonal(f);
      const b = Float64Array.from({ length: a.n }, (_, i) => Math.sin(i + 1));
      const x = ldlSolve(f, b);
      for (let i = 0; i < a.n; i++) {
        let want = 0;
        for (let j = 0; j < a.n; j++) want += inv.get(i, j) * b[j];
        assert.ok(Math.abs(x[i] - want) <= 1e-10 * (1 + Math.abs(want)), `case ${t} solve ${i}`);
        assert.ok(Math.abs(diag[i] - inv.get(i, i)) <= 1e-10 * inv.get(i, i), `case ${t} diag ${i}`);
      }
    }
  });

  it('grid work grows like n^1.5 and stays below minimum degree on large grids', () => {
    // George (SIAM J. Numer. Anal. 1973): nested dissection of a side-s grid has O(s^2 log s) fill
    // and O(s^3) = O(n^1.5) work; the natural (banded) order needs O(s^4).
    const work = (side: number) => analyse(gridSpd(side), nestedDissectionOrder(gridSpd(side))).flops;
    const w40 = work(40);
    const w80 = work(80);
    const w160 = work(160);
    // Doubling the side multiplies n by 4: work by about 8 (exponent 1.5 in n); banded would be 16.
    assert.ok(w80 / w40 < 11 && w160 / w80 < 11, `work ${w40} ${w80} ${w160}`);
    const g = gridSpd(160);
    assert.ok(w160 < analyse(g, amdOrder(g)).flops, 'nested dissection needs less work than minimum degree on a 160 x 160 grid');
  });

  it('budgeted minimum degree and symbolic step stop exactly when the factor passes the budget', () => {
    for (let t = 0; t < 10; t++) {
      const a = randomSpd(80 + 10 * t, 300, 1700 + t);
      const order = amdOrder(a);
      const sym = analyse(a, order);
      assert.deepEqual(amdOrderWithin(a, { nnz: sym.nnz, work: sym.flops }), order, `case ${t}: within the budget`);
      assert.equal(amdOrderWithin(a, { nnz: sym.nnz - 1, work: Infinity }), null, `case ${t}: one nonzero over`);
      assert.equal(amdOrderWithin(a, { nnz: Infinity, work: sym.flops - 1 }), null, `case ${t}: work over`);
      assert.equal(analyseWithin(a, order, sym.nnz, sym.flops)?.nnz, sym.nnz);
      assert.equal(analyseWithin(a, order, sym.nnz - 1, Infinity), null);
      assert.equal(analyseWithin(a, order, Infinity, sym.flops - 1), null);
    }
  });
});
