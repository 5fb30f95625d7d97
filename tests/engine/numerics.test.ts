/**
 * Badly conditioned rooms: a 40-person path whose ties alternate 1e-6 / 1e6 against the
 * closed form of hitting times of a birth-death chain, and a warning where 1e-9 is out of reach.
 *
 * Closed form (Levin, Peres & Wilmer, Markov Chains and Mixing Times, 2nd ed., 2017, section
 * 2.5, birth-and-death chains; derivation in docs/sparse-greedy.md): on a path 0..n-1 with tie
 * c_j between j-1 and j and d_l the strength of person l, the walk from j must cross the tie
 * (j-1, j), and E_j tau_{j-1} = (sum_{l >= j} d_l) / c_j. Hence with the starter at 0,
 *   h_i = E_i tau_0 = sum_{j=1..i} (sum_{l >= j} d_l) / c_j,
 * a sum of positive terms that floating point evaluates to about 1e-15 relative.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { EngineError, exactReach, plan, type RoomGraph } from '../../shared/engine/index';

function alternatingPath(n: number, small: number, big: number): RoomGraph {
  const ties = Array.from({ length: n - 1 }, (_, i) => ({ source: i, target: i + 1, strength: i % 2 === 0 ? small : big }));
  return { ids: Array.from({ length: n }, (_, i) => `p${i}`), directed: false, ties };
}

/** Hitting times of the set {a} on a path (birth-death closed form, both sides of a). */
function closedForm(g: RoomGraph, a: number): number[] {
  const n = g.ids.length;
  const c = (j: number) => g.ties[j - 1].strength; // tie (j-1, j)
  const d = (l: number) => (l > 0 ? c(l) : 0) + (l < n - 1 ? c(l + 1) : 0);
  const h = new Array<number>(n).fill(0);
  for (let i = a + 1; i < n; i++) {
    let s = 0;
    for (let l = i; l < n; l++) s += d(l);
    h[i] = h[i - 1] + s / c(i);
  }
  for (let i = a - 1; i >= 0; i--) {
    let s = 0;
    for (let l = 0; l <= i; l++) s += d(l);
    h[i] = h[i + 1] + s / c(i + 1);
  }
  return h;
}

describe('numerics of badly conditioned rooms', () => {
  const g = alternatingPath(40, 1e-6, 1e6);

  it('a 40-person path with ties alternating 1e-6 / 1e6 matches the birth-death closed form to 1e-9 per person', () => {
    for (const a of [0, 7, 19, 39]) {
      const ref = closedForm(g, a);
      const r = exactReach(g, [a], { solver: 'dense' });
      for (let i = 0; i < 40; i++) {
        if (i === a) continue;
        assert.ok(Math.abs(r.h[i] - ref[i]) <= 1e-9 * ref[i], `starter ${a}, person ${i}: ${r.h[i]} vs ${ref[i]}`);
      }
      assert.deepEqual(r.warnings, []);
    }
  });

  it('the sparse greedy and the dense greedy report the same total there, equal to the closed form', () => {
    const sparse = plan(g, { k: 1, method: 'greedy', sparseFrom: 2 });
    const dense = plan(g, { k: 1, method: 'greedy', sparseFrom: Infinity });
    assert.deepEqual(sparse.starters, dense.starters);
    const ref = closedForm(g, sparse.starters[0]).reduce((s, x) => s + x, 0);
    assert.ok(Math.abs(sparse.total - ref) <= 1e-9 * ref, `${sparse.total} vs ${ref}`);
    assert.ok(Math.abs(dense.total - ref) <= 1e-9 * ref, `${dense.total} vs ${ref}`);
  });

  it('stays accurate for any spread the number range allows (subtraction-free elimination), and refuses overflow clearly', () => {
    for (const e of [9, 50, 100]) {
      const wide = alternatingPath(40, 10 ** -e, 10 ** e);
      const ref = closedForm(wide, 0);
      const r = exactReach(wide, [0], { solver: 'dense' });
      for (let i = 1; i < 40; i++) assert.ok(Math.abs(r.h[i] - ref[i]) <= 1e-9 * ref[i], `1e${e}, person ${i}`);
    }
    const huge = alternatingPath(40, 1e-160, 1e160);
    assert.throws(
      () => exactReach(huge, [0], { solver: 'dense' }),
      (x: unknown) => x instanceof EngineError && x.code === 'SOLVER_FAILED' && /number range/.test(x.message),
    );
  });
});
