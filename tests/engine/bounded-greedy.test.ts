/**
 * The exact greedy on iterative solves (plan-bounded-greedy.ts) against the dense greedy (Schur
 * updates of the dense fundamental matrix, itself checked against brute force in plan.test.ts):
 * same starters in the same order and the same totals to 1e-9 on seeded random rooms, weighted,
 * with laziness, required and excluded people and several parts; and the diagonal bounds it
 * rests on against a dense inverse (Cauchy-Schwarz in the K inner product: never above the true
 * value, and exact once the ball covers the whole part).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { EngineError, plan, prepareRoom, type PlanOptions, type RoomGraph } from '../../shared/engine/index';
import { DiagLowerBound, MAX_HOPS } from '../../shared/engine/diag-lower-bound';
import { GroundedLaplacian } from '../../shared/engine/linalg/grounded-laplacian';
import { rng } from '../bench/bench-rooms';
import { randomPartsRoom } from './engine-fixtures';
import { gridEdges, roomFromEdges, smallWorldEdges } from '../bench/large-rooms';

function options(n: number, parts: number, seed: number): PlanOptions {
  const r = rng(seed * 7 + 3);
  const laziness = r() < 0.3 ? r() * 0.6 : 0;
  const mustInclude = r() < 0.25 ? [Math.floor(r() * n)] : [];
  const exclude = r() < 0.25 ? [Math.floor(r() * n), Math.floor(r() * n)].filter((p) => !mustInclude.includes(p)) : [];
  const k = Math.min(n - 1 - exclude.length, parts + mustInclude.length + 1 + Math.floor(r() * 6));
  return { k, laziness, mustInclude, exclude, method: 'greedy' };
}

/** The iterative exact path is what a room too big for the dense limit and the factor gets. */
const ITERATIVE = { denseLimit: 1, maxFill: 1 } as const;

function compare(g: RoomGraph | ReturnType<typeof roomFromEdges>, o: PlanOptions, label: string): void {
  let dense;
  try {
    dense = plan(g, { ...o, sparseFrom: Infinity });
  } catch (e) {
    assert.ok(e instanceof EngineError);
    assert.throws(
      () => plan(g, { ...o, ...ITERATIVE }),
      (x: unknown) => x instanceof EngineError && x.code === e.code,
      label,
    );
    return;
  }
  const it = plan(g, { ...o, ...ITERATIVE });
  assert.equal(it.solverPath, 'iterative', label);
  assert.equal(it.method, 'greedy', label);
  assert.deepEqual(it.starters, dense.starters, label);
  assert.ok(Math.abs(it.total - dense.total) <= 1e-9 * dense.total, `${label}: ${it.total} vs ${dense.total}`);
  assert.ok(it.lowerBound <= dense.total * (1 + 1e-9), `${label}: bound`);
  assert.equal(it.bestSingle?.person, dense.bestSingle?.person, `${label}: best single starter`);
  if (dense.bestSingle && it.bestSingle)
    assert.ok(Math.abs(it.bestSingle.total - dense.bestSingle.total) <= 1e-9 * dense.bestSingle.total, `${label}: best single total`);
}

