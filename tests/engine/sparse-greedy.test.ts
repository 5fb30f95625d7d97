/**
 * The sparse exact greedy (LDL^T factor, selected inversion, pseudo-inverse first pick) against
 * the dense greedy (Schur updates of the dense fundamental matrix) on seeded random rooms:
 * same starters in the same order and the same totals to 1e-9, weighted, with laziness,
 * background mixing, required and excluded people, and rooms in several parts.
 * The dense greedy is itself checked against brute force in plan.test.ts.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { EngineError, plan, type PlanOptions, type RoomGraph } from '../../shared/engine/index';
import { rng } from '../bench/bench-rooms';
import { randomPartsRoom } from './engine-fixtures';
import { gridEdges, roomFromEdges, smallWorldEdges } from '../bench/large-rooms';

function options(n: number, parts: number, seed: number): PlanOptions {
  const r = rng(seed * 7 + 3);
  const mixing = parts === 1 && r() < 0.3 ? 0.02 + r() * 0.3 : 0;
  const laziness = r() < 0.3 ? r() * 0.6 : 0;
  const mustInclude = r() < 0.25 ? [Math.floor(r() * n)] : [];
  const exclude = r() < 0.25 ? [Math.floor(r() * n), Math.floor(r() * n)].filter((p) => !mustInclude.includes(p)) : [];
  const k = Math.min(n - 1 - exclude.length, parts + mustInclude.length + 1 + Math.floor(r() * 6));
  return { k, mixing, laziness, mustInclude, exclude, method: 'greedy' };
}

function compare(g: RoomGraph | ReturnType<typeof roomFromEdges>, o: PlanOptions, label: string): void {
  let dense;
  try {
    dense = plan(g, { ...o, sparseFrom: Infinity });
  } catch (e) {
    assert.ok(e instanceof EngineError);
    assert.throws(
      () => plan(g, { ...o, sparseFrom: 2 }),
      (x: unknown) => x instanceof EngineError && x.code === e.code,
      label,
    );
    return;
  }
  const sparse = plan(g, { ...o, sparseFrom: 2 });
  assert.equal(sparse.solverPath, 'sparse-factor', label);
  assert.deepEqual(sparse.starters, dense.starters, label);
  assert.ok(Math.abs(sparse.total - dense.total) <= 1e-9 * dense.total, `${label}: ${sparse.total} vs ${dense.total}`);
  // The dense planner may add further proven bounds (pair bounds, a short search); the sparse path's
  // identity-6 and cover bounds must stay proven: never above the plan both found.
  assert.ok(sparse.lowerBound <= dense.total * (1 + 1e-9), `${label}: bound`);
  assert.ok(Math.abs(sparse.rank - dense.rank) <= 1e-9, `${label}: rank ${sparse.rank} vs ${dense.rank}`);
  // The best single starter: from the pseudo-inverse diagonal on the sparse path, from the dense ergodic data here.
  assert.equal(sparse.bestSingle?.person, dense.bestSingle?.person, `${label}: best single starter`);
  if (dense.bestSingle && sparse.bestSingle)
    assert.ok(Math.abs(sparse.bestSingle.total - dense.bestSingle.total) <= 1e-9 * dense.bestSingle.total, `${label}: best single total`);
}

describe('sparse exact greedy equals the dense greedy', () => {
  it('on 240 small random rooms (weighted, laziness, mixing, constraints, several parts)', () => {
    for (let t = 0; t < 240; t++) {
      const n = 6 + (t % 50);
      const parts = t % 5 === 0 && n > 12 ? 2 + (t % 3) : 1;
      const g = randomPartsRoom(n, parts, 0.5 + (t % 4), 1000 + t);
      compare(g, options(n, parts, t), `room ${t} (n ${n}, parts ${parts})`);
    }
  });

  it('on a few larger rooms: random 300 and 700, grid 400, small-world 1500', () => {
    compare(randomPartsRoom(300, 1, 2, 7), { k: 12, method: 'greedy', laziness: 0.2 }, 'random 300');
    compare(randomPartsRoom(700, 3, 1.5, 8), { k: 8, method: 'greedy', exclude: [5, 6] }, 'random 700, 3 parts');
    // A grid has many equal totals (symmetry): the tie-break by input order must agree too.
    compare(roomFromEdges(gridEdges(20, 3, true)), { k: 10, method: 'greedy' }, 'unit grid 400');
    compare(roomFromEdges(smallWorldEdges(1500, 3, 0.1, 4)), { k: 6, method: 'greedy', mixing: 0.05 }, 'small-world 1500');
  });

  it('above the dense limit no plan builds the dense ergodic data: the best single starter comes from the sparse first pick or is left out', () => {
    const g = randomPartsRoom(600, 1, 2, 11);
    const dense = plan(g, { k: 2, method: 'greedy' });
    const sparse = plan(g, { k: 2, method: 'greedy', denseLimit: 500 });
    assert.equal(sparse.solverPath, 'sparse-factor');
    assert.deepEqual(sparse.bestSingle?.person, dense.bestSingle?.person);
    assert.ok(Math.abs(sparse.bestSingle!.total - dense.bestSingle!.total) <= 1e-9 * dense.bestSingle!.total);
    // Lazy greedy scores only a few candidates: it reports no best single starter rather than an n x n inverse.
    const lazy = plan(g, { k: 2, method: 'lazy-greedy', denseLimit: 500 });
    assert.equal(lazy.bestSingle, undefined);
    assert.deepEqual(lazy.starters.length, 2);
  });

  it('says which path ran and falls back to iterative solves when the factor would be too large', () => {
    const g = randomPartsRoom(3000, 1, 3, 9);
    const big = plan(g, { k: 3, method: 'auto', denseLimit: 100, maxFill: 10 });
    assert.equal(big.solverPath, 'iterative');
    assert.ok(big.notes.some((s) => /too large/.test(s)));
  });
});
