/** Ergodic fundamental matrix (identity 3), the O(n^2) absorbing state from it, and all-pairs totals (identity 4). */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { AbsorbingState, allPairsTotals, denseWalk, ergodicData, exactReach, prepareRoom } from '../../shared/engine/index';
import { karateClub, randomRoom, relClose, room } from './engine-fixtures';

const cases = [
  ['undirected weighted', () => prepareRoom(randomRoom(18, 30, false, 3))],
  ['directed weighted', () => prepareRoom(randomRoom(18, 40, true, 4))],
  ['directed with mixing', () => prepareRoom(randomRoom(18, 10, true, 5, false), { mixing: 0.1, laziness: 0.2 })],
  // 0 <-> 1 <-> 2 closed; 3 and 4 transient (they lead into it, nothing leads back).
  [
    'directed with transient people',
    () =>
      prepareRoom(
        room(
          5,
          [
            [0, 1],
            [1, 0],
            [1, 2],
            [2, 1],
            [3, 0],
            [4, 3],
            [4, 2],
            [3, 4],
          ],
          true,
        ),
      ),
  ],
  ['karate club (Zachary 1977)', () => prepareRoom(karateClub())],
] as const;

describe('ergodic data', () => {
  for (const [name, make] of cases) {
    it(`single-starter totals match exact reach: ${name}`, () => {
      const r = make();
      const e = ergodicData(r);
      for (let j = 0; j < r.n; j++) {
        const direct = exactReach(r, [j]);
        if (Number.isFinite(direct.total))
          assert.ok(relClose(e.singleTotals[j], direct.total, 1e-9), `${j}: ${e.singleTotals[j]} vs ${direct.total}`);
        else assert.equal(e.singleTotals[j], Infinity);
      }
    });
    it(`absorbing state from the ergodic matrix equals the direct inverse: ${name}`, () => {
      const r = make();
      const e = ergodicData(r);
      for (let j = 0; j < r.n; j++) {
        if (!(e.pi[j] > 0)) continue;
        const a = AbsorbingState.fromErgodic(e, j);
        const b = AbsorbingState.fromStarters(r, [j]);
        for (let i = 0; i < r.n; i++) {
          if (i === j) continue;
          for (let l = 0; l < r.n; l++) if (l !== j) assert.ok(relClose(a.N[i * r.n + l], b.N[i * r.n + l], 1e-9));
        }
      }
    });
    it(`all-pairs totals match exact reach: ${name}`, () => {
      const r = make();
      const e = ergodicData(r);
      const pairs = allPairsTotals(e);
      for (let a = 0; a < r.n; a++) {
        for (let b = a + 1; b < r.n; b++) {
          const direct = exactReach(r, [a, b]).total;
          if (Number.isFinite(direct))
            assert.ok(relClose(pairs[a * r.n + b], direct, 1e-8), `{${a},${b}}: ${pairs[a * r.n + b]} vs ${direct}`);
          else assert.equal(pairs[a * r.n + b], Infinity);
        }
      }
    });
  }
  it('Schur downdate and bordered inverse keep N equal to the direct inverse', () => {
    const r = prepareRoom(randomRoom(20, 40, true, 9), { mixing: 0.05 });
    const s = AbsorbingState.fromStarters(r, [3]);
    s.add(7);
    s.add(11);
    const direct = AbsorbingState.fromStarters(r, [3, 7, 11]);
    assert.ok(relClose(s.total, direct.total, 1e-11));
    const gain = (s.rawTotal - s.rawGain(5)) * s.scale;
    assert.ok(relClose(gain, exactReach(r, [3, 7, 11, 5]).total, 1e-10), 'identity 2');
    s.remove(7, denseWalk(r));
    const back = AbsorbingState.fromStarters(r, [3, 11]);
    for (let i = 0; i < r.n * r.n; i++) if (s.inT[Math.floor(i / r.n)] && s.inT[i % r.n]) assert.ok(relClose(s.N[i], back.N[i], 1e-10));
    assert.ok(relClose(s.total, exactReach(r, [3, 11]).total, 1e-10));
  });
});
