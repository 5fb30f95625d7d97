import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import seedrandom from 'seedrandom';
import { toCsr } from '../../shared/engine/graph';
import {
  buildAliasRows,
  chunkRanges,
  mergePartials,
  runGenerator,
  runState,
  simulate,
  simulateRange,
} from '../../shared/engine/simulate/index';
import { simulateInPool } from '../../shared/engine/simulate/pool';
import { karate, lesMiserables, randomDirected } from './simulate-fixtures';

describe('random streams', () => {
  it('run r of seed s uses seedrandom xor128 from a state derived from (s, r)', () => {
    const g = runGenerator('abc', 5);
    const ref = seedrandom.xor128('', { state: runState('abc', 5) });
    for (let k = 0; k < 100; k++) assert.equal(g(), ref());
    assert.notDeepEqual(runState('abc', 5), runState('abc', 6));
    assert.notDeepEqual(runState('abc', 5), runState('abd', 5));
    // numbers and their decimal text name the same stream
    assert.deepEqual(runState(42, 0), runState('42', 0));
  });

  it('the walk kernel draws exactly the xor128 stream: a plain reference walker gives the same paths', () => {
    const graph = randomDirected(15, 45, 3);
    const starters = [2, 9];
    const laziness = 0.25;
    const mixing = 0.1;
    const s = simulate(graph, starters, 4, 'ref', { laziness, mixing, samples: 4 });
    const csr = toCsr(graph);
    const alias = buildAliasRows(csr);
    const n = graph.ids.length;
    for (const cascade of s.samples) {
      const rand = runGenerator('ref', cascade.run);
      for (let k = 0; k < cascade.people.length; k++) {
        let v = cascade.people[k];
        const walk = [v];
        while (!starters.includes(v)) {
          if (rand() < laziness) {
            walk.push(v);
            continue;
          }
          if (rand() < mixing) {
            v = Math.floor(rand() * n);
            walk.push(v);
            continue;
          }
          const start = csr.rowStart[v];
          const x = rand() * (csr.rowStart[v + 1] - start);
          const e = start + Math.floor(x);
          v = x - Math.floor(x) < alias.keep[e] ? alias.col[e] : alias.alias[e];
          walk.push(v);
        }
        assert.deepEqual(Array.from(cascade.path.subarray(cascade.pathStart[k], cascade.pathStart[k + 1])), walk);
      }
    }
  });
  it('without laziness and mixing two walks advance side by side, in the documented order', () => {
    const graph = randomDirected(20, 70, 5);
    const starters = [4, 13];
    const s = simulate(graph, starters, 3, 'pair', { samples: 3 });
    const csr = toCsr(graph);
    const alias = buildAliasRows(csr);
    const hop = (v: number, u: number) => {
      const start = csr.rowStart[v];
      const x = u * (csr.rowStart[v + 1] - start);
      const e = start + Math.floor(x);
      return x - Math.floor(x) < alias.keep[e] ? alias.col[e] : alias.alias[e];
    };
    for (const cascade of s.samples) {
      const rand = runGenerator('pair', cascade.run);
      const walkers = Array.from(cascade.people);
      const paths: number[][] = walkers.map((v) => [v]);
      const done = (q: number) => starters.includes(paths[q][paths[q].length - 1]);
      let next = 0;
      let a: number | null = next++;
      let b: number | null = next < walkers.length ? next++ : null;
      while (a !== null && b !== null) {
        if (done(a)) {
          if (next >= walkers.length) {
            a = b;
            b = null;
            break;
          }
          a = next++;
        }
        if (done(b)) {
          if (next >= walkers.length) {
            b = null;
            break;
          }
          b = next++;
        }
        const ua = rand();
        const ub = rand();
        paths[a].push(hop(paths[a].at(-1)!, ua));
        paths[b].push(hop(paths[b].at(-1)!, ub));
      }
      while (a !== null && !done(a)) paths[a].push(hop(paths[a].at(-1)!, rand()));
      for (let q = 0; q < walkers.length; q++) {
        assert.deepEqual(Array.from(cascade.path.subarray(cascade.pathStart[q], cascade.pathStart[q + 1])), paths[q]);
        assert.equal(cascade.hops[q], paths[q].length - 1);
      }
    }
  });
});

describe('the same seed gives the same rehearsal', () => {
  const graph = lesMiserables();
  const starters = [11, 48, 55];

  it('twice in a row, bit for bit; another seed differs', () => {
    const a = simulate(graph, starters, 1500, 9, { samples: 1 });
    const b = simulate(graph, starters, 1500, 9, { samples: 1 });
    assert.deepEqual(a, b);
    // keeping sample cascades does not change the numbers
    assert.deepEqual(simulate(graph, starters, 1500, 9, { samples: 0 }).mean, a.mean);
    assert.deepEqual(
      simulate(graph, starters, 1500, 9, { samples: 0, laziness: 0.1 }).mean,
      simulate(graph, starters, 1500, 9, { samples: 5, laziness: 0.1 }).mean,
    );
    assert.notDeepEqual(simulate(graph, starters, 1500, 10).mean, a.mean);
  });

  it('merging partials in any order gives the same result; single-run partials agree with one range (Chan et al. 1979)', () => {
    const ranges = [
      { from: 0, to: 300 },
      { from: 300, to: 350 },
      { from: 350, to: 1000 },
    ];
    const parts = ranges.map((r) => simulateRange(graph, starters, {}, 'm', r.from, r.to));
    const forward = mergePartials(parts);
    assert.deepEqual(mergePartials([parts[2], parts[0], parts[1]]), forward);
    const one = simulateRange(graph, starters, {}, 'm', 0, 200);
    const single = mergePartials(Array.from({ length: 200 }, (_, r) => simulateRange(graph, starters, {}, 'm', r, r + 1)));
    for (let i = 0; i < graph.ids.length; i++) {
      assert.ok(Math.abs(single.mean[i] - one.mean[i]) <= 1e-9 * Math.max(1, one.mean[i]));
      assert.ok(Math.abs(single.m2[i] - one.m2[i]) <= 1e-9 * Math.max(1, one.m2[i]));
    }
    assert.deepEqual(single.histogram.subarray(0, 50), one.histogram.subarray(0, 50));
    assert.equal(single.hops, one.hops);
    assert.throws(() => mergePartials([parts[0], parts[2]]), /missing or overlap/);
  });

  it('chunks depend on the room size and run count only', () => {
    assert.deepEqual(chunkRanges(2500, 300), [
      { from: 0, to: 666 },
      { from: 666, to: 1332 },
      { from: 1332, to: 1998 },
      { from: 1998, to: 2500 },
    ]);
    assert.deepEqual(chunkRanges(3, 1e6), [
      { from: 0, to: 1 },
      { from: 1, to: 2 },
      { from: 2, to: 3 },
    ]);
  });

  it('identical in this thread and on 1 or 2 piscina workers (run through tsx)', async () => {
    const room = karate();
    // 30 000 runs on 34 people: five chunks, so two workers really share the work
    const local = simulate(room, [0, 33], 30_000, 'pool', { laziness: 0.2 });
    const one = await simulateInPool(room, [0, 33], 30_000, 'pool', { laziness: 0.2 }, 1);
    const two = await simulateInPool(room, [0, 33], 30_000, 'pool', { laziness: 0.2 }, 2);
    assert.ok(chunkRanges(30_000, 34).length >= 5);
    assert.deepEqual(one, local);
    assert.deepEqual(two, local);
  });
});
