/** Exact reach against published values, the commute-time identity, and an independent solver (ml-matrix). */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { Matrix, pseudoInverse, solve } from 'ml-matrix';
import { exactReach, ergodicData, hittingTime, kemenyFrom, prepareRoom, EngineError, type RoomGraph } from '../../shared/engine/index';
import { bipartite, complete, cycle, hypercube, karateClub, miserables, path, randomRoom, relClose, room, star } from './engine-fixtures';

const solvers = ['dense', 'sparse'] as const;

describe('exact reach: classic check values', () => {
  // Gambler's ruin on the path 0..n: H(i -> n) = n^2 - i^2 and with A = {0, n}, h_i = i (n - i)
  // (Levin, Peres & Wilmer, Markov Chains and Mixing Times, 2009, section 2.1; Lovász, Random walks on graphs: a survey, 1993).
  for (const solver of solvers) {
    it(`path, one end and both ends (${solver})`, () => {
      const n = 12;
      const one = exactReach(path(n), [n], { solver });
      for (let i = 0; i <= n; i++) assert.ok(relClose(one.h[i], n * n - i * i, 1e-10), `H(${i} -> ${n})`);
      const two = exactReach(path(n), [0, n], { solver });
      for (let i = 0; i <= n; i++) assert.ok(relClose(two.h[i], i * (n - i), 1e-10));
      assert.equal(two.unreachable.length, 0);
    });
    // Cycle C_n: H = d (n - d) at distance d (Lovász 1993, section 2).
    it(`cycle (${solver})`, () => {
      const n = 11;
      const r = exactReach(cycle(n), [0], { solver });
      for (let i = 0; i < n; i++) {
        const d = Math.min(i, n - i);
        assert.ok(relClose(r.h[i], d * (n - d), 1e-10));
      }
    });
    // Complete K_n: H = n - 1, and with a starters h = (n - 1) / a (Lovász 1993).
    it(`complete graph (${solver})`, () => {
      const n = 9;
      const r = exactReach(complete(n), [0, 3, 5], { solver });
      for (let i = 0; i < n; i++) if (![0, 3, 5].includes(i)) assert.ok(relClose(r.h[i], (n - 1) / 3, 1e-10));
      assert.ok(relClose(exactReach(complete(n), [2], { solver }).h[0], n - 1, 1e-10));
    });
    // Star on n people: leaf -> centre 1, centre -> leaf 2n - 3, leaf -> other leaf 2n - 2 (engine.md section 5; Lovász 1993).
    it(`star (${solver})`, () => {
      const n = 8;
      const toCentre = exactReach(star(n), [0], { solver });
      assert.ok(relClose(toCentre.h[3], 1, 1e-12));
      const toLeaf = exactReach(star(n), [1], { solver });
      assert.ok(relClose(toLeaf.h[0], 2 * n - 3, 1e-10));
      assert.ok(relClose(toLeaf.h[4], 2 * n - 2, 1e-10));
    });
    // K_{p,q} with the target on the q side: 2q - 1 from the other side (first-step analysis; engine.md section 5).
    it(`complete bipartite (${solver})`, () => {
      const p = 4;
      const q = 6;
      const r = exactReach(bipartite(p, q), [p + 2], { solver });
      for (let i = 0; i < p; i++) assert.ok(relClose(r.h[i], 2 * q - 1, 1e-10));
    });
    // Hypercube Q_d, antipodal vertex: sum_{j=1}^{d} (1 / C(d-1, j-1)) sum_{l>=j} C(d, l)
    // (birth-death chain of the distance; Aldous & Fill, Reversible Markov Chains, ch. 5). Q_3 gives 10.
    it(`hypercube (${solver})`, () => {
      const binom = (a: number, b: number) => {
        let r = 1;
        for (let i = 1; i <= b; i++) r = (r * (a - b + i)) / i;
        return r;
      };
      for (const d of [3, 5]) {
        let expected = 0;
        for (let j = 1; j <= d; j++) {
          let s = 0;
          for (let l = j; l <= d; l++) s += binom(d, l);
          expected += s / binom(d - 1, j - 1);
        }
        const r = exactReach(hypercube(d), [0], { solver });
        assert.ok(relClose(r.h[(1 << d) - 1], expected, 1e-10), `Q_${d}: ${r.h[(1 << d) - 1]} vs ${expected}`);
        if (d === 3) assert.ok(relClose(expected, 10, 1e-15));
      }
    });
  }

  it('laziness scales every hitting time by exactly 1 / (1 - a) (engine.md section 1)', () => {
    const g = randomRoom(15, 30, true, 7);
    const base = exactReach(g, [0, 4]);
    const lazy = exactReach(g, [0, 4], { laziness: 0.3 });
    for (let i = 0; i < 15; i++) assert.ok(relClose(lazy.h[i], base.h[i] / 0.7, 1e-12));
  });
});

