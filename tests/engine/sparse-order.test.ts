/**
 * The fill-reducing order does not change the sparse exact greedy's answer: nested dissection
 * and approximate minimum degree, each forced, give the same starters in the same order and the
 * same totals (1e-9 relative) as the dense greedy (Schur updates of the dense fundamental
 * matrix, itself checked against brute force in plan.test.ts) on seeded grids and random sparse
 * rooms of up to 1,500 people; the automatic choice takes the order with less work.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { EngineError, plan, prepareRoom, type PlanOptions, type RoomGraph, type RoomTie } from '../../shared/engine/index';
import { fillReducingOrder } from '../../shared/engine/grounded-factor';
import { rng } from '../bench/bench-rooms';
import { gridEdges, roomFromEdges } from '../bench/large-rooms';

/** A random tree plus `extra` random ties per person: sparse, connected, uneven degrees. */
function sparseRoom(n: number, extra: number, seed: number): RoomGraph {
  const r = rng(seed);
  const ties: RoomTie[] = [];
  for (let i = 1; i < n; i++) ties.push({ source: Math.floor(r() * i), target: i, strength: 0.2 + r() * 2 });
  for (let e = 0; e < Math.floor(n * extra); e++) {
    const i = Math.floor(r() * n);
    const j = Math.floor(r() * n);
    if (i !== j) ties.push({ source: i, target: j, strength: 0.2 + r() * 2 });
  }
  return { ids: Array.from({ length: n }, (_, i) => `p${i}`), directed: false, ties };
}

type Room = RoomGraph | ReturnType<typeof roomFromEdges>;

function sameAsDense(g: Room, o: PlanOptions, label: string): void {
  const dense = plan(g, { ...o, sparseFrom: Infinity });
  for (const fillOrder of ['nested-dissection', 'amd'] as const) {
    const sparse = plan(g, { ...o, sparseFrom: 2, fillOrder });
    const tag = `${label}, ${fillOrder}`;
    assert.equal(sparse.solverPath, 'sparse-factor', tag);
    assert.ok(
      sparse.notes.some((t) => t.includes(fillOrder === 'amd' ? 'minimum-degree order' : 'nested-dissection order')),
      tag,
    );
    assert.deepEqual(sparse.starters, dense.starters, tag);
    assert.ok(Math.abs(sparse.total - dense.total) <= 1e-9 * dense.total, `${tag}: ${sparse.total} vs ${dense.total}`);
    assert.ok(Math.abs(sparse.rank - dense.rank) <= 1e-9, `${tag}: rank`);
  }
}

describe('sparse exact greedy in nested-dissection and minimum-degree order', () => {
  it('same starters and totals as the dense greedy on grids (unit strengths: many equal totals) and random sparse rooms', () => {
    sameAsDense(roomFromEdges(gridEdges(24, 3, true)), { k: 12, method: 'greedy' }, 'unit grid 576');
    sameAsDense(roomFromEdges(gridEdges(30, 4)), { k: 10, method: 'greedy', laziness: 0.3 }, 'grid 900');
    sameAsDense(roomFromEdges(gridEdges(20, 5)), { k: 6, method: 'greedy', mixing: 0.1 }, 'grid 400, mixing');
    sameAsDense(sparseRoom(500, 0.6, 21), { k: 8, method: 'greedy', mustInclude: [3], exclude: [7, 8] }, 'random 500, constraints');
    sameAsDense(sparseRoom(1500, 0.4, 22), { k: 6, method: 'greedy' }, 'random 1500');
  });

  it('the automatic choice is the order with less factor work, and its estimate is the real factor size', () => {
    for (const [label, g] of [
      ['grid 2500', roomFromEdges(gridEdges(50, 6))],
      ['random 2000', prepareRoom(sparseRoom(2000, 1.5, 23))],
    ] as const) {
      const csr = g.csr;
      const auto = fillReducingOrder(csr)!;
      const nd = fillReducingOrder(csr, Infinity, Infinity, 'nested-dissection')!;
      const amd = fillReducingOrder(csr, Infinity, Infinity, 'amd')!;
      assert.equal(auto.work, Math.min(nd.work, amd.work), label);
      assert.equal(auto.method, nd.work < amd.work ? 'nested-dissection' : 'amd', label);
      // The chosen order's estimate equals the factor the greedy builds (grounded at one person: n_C fewer at most).
      const p = plan(g, { k: 2, method: 'greedy', sparseFrom: 2 });
      assert.ok(p.fill! <= auto.nnz && p.fill! >= auto.nnz - g.n, `${label}: fill ${p.fill} vs estimate ${auto.nnz}`);
    }
    // On a grid nested dissection wins (George 1973: O(n^1.5) work against minimum degree's larger constant here).
    assert.equal(fillReducingOrder(roomFromEdges(gridEdges(120, 7)).csr)!.method, 'nested-dissection');
  });

  it('a room whose factor cannot fit is refused before factoring, and an unknown order is a clear error', () => {
    const g = roomFromEdges(gridEdges(40, 8));
    const p = plan(g, { k: 3, method: 'auto', denseLimit: 100, maxFill: 1000 });
    assert.equal(p.solverPath, 'iterative');
    assert.equal(fillReducingOrder(g.csr, 1000), null);
    assert.throws(
      () => plan(g, { k: 3, method: 'greedy', fillOrder: 'metis' as never }),
      (e: unknown) => e instanceof EngineError && e.code === 'INVALID_OPTION' && /fill order/.test(e.message),
    );
  });
});
