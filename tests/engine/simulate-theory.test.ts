/**
 * Rehearsals against published values. Seeds are fixed, so every run of these tests draws the
 * same numbers: thresholds come from the theory (99% intervals, 3 standard errors) and cannot flake.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { exactReach } from '../../shared/engine/reach';
import { reachCurve } from '../../shared/engine/reach-time';
import { simulate, Z99, type SimulationSummary } from '../../shared/engine/simulate/index';
import { complete, directedCycle, karate, lesMiserables, path, randomDirected, splitRoom, star } from './simulate-fixtures';

/** Share of walkers whose exact value lies in the simulated 99% interval. */
function coverage(s: SimulationSummary, exact: (i: number) => number): number {
  let inside = 0;
  let walkers = 0;
  for (let i = 0; i < s.n; i++) {
    if (!s.walked[i]) continue;
    walkers++;
    if (Math.abs(s.mean[i] - exact(i)) <= Z99 * s.stderr[i] + 1e-12) inside++;
  }
  return inside / walkers;
}

function withinThreeSe(s: SimulationSummary, exactAverage: number): void {
  assert.ok(Math.abs(s.average - exactAverage) <= 3 * s.averageStderr, `average ${s.average} vs ${exactAverage} (se ${s.averageStderr})`);
}

describe('rehearsals agree with closed forms', () => {
  it('complete room K_n with a starters: h = (n - 1) / a (Lovász, Random walks on graphs: a survey, 1993)', () => {
    const n = 40;
    const s = simulate(complete(n), [0, 1, 2], 4000, 'complete');
    const h = (n - 1) / 3;
    assert.ok(coverage(s, () => h) >= 0.95, `coverage ${coverage(s, () => h)}`);
    withinThreeSe(s, h);
    // hops to hear are geometric with p = 1/h: variance (1 - p) / p^2
    const p = 1 / h;
    const v = (1 - p) / (p * p);
    for (let i = 3; i < n; i++) assert.ok(Math.abs(s.variance[i] / v - 1) < 0.15, `variance ${s.variance[i]} vs ${v}`);
    // reach curve: P(T <= t) = 1 - (1 - p)^t, within 4 binomial standard errors at every hop
    const walks = s.runs * (n - 3);
    s.reachCurve.slice(0, 40).forEach((share, t) => {
      const exact = 1 - (1 - p) ** t;
      assert.ok(Math.abs(share - exact) <= 4 * Math.sqrt((exact * (1 - exact)) / walks) + 1e-12, `hop ${t}: ${share} vs ${exact}`);
    });
  });

  it("path 0..n with starters {0, n}: h_i = i (n - i) (gambler's ruin; Levin, Peres, Wilmer, Markov Chains and Mixing Times, 2009)", () => {
    const n = 12;
    const s = simulate(path(n), [0, n], 6000, 7);
    assert.ok(coverage(s, (i) => i * (n - i)) >= 0.9);
    const avg = Array.from({ length: n - 1 }, (_, k) => (k + 1) * (n - k - 1)).reduce((a, b) => a + b) / (n - 1);
    withinThreeSe(s, avg);
  });

  it('star with a leaf as starter: centre 2n - 3, other leaves 2n - 2 (Lovász 1993)', () => {
    const n = 12;
    const s = simulate(star(n), [1], 6000, 'star');
    assert.ok(coverage(s, (i) => (i === 0 ? 2 * n - 3 : 2 * n - 2)) >= 0.9);
    withinThreeSe(s, (2 * n - 3 + (n - 2) * (2 * n - 2)) / (n - 1));
  });

  it('star with the centre as starter: every leaf hears in exactly one hop', () => {
    const s = simulate(star(9), [0], 50, 1);
    for (let i = 1; i < 9; i++) {
      assert.equal(s.mean[i], 1);
      assert.equal(s.stderr[i], 0);
    }
    assert.equal(s.total, 8);
  });

  it('directed cycle: the person d steps before the starter hears after exactly d hops', () => {
    const s = simulate(directedCycle(10), [0], 20, 3);
    for (let i = 1; i < 10; i++) assert.equal(s.mean[i], 10 - i);
  });

  it('laziness a scales every hitting time by 1 / (1 - a) (engine.md section 1)', () => {
    const n = 30;
    const s = simulate(complete(n), [0, 1], 3000, 'lazy', { laziness: 0.6 });
    const h = (n - 1) / 2 / 0.4;
    assert.ok(coverage(s, () => h) >= 0.93);
    withinThreeSe(s, h);
  });

  it('background mixing b on K_n: each hop hears with p = (1 - b) a / (n - 1) + b a / n, so h = 1 / p (derived from the walk of engine.md section 1)', () => {
    const n = 25;
    const a = 2;
    const b = 0.3;
    const s = simulate(complete(n), [0, 1], 3000, 'mix', { mixing: b });
    const h = 1 / ((1 - b) * (a / (n - 1)) + (b * a) / n);
    assert.ok(coverage(s, () => h) >= 0.93);
    withinThreeSe(s, h);
  });
});