describe('exact reach: identities', () => {
  // Commute time H(i,j) + H(j,i) = vol * R_eff(i,j) (Chandra, Raghavan, Ruzzo, Smolensky & Tiwari, STOC 1989);
  // R_eff from the Laplacian pseudo-inverse computed by ml-matrix.
  it('commute time identity on a weighted room', () => {
    const g = randomRoom(14, 25, false, 11);
    const n = 14;
    const L = Matrix.zeros(n, n);
    let vol = 0;
    for (const t of g.ties) {
      L.set(t.source, t.source, L.get(t.source, t.source) + t.strength);
      L.set(t.target, t.target, L.get(t.target, t.target) + t.strength);
      L.set(t.source, t.target, L.get(t.source, t.target) - t.strength);
      L.set(t.target, t.source, L.get(t.target, t.source) - t.strength);
      vol += 2 * t.strength;
    }
    const Lp = pseudoInverse(L);
    const e = ergodicData(prepareRoom(g));
    for (const [i, j] of [
      [0, 5],
      [3, 9],
      [12, 1],
    ]) {
      const r = Lp.get(i, i) + Lp.get(j, j) - 2 * Lp.get(i, j);
      const commute = exactReach(g, [j]).h[i] + exactReach(g, [i]).h[j];
      assert.ok(relClose(commute, vol * r, 1e-9), `${commute} vs ${vol * r}`);
      assert.ok(relClose(hittingTime(e, i, j) + hittingTime(e, j, i), vol * r, 1e-9));
    }
  });

  // Kemeny's constant sum_j pi_j H(i,j) does not depend on i (Kemeny & Snell, Finite Markov Chains, 1960).
  it("Kemeny's constant is the same from every start (directed, with mixing)", () => {
    const g = randomRoom(20, 40, true, 5);
    const e = ergodicData(prepareRoom(g, { mixing: 0.05 }));
    const k0 = kemenyFrom(e, 0);
    for (let i = 1; i < 20; i++) assert.ok(relClose(kemenyFrom(e, i), k0, 1e-9));
  });
});

/** Independent reference: I - Q built from the tie list here and solved by ml-matrix's LU. */
function referenceReach(g: RoomGraph, starters: number[], mixing = 0, laziness = 0): number[] {
  const n = g.ids.length;
  const W = Matrix.zeros(n, n);
  for (const t of g.ties) {
    W.set(t.source, t.target, W.get(t.source, t.target) + t.strength);
    if (!g.directed) W.set(t.target, t.source, W.get(t.target, t.source) + t.strength);
  }
  const T = [...Array(n).keys()].filter((i) => !starters.includes(i));
  const A = Matrix.zeros(T.length, T.length);
  T.forEach((i, r) => {
    const s = W.getRow(i).reduce((a, b) => a + b, 0);
    T.forEach((j, c) => {
      const p = (1 - laziness) * ((1 - mixing) * (W.get(i, j) / s) + mixing / n) + (i === j ? laziness : 0);
      A.set(r, c, (r === c ? 1 : 0) - p);
    });
  });
  const x = solve(A, Matrix.ones(T.length, 1));
  const h = new Array(n).fill(0);
  T.forEach((i, r) => (h[i] = x.get(r, 0)));
  return h;
}

describe('exact reach agrees with ml-matrix to 1e-9 relative', () => {
  for (const directed of [false, true]) {
    for (let seed = 1; seed <= 6; seed++) {
      it(`${directed ? 'directed' : 'undirected'} weighted room, seed ${seed}`, () => {
        const n = 25 + seed * 3;
        const g = randomRoom(n, 3 * n, directed, 100 + seed);
        const A = [seed, (seed * 7) % n];
        const mixing = seed % 2 === 0 ? 0.02 : 0;
        const laziness = seed % 3 === 0 ? 0.25 : 0;
        const ref = referenceReach(g, A, mixing, laziness);
        for (const solver of solvers) {
          const r = exactReach(g, A, { solver, mixing, laziness });
          for (let i = 0; i < n; i++) assert.ok(relClose(r.h[i], ref[i], 1e-9), `${solver} person ${i}: ${r.h[i]} vs ${ref[i]}`);
        }
      });
    }
  }
});

describe('exact reach with the fill-reducing order (n >= 64) agrees with ml-matrix', () => {
  for (const [n, extra, directed] of [
    [90, 120, false],
    [150, 900, false],
    [100, 250, true],
    [140, 700, true],
  ] as const) {
    it(`${directed ? 'directed' : 'undirected'} weighted room, n = ${n}`, () => {
      const g = randomRoom(n, extra, directed, 700 + n);
      const A = [3, 50];
      const ref = referenceReach(g, A);
      const r = exactReach(g, A, { solver: 'dense' });
      assert.equal(r.solver, directed ? 'lu' : 'ldlt');
      for (let i = 0; i < n; i++) assert.ok(relClose(r.h[i], ref[i], 1e-9));
    });
  }
});

describe('exact reach on open data sets: dense and conjugate gradient agree', () => {
  for (const [name, g] of [
    ['karate club (Zachary 1977)', karateClub()],
    ['Les Misérables (Knuth 1993)', miserables()],
  ] as const) {
    it(name, () => {
      const A = [0, 5];
      const d = exactReach(g, A, { solver: 'dense' });
      const s = exactReach(g, A, { solver: 'sparse' });
      assert.equal(d.solver, 'ldlt');
      assert.equal(s.solver, 'cg');
      for (let i = 0; i < g.ids.length; i++) assert.ok(relClose(d.h[i], s.h[i], 1e-9));
      assert.ok(relClose(d.total, s.total, 1e-10));
      assert.ok(
        relClose(
          d.total,
          referenceReach(g, A).reduce((a, b) => a + b, 0),
          1e-9,
        ),
      );
    });
  }
});