describe('exact greedy on iterative solves equals the dense greedy', () => {
  it('on 200 small random rooms (weighted, laziness, constraints, several parts)', () => {
    for (let t = 0; t < 200; t++) {
      const n = 6 + (t % 60);
      const parts = t % 5 === 0 && n > 12 ? 2 + (t % 3) : 1;
      compare(randomPartsRoom(n, parts, 0.5 + (t % 4), 5000 + t), options(n, parts, t), `room ${t} (n ${n}, parts ${parts})`);
    }
  });

  it('on larger rooms: random 400 (laziness, one required), small-world 1,200 (k 30)', () => {
    compare(randomPartsRoom(400, 1, 2, 17), { k: 10, method: 'greedy', laziness: 0.25, mustInclude: [3] }, 'random 400');
    compare(roomFromEdges(smallWorldEdges(1200, 3, 0.1, 9)), { k: 30, method: 'greedy' }, 'small-world 1200');
  });

  it('on a grid (its bounds are the weakest), and says so when a round runs out of checks', () => {
    const grid = roomFromEdges(gridEdges(20, 3));
    compare(grid, { k: 8, method: 'greedy' }, 'grid 400');
    const short = plan(grid, { k: 8, method: 'greedy', ...ITERATIVE, maxChecksPerPick: 1 });
    const note = short.notes.find((s) => s.startsWith('Exact greedy on iterative solves'))!;
    assert.match(note, /except in [1-7] of 7 rounds/);
    assert.doesNotMatch(note, /every pick proven/);
    assert.ok(short.lowerBound <= short.total);
  });

  it('says which path ran and that every pick is proven', () => {
    const r = plan(roomFromEdges(smallWorldEdges(300, 3, 0.1, 4)), { k: 5, method: 'greedy', ...ITERATIVE });
    assert.equal(r.solverPath, 'iterative');
    assert.ok(r.notes.some((s) => s.includes('every pick proven')));
  });
});

/** The inverse of a small SPD matrix by Gauss-Jordan (test oracle only). */
function denseInverse(a: number[][]): number[][] {
  const n = a.length;
  const m = a.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[p][c])) p = r;
    [m[c], m[p]] = [m[p], m[c]];
    const d = m[c][c];
    for (let j = 0; j < 2 * n; j++) m[c][j] /= d;
    for (let r = 0; r < n; r++)
      if (r !== c) {
        const f = m[r][c];
        for (let j = 0; j < 2 * n; j++) m[r][j] -= f * m[c][j];
      }
  }
  return m.map((row) => row.slice(n));
}

describe('diagonal lower bounds of the grounded inverse', () => {
  it('never exceed the dense inverse, and reach it when the ball covers the room', () => {
    for (let t = 0; t < 40; t++) {
      const n = 8 + (t % 30);
      const room = prepareRoom(randomPartsRoom(n, 1, 0.3 + (t % 3), 900 + t));
      const grounded = new Uint8Array(n);
      grounded[t % n] = 1;
      if (t % 2) grounded[(t * 7 + 1) % n] = 1;
      const k = new GroundedLaplacian(room.csr, grounded);
      const idx = [...Array(n).keys()].filter((i) => !grounded[i]);
      const kd = idx.map((i) => idx.map((j) => (i === j ? k.diag[i] : 0)));
      idx.forEach((i, a) => {
        for (let e = k.rowStart[i]; e < k.rowStart[i + 1]; e++) kd[a][idx.indexOf(k.col[e])] += k.val[e];
      });
      const g = denseInverse(kd);
      // Global vectors: G d and G 1 from the dense inverse, as the greedy has them.
      const gd = new Float64Array(n);
      const g1 = new Float64Array(n);
      idx.forEach((i, a) =>
        idx.forEach((j, b) => {
          gd[i] += g[a][b] * room.csr.outStrength[j];
          g1[i] += g[a][b];
        }),
      );
      const bounds = new DiagLowerBound(k);
      bounds.setGlobals(gd, g1);
      idx.forEach((j, a) => {
        let prev = 0;
        for (let h = 0; h <= MAX_HOPS; h++) {
          const lb = bounds.lower(j, h);
          assert.ok(lb <= g[a][a] * (1 + 1e-12), `room ${t}, person ${j}, ${h} hops: ${lb} > ${g[a][a]}`);
          assert.ok(lb >= prev * (1 - 1e-9), `room ${t}: more hops never loosen the bound`);
          prev = lb;
        }
        if (n <= 12) assert.ok(prev >= g[a][a] * (1 - 1e-6), `room ${t}, person ${j}: ${prev} vs ${g[a][a]}`);
      });
    }
  });
});