describe('rehearsals agree with the exact solver', () => {
  // engine.md section 4: analytic mean inside the simulated 99% interval for about 99% of
  // people, simulated room average within 3 standard errors.
  const cases = [
    { name: 'karate club (Zachary 1977)', graph: karate(), starters: [0, 33], options: {} },
    { name: 'Les Misérables, weighted (Knuth 1993)', graph: lesMiserables(), starters: [11, 48], options: {} },
    { name: 'karate club with laziness and mixing', graph: karate(), starters: [5], options: { laziness: 0.3, mixing: 0.05 } },
    { name: 'random weighted directed room', graph: randomDirected(60, 240, 99), starters: [3, 17, 40], options: {} },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const exact = exactReach(c.graph, c.starters, c.options);
      const s = simulate(c.graph, c.starters, 3000, c.name, c.options);
      const cov = coverage(s, (i) => exact.h[i]);
      assert.ok(cov >= 0.95, `coverage ${cov}`);
      withinThreeSe(s, exact.average);
      assert.equal(s.capped, 0);
    });
  }

  it('a person who asks nobody stays put; with mixing the question still gets out', () => {
    // directed: p0 -> p1 -> p2, p3 asks no one; with mixing every hitting time is finite
    const g = {
      ids: ['p0', 'p1', 'p2', 'p3'],
      directed: true,
      ties: [
        { source: 0, target: 1, strength: 1 },
        { source: 1, target: 2, strength: 1 },
        { source: 2, target: 0, strength: 2 },
      ],
    };
    const exact = exactReach(g, [0], { mixing: 0.2 });
    const s = simulate(g, [0], 20000, 'dangling', { mixing: 0.2 });
    assert.ok(coverage(s, (i) => exact.h[i]) >= 0.66);
    withinThreeSe(s, exact.average);
  });
});

describe('caps, unreachable people, sample cascades', () => {
  it('walks stopped at the hop cap are counted per person and overall', () => {
    const s = simulate(path(30), [0], 200, 1, { hopCap: 50 });
    assert.ok(s.capped > 0);
    assert.equal(
      s.cappedByPerson.reduce((a, b) => a + b, 0),
      s.capped,
    );
    // the far end can never arrive within 50 hops... it needs at least 30, and usually far more
    assert.ok(s.cappedByPerson[30] > 150);
    // capped walks enter at the cap, so no mean exceeds it
    assert.ok(Math.max(...s.mean) <= 50);
  });

  it('people who cannot reach any starter are listed and not walked', () => {
    const s = simulate(splitRoom(), [0], 100, 1);
    assert.deepEqual(
      s.unreachable.map((u) => u.id),
      ['c', 'd'],
    );
    assert.deepEqual(Array.from(s.walked), [0, 1, 0, 0]);
    assert.equal(s.total, 1);
    assert.equal(s.capped, 0);
  });

  it('sample cascades hold each walk from the person along ties to a starter', () => {
    const g = lesMiserables();
    const tied = new Set(g.ties.flatMap((t) => [`${t.source},${t.target}`, `${t.target},${t.source}`]));
    const s = simulate(g, [11], 10, 's', { samples: 2 });
    assert.deepEqual(
      s.samples.map((c) => c.run),
      [0, 1],
    );
    for (const c of s.samples) {
      for (let k = 0; k < c.people.length; k++) {
        const walk = c.path.subarray(c.pathStart[k], c.pathStart[k + 1]);
        assert.equal(walk[0], c.people[k]);
        if (!c.truncated[k]) {
          assert.equal(walk.length, c.hops[k] + 1);
          assert.equal(walk[walk.length - 1], 11);
        }
        for (let q = 1; q < walk.length; q++) assert.ok(tied.has(`${walk[q - 1]},${walk[q]}`));
      }
    }
  });
});

describe('the simulated reach curve agrees with the analytic one', () => {
  it('karate club: share reached by hop t within 4 binomial standard errors of shareReached (reach-time.ts)', () => {
    const graph = karate();
    const starters = [0, 33];
    const analytic = reachCurve(graph, starters, { maxHops: 60 });
    const s = simulate(graph, starters, 4000, 'curve');
    const walks = s.runs * (graph.ids.length - starters.length);
    assert.ok(analytic.hops >= 30);
    for (let t = 0; t <= analytic.hops; t++) {
      const p = analytic.shareReached[t];
      const sim = s.reachCurve[Math.min(t, s.reachCurve.length - 1)];
      // walks are independent, so the variance is at most the binomial p (1 - p) / walks
      assert.ok(Math.abs(sim - p) <= 4 * Math.sqrt((p * (1 - p)) / walks) + 1e-9, `hop ${t}: ${sim} vs ${p}`);
    }
  });

  it('a split room: the unreachable part keeps the curve below 1', () => {
    const s = simulate(splitRoom(), [0], 10, 1);
    assert.deepEqual(s.reachCurve, [0, 1 / 3]);
  });
});