describe('iterative solvers on one-way chains (BiCGSTAB falls back to GMRES)', () => {
  // Directed cycle 0 -> 1 -> ... -> n-1 -> 0 with starter 0: person i hears after exactly n - i hops.
  for (const n of [4, 5, 12]) {
    it(`directed cycle of ${n}`, () => {
      const g = room(
        n,
        Array.from({ length: n }, (_, i) => [i, (i + 1) % n, 0.5 + i] as [number, number, number]),
        true,
      );
      const r = exactReach(g, [0], { solver: 'sparse' });
      for (let i = 1; i < n; i++) assert.ok(relClose(r.h[i], n - i, 1e-9), `${i}: ${r.h[i]}`);
    });
  }
});

describe('exact reach: unreachable people are named, never NaN', () => {
  it('disconnected undirected room', () => {
    const g = room(5, [
      [0, 1],
      [1, 2],
      [3, 4],
    ]);
    for (const solver of solvers) {
      const r = exactReach(g, [0], { solver });
      assert.deepEqual(
        r.unreachable.map((u) => [u.index, u.reason]),
        [
          [3, 'no-path'],
          [4, 'no-path'],
        ],
      );
      assert.equal(r.total, Infinity);
      assert.ok(relClose(r.reachableTotal, r.h[1] + r.h[2], 1e-12));
      assert.ok(!Array.from(r.h).some(Number.isNaN));
      assert.match(r.unreachable[0].message, /p3/);
    }
  });
  it('directed room: a closed group without a starter, and a person who may drift into it', () => {
    // 1 -> 0, 1 -> 2 <-> 3: {2,3} is closed without a starter; 1 reaches 0 but may get stuck.
    const g = room(
      4,
      [
        [1, 0],
        [1, 2],
        [2, 3],
        [3, 2],
        [0, 1],
      ],
      true,
    );
    const r = exactReach(g, [0]);
    assert.deepEqual(
      r.unreachable.map((u) => [u.index, u.reason]),
      [
        [1, 'may-get-stuck'],
        [2, 'no-path'],
        [3, 'no-path'],
      ],
    );
    const mixed = exactReach(g, [0], { mixing: 0.1 });
    assert.equal(mixed.unreachable.length, 0);
    assert.ok(Number.isFinite(mixed.total));
  });
  it('bad input throws EngineError with a code', () => {
    assert.throws(
      () => exactReach(path(3), []),
      (e: unknown) => e instanceof EngineError && e.code === 'INVALID_STARTERS',
    );
    assert.throws(
      () => exactReach(path(3), [9]),
      (e: unknown) => e instanceof EngineError && e.code === 'UNKNOWN_PERSON',
    );
    assert.throws(
      () => exactReach(path(3), [0], { mixing: 1 }),
      (e: unknown) => e instanceof EngineError && e.code === 'INVALID_OPTION',
    );
    assert.throws(
      () => exactReach(path(3), [0], { laziness: -0.1 }),
      (e: unknown) => e instanceof EngineError && e.code === 'INVALID_OPTION',
    );
  });
});

describe('exact reach: dense and sparse solvers agree on many random rooms (property-based, seeded)', () => {
  it('same h, same unreachable people', () => {
    fc.assert(
      fc.property(
        fc.record({
          n: fc.integer({ min: 2, max: 40 }),
          extra: fc.integer({ min: 0, max: 80 }),
          directed: fc.boolean(),
          connected: fc.boolean(),
          seed: fc.integer({ min: 1, max: 1_000_000 }),
          starters: fc.integer({ min: 1, max: 4 }),
          mixing: fc.constantFrom(0, 0, 0.03),
          laziness: fc.constantFrom(0, 0.4),
        }),
        (c) => {
          const g = randomRoom(c.n, c.extra, c.directed, c.seed, c.connected);
          const A = Array.from({ length: Math.min(c.starters, c.n - 1) }, (_, q) => (c.seed * (q + 1)) % c.n);
          const opts = { mixing: c.mixing, laziness: c.laziness };
          const d = exactReach(g, A, { ...opts, solver: 'dense' });
          const s = exactReach(g, A, { ...opts, solver: 'sparse' });
          assert.deepEqual(s.unreachable, d.unreachable);
          for (let i = 0; i < c.n; i++) {
            assert.ok(!Number.isNaN(d.h[i]) && !Number.isNaN(s.h[i]));
            if (Number.isFinite(d.h[i])) assert.ok(relClose(s.h[i], d.h[i], 1e-8), `${i}: ${s.h[i]} vs ${d.h[i]}`);
            else assert.equal(s.h[i], Infinity);
          }
        },
      ),
      { seed: 4242, numRuns: 300 },
    );
  });
});
