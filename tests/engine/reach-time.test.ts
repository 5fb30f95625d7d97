/** Reach-time distribution P(T_i > t) = (Q^t 1)_i against closed forms and against exact reach. */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { EngineError, exactReach, reachCurve } from '../../shared/engine/index';
import { complete, karateClub, randomRoom, relClose, star } from './engine-fixtures';

describe('reach-time distribution', () => {
  // On K_n with a starters every hop hears with probability a / (n - 1): P(T > t) = (1 - a/(n-1))^t
  // (a geometric law; first-step analysis, Lovász 1993).
  it('complete graph: geometric law, quantiles and minutes', () => {
    const n = 10;
    const a = 3;
    const q = 1 - a / (n - 1);
    const r = reachCurve(complete(n), [0, 1, 2], { quantiles: [0.9], minutesPerHop: 2.5, people: [5], tolerance: 1e-12 });
    for (let t = 0; t < 30; t++) assert.ok(relClose(r.shareReached[t], 1 - q ** t, 1e-12));
    for (let t = 0; t < 30; t++) assert.ok(relClose(r.people[0].reachedBy[t], 1 - q ** t, 1e-12));
    const hop90 = Math.ceil(Math.log(0.1) / Math.log(q));
    assert.equal(r.quantiles[0].hop, hop90);
    assert.equal(r.quantiles[0].minutes, hop90 * 2.5);
    assert.ok(relClose(r.roomShare[1], (3 + 7 * (1 - q)) / n, 1e-12));
    assert.equal(r.complete, true);
  });

  // E[T_i] = sum_{t >= 0} P(T_i > t): the area above the curve is the exact reach (tail-sum formula).
  for (const [name, g, A, opts] of [
    ['karate club (Zachary 1977)', karateClub(), [0, 33], {}],
    ['directed room with mixing and laziness', randomRoom(30, 60, true, 4), [2, 9], { mixing: 0.05, laziness: 0.2 }],
  ] as const) {
    it(`tail sum equals exact reach: ${name}`, () => {
      const curve = reachCurve(g, [...A], { ...opts, tolerance: 1e-13, maxHops: 100_000, people: [5] });
      const exact = exactReach(g, [...A], opts);
      let area = 0;
      for (let t = 0; t < curve.shareReached.length; t++) area += 1 - curve.shareReached[t];
      assert.ok(relClose(area * (g.ids.length - A.length), exact.total, 1e-8), `${area * (g.ids.length - A.length)} vs ${exact.total}`);
      let own = 0;
      for (let t = 0; t < curve.people[0].reachedBy.length; t++) own += 1 - curve.people[0].reachedBy[t];
      assert.ok(relClose(own, exact.h[5], 1e-8));
      for (let t = 1; t < curve.shareReached.length; t++) assert.ok(curve.shareReached[t] >= curve.shareReached[t - 1] - 1e-15);
    });
  }

  it('star: every leaf hears at hop 1 when the centre is briefed', () => {
    const r = reachCurve(star(6), [0]);
    assert.equal(r.shareReached[1], 1);
    assert.deepEqual(
      r.quantiles.map((q) => q.hop),
      [1, 1, 1],
    );
  });

  it('unreachable people keep the curve below 1 and are listed; bad options throw', () => {
    const g = { ids: ['a', 'b', 'c'], directed: false, ties: [{ source: 0, target: 1, strength: 1 }] };
    const r = reachCurve(g, [0], { maxHops: 50 });
    assert.equal(r.complete, false);
    assert.ok(relClose(r.shareReached[50], 0.5, 1e-12));
    assert.equal(r.quantiles[1].hop, null);
    assert.deepEqual(
      r.unreachable.map((u) => u.id),
      ['c'],
    );
    assert.throws(() => reachCurve(g, [0], { minutesPerHop: -1 }), EngineError);
    assert.throws(() => reachCurve(g, [0], { quantiles: [2] }), EngineError);
  });
});
