/**
 * The bottleneck-ratio surrogate and the screen against brute force on small rooms:
 * Phi(S) = Q(S, S^c) / pi(S) = w(S, S^c) / vol(S) over every subset of small chains (Levin,
 * Peres & Wilmer, Markov Chains and Mixing Times, 2nd ed., 2017, section 7.2), the stationary
 * bound E_pi tau_A >= pi(A^c)^2 / Q(A, A^c) (Aldous & Fill, Reversible Markov Chains and Random
 * Walks on Graphs, chapter 3) over every starter set, and the screen's total and lower bound
 * against the best k-set found by brute force.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { denseWalk, exactReach, plan, prepareRoom, type RoomGraph, type RoomTie } from '../../shared/engine/index';
import { bottleneckRatio, cutOf, stationaryBound } from '../../shared/engine/bottleneck';
import { rng } from '../bench/bench-rooms';
import { gridEdges, roomFromEdges } from '../bench/large-rooms';
import { cli, fixtures } from './cli-helpers';

function weightedPath(n: number, seed: number): RoomGraph {
  const r = rng(seed);
  const ties: RoomTie[] = Array.from({ length: n - 1 }, (_, i) => ({ source: i, target: i + 1, strength: 0.2 + 3 * r() }));
  return { ids: Array.from({ length: n }, (_, i) => `p${i}`), directed: false, ties };
}

function randomConnected(n: number, extra: number, seed: number): RoomGraph {
  const r = rng(seed);
  const ties: RoomTie[] = [];
  for (let i = 1; i < n; i++) ties.push({ source: Math.floor(r() * i), target: i, strength: 0.2 + 2 * r() });
  for (let e = 0; e < extra; e++) {
    const i = Math.floor(r() * n);
    const j = Math.floor(r() * n);
    if (i !== j) ties.push({ source: i, target: j, strength: 0.2 + 2 * r() });
  }
  return { ids: Array.from({ length: n }, (_, i) => `p${i}`), directed: false, ties };
}

function* subsets(n: number): Generator<number[]> {
  for (let mask = 1; mask < (1 << n) - 1; mask++) yield Array.from({ length: n }, (_, i) => i).filter((i) => mask & (1 << i));
}

function* kSets(n: number, k: number, from = 0, acc: number[] = []): Generator<number[]> {
  if (acc.length === k) {
    yield [...acc];
    return;
  }
  for (let i = from; i < n; i++) yield* kSets(n, k, i + 1, [...acc, i]);
}

const rooms = [weightedPath(7, 1), weightedPath(9, 2), randomConnected(8, 6, 3), randomConnected(9, 10, 4)];

describe('bottleneck ratio and the screen', () => {
  it('Phi(S) from the chain (pi_x P_xy summed over the cut, over pi(S)) equals w(S, S^c) / vol(S) for every subset', () => {
    for (const g of rooms) {
      const room = prepareRoom(g);
      const n = room.n;
      const p = denseWalk(room);
      const d = room.csr.outStrength;
      const vol = d.reduce((s, x) => s + x, 0);
      for (const s of subsets(n)) {
        const inS = new Set(s);
        let q = 0;
        let piS = 0;
        for (const x of s) {
          piS += d[x] / vol;
          for (let y = 0; y < n; y++) if (!inS.has(y)) q += (d[x] / vol) * p[x * n + y];
        }
        const phi = bottleneckRatio(room.csr, s);
        assert.ok(Math.abs(q / piS - phi) <= 1e-12 * Math.max(1, phi), `S = ${s.join(',')}`);
      }
    }
  });

  it('E_pi tau_A >= pi(A^c)^2 / Q(A, A^c) for every starter set', () => {
    for (const g of rooms) {
      const room = prepareRoom(g);
      const d = room.csr.outStrength;
      const vol = d.reduce((s, x) => s + x, 0);
      for (const a of subsets(room.n)) {
        const h = exactReach(room, a).h;
        let mean = 0;
        for (let i = 0; i < room.n; i++) mean += (d[i] / vol) * h[i];
        const bound = stationaryBound(cutOf(room.csr, a));
        assert.ok(mean >= bound * (1 - 1e-12), `A = ${a.join(',')}: ${mean} < ${bound}`);
      }
    }
  });

  it('the screen reports its exact total and never a lower bound above the brute-force optimum', () => {
    for (let t = 0; t < 16; t++) {
      const g = randomConnected(8 + (t % 5), 4 + t, 40 + t);
      const k = 2 + (t % 3);
      let best = Infinity;
      for (const s of kSets(g.ids.length, k)) best = Math.min(best, exactReach(g, s).total);
      const r = plan(g, { k, method: 'screen', laziness: t % 4 === 0 ? 0.3 : 0 });
      const scale = t % 4 === 0 ? 1 / 0.7 : 1;
      assert.equal(r.method, 'screen');
      assert.equal(new Set(r.starters).size, k);
      assert.ok(Math.abs(r.total - exactReach(g, r.starters, { laziness: t % 4 === 0 ? 0.3 : 0 }).total) <= 1e-9 * r.total);
      assert.ok(r.total >= best * scale * (1 - 1e-12));
      assert.ok(r.lowerBound <= best * scale * (1 + 1e-12), `room ${t}: bound ${r.lowerBound} above optimum ${best * scale}`);
    }
  });

  it('reports progress for every evaluated set and respects required and excluded people', () => {
    const room = roomFromEdges(gridEdges(20, 2));
    const seen: number[] = [];
    const r = plan(room, {
      k: 6,
      method: 'screen',
      screenKeep: 12,
      mustInclude: [5],
      exclude: [0, 1],
      onProgress: (p) => seen.push(p.done),
    });
    assert.ok(r.starters.includes(5));
    assert.ok(!r.starters.includes(0) && !r.starters.includes(1));
    assert.equal(r.starters.length, 6);
    assert.equal(seen[0], 0);
    assert.ok(seen.length >= 2 && seen.every((v, i) => i === 0 || v === seen[i - 1] + 1));
    assert.match(r.notes.join(' '), /evaluated by exact solves/);
  });

  it('plan --method screen on the command line: exact total, progress on stderr, the path that ran', async () => {
    const lines = ['source,target,strength'];
    for (let i = 0; i < 30; i++) lines.push(`q${i},q${(i + 1) % 30},${1 + (i % 3)}`, `q${i},q${(i + 7) % 30},0.5`);
    const f = fixtures({ 'ring.csv': lines.join('\n') + '\n' });
    const run = await cli(['plan', '--graph', f['ring.csv'], '--k', '3', '--method', 'screen']);
    assert.equal(run.code, 0, run.stderr);
    const out = JSON.parse(run.stdout);
    assert.equal(out.method, 'screen');
    assert.equal(out.solverPath, 'iterative');
    assert.equal(out.starters.length, 3);
    assert.match(run.stderr, /screen \d+\/\d+/);
    assert.ok(out.lowerBound <= out.total);
  });
});
