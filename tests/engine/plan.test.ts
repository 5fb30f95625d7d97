/**
 * Planners against brute force over all k-sets on many small random rooms (fast-check, fixed
 * seed), plus validation, tie-break, open data sets and the time limit of exhaustive search.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import {
  EngineError,
  exactReach,
  plan,
  prepareRoom,
  vertexCover,
  type PlanMethod,
  type PlanOptions,
  type RoomGraph,
} from '../../shared/engine/index';
import { complete, cycle, karateClub, kSets, miserables, randomRoom, relClose, room } from './engine-fixtures';

interface Case {
  g: RoomGraph;
  k: number;
  mixing: number;
  laziness: number;
  mustInclude: number[];
  exclude: number[];
}

function bruteForce(c: Case): { best: number; set: number[] | null } {
  const n = c.g.ids.length;
  let best = Infinity;
  let set: number[] | null = null;
  for (const s of kSets(n, c.k)) {
    if (!c.mustInclude.every((p) => s.includes(p)) || s.some((p) => c.exclude.includes(p))) continue;
    const t = exactReach(c.g, s, { mixing: c.mixing, laziness: c.laziness }).total;
    if (t < best) {
      best = t;
      set = s;
    }
  }
  return { best, set };
}

const caseArb = fc
  .record({
    n: fc.integer({ min: 4, max: 8 }),
    extra: fc.integer({ min: 0, max: 14 }),
    directed: fc.boolean(),
    connected: fc.boolean(),
    seed: fc.integer({ min: 1, max: 1_000_000 }),
    kFrac: fc.double({ min: 0, max: 0.99, noNaN: true }),
    mixing: fc.constantFrom(0, 0, 0.05),
    laziness: fc.constantFrom(0, 0, 0.3),
    constrain: fc.integer({ min: 0, max: 3 }),
  })
  .map((r): Case => {
    const g = randomRoom(r.n, r.extra, r.directed, r.seed, r.connected);
    const k = 1 + Math.floor(r.kFrac * (r.n - 1));
    const mustInclude = r.constrain === 1 ? [r.seed % r.n] : [];
    const exclude = r.constrain === 2 ? [(r.seed + 1) % r.n] : [];
    return { g, k, mixing: r.mixing, laziness: r.laziness, mustInclude, exclude };
  });

const methods: PlanMethod[] = ['greedy', 'widened', 'swap', 'exhaustive', 'lazy-greedy'];

function run(c: Case, method: PlanMethod | 'auto') {
  const opts: PlanOptions = { k: c.k, method, mixing: c.mixing, laziness: c.laziness, mustInclude: c.mustInclude, exclude: c.exclude };
  return plan(c.g, opts);
}

describe('planners vs brute force over all k-sets (property-based, seeded)', () => {
  it('no planner beats the optimum, exhaustive finds it, bounds hold, widened >= greedy, swap >= its start', () => {
    fc.assert(
      fc.property(caseArb, (c) => {
        const { best } = bruteForce(c);
        if (!Number.isFinite(best)) {
          // No feasible plan of this size: every planner must refuse with a typed error.
          for (const m of methods)
            assert.throws(
              () => run(c, m),
              (e: unknown) => e instanceof EngineError,
            );
          return;
        }
        const out = Object.fromEntries([...methods, 'auto' as const].map((m) => [m, run(c, m)]));
        for (const [m, r] of Object.entries(out)) {
          assert.equal(r.starters.length, c.k, m);
          assert.equal(new Set(r.starters).size, c.k, m);
          assert.ok(
            c.mustInclude.every((p) => r.starters.includes(p)),
            `${m} keeps required people`,
          );
          assert.ok(!r.starters.some((p) => c.exclude.includes(p)), `${m} avoids excluded people`);
          const check = exactReach(c.g, r.starters, { mixing: c.mixing, laziness: c.laziness }).total;
          assert.ok(relClose(r.total, check, 1e-9), `${m} total is the exact reach of its starters`);
          assert.ok(r.total >= best * (1 - 1e-9), `${m} cannot beat the optimum`);
          assert.ok(r.lowerBound <= best * (1 + 1e-9), `${m} lower bound ${r.lowerBound} <= optimum ${best}`);
          assert.ok(r.rank >= 0 && r.rank <= 1);
          assert.ok(relClose(r.average, r.total / (c.g.ids.length - c.k), 1e-12));
          if (r.certified) assert.ok(relClose(r.total, best, 1e-9), `${m} certified means optimal`);
        }
        assert.ok(relClose(out['exhaustive'].total, best, 1e-9), 'exhaustive = optimum');
        assert.equal(out['exhaustive'].certified, true);
        assert.ok(out['widened'].total <= out['greedy'].total * (1 + 1e-12), 'widened never worse than greedy');
        assert.ok(out['swap'].total <= out['greedy'].total * (1 + 1e-12), 'swap never worse than its start');
        assert.ok(out['widened'].rank >= out['greedy'].rank - 1e-12);
      }),
      { seed: 20240611, numRuns: 250 },
    );
  });

  it('a vertex cover is minimal (brute force) and reaches the cover bound n - k', () => {
    fc.assert(
      fc.property(caseArb, (c) => {
        const n = c.g.ids.length;
        const cov = vertexCover(c.g);
        assert.equal(cov.exact, true);
        const reach = exactReach(c.g, cov.cover);
        assert.equal(reach.unreachable.length, 0);
        assert.ok(relClose(reach.total, n - cov.size, 1e-12), 'total(cover) = n - |cover|');
        // No smaller set reaches n - k.
        if (cov.size > 1) for (const s of kSets(n, cov.size - 1)) assert.ok(!(exactReach(c.g, s).total <= n - s.length + 1e-9));
      }),
      { seed: 7, numRuns: 150 },
    );
  });
});

describe('planner behaviour', () => {
  it('tie-break: equal totals go to the earlier person (cycle, complete graph)', () => {
    assert.deepEqual(plan(cycle(9), { k: 1, method: 'greedy' }).starters, [0]);
    assert.deepEqual(plan(complete(6), { k: 2, method: 'greedy' }).starters, [0, 1]);
    assert.deepEqual(plan(complete(6), { k: 3, method: 'exhaustive' }).starters.sort(), [0, 1, 2]);
    // On C_400 every single starter has the same total (symmetry), and so do the two quarter points
    // once 0 and 200 are chosen: rounding must not split these ties.
    assert.deepEqual(plan(cycle(400), { k: 3, method: 'greedy' }).starters, [0, 200, 100]);
  });

  it('validation errors carry codes', () => {
    const g = randomRoom(10, 10, false, 3);
    const code = (opts: PlanOptions, input: RoomGraph = g) => {
      try {
        plan(input, opts);
      } catch (e) {
        assert.ok(e instanceof EngineError);
        assert.ok(e.message.length > 10);
        return e.code;
      }
      return 'none';
    };
    assert.equal(code({ k: 0 }), 'INVALID_K');
    assert.equal(code({ k: 10 }), 'INVALID_K');
    assert.equal(code({ k: 2.5 }), 'INVALID_K');
    assert.equal(code({ k: 2, mustInclude: [1, 2, 3] }), 'MUST_INCLUDE_TOO_MANY');
    assert.equal(code({ k: 2, mustInclude: [42] }), 'UNKNOWN_PERSON');
    assert.equal(code({ k: 2, exclude: [-1] }), 'UNKNOWN_PERSON');
    assert.equal(code({ k: 2, mustInclude: [1], exclude: [1] }), 'CONFLICTING_CONSTRAINTS');
    assert.equal(code({ k: 2, method: 'exhaustive', denseLimit: 5 }), 'EXHAUSTIVE_INFEASIBLE');
    assert.equal(code({ k: 2, method: 'nope' as PlanMethod }), 'INVALID_OPTION');
    assert.equal(code({ k: 2, nu: 2 }), 'INVALID_OPTION');
    // Three separate parts: k must be at least 3.
    const parts = room(7, [
      [0, 1],
      [2, 3],
      [3, 4],
      [5, 6],
    ]);
    assert.equal(code({ k: 2 }, parts), 'K_BELOW_CLOSED_GROUPS');
    assert.equal(code({ k: 3, exclude: [5, 6] }, parts), 'NO_FEASIBLE_PLAN');
    const ok = plan(parts, { k: 3, method: 'greedy' });
    assert.equal(ok.starters.length, 3);
    assert.ok(Number.isFinite(ok.total));
  });

  it('greedy reports the bound and the rank on the karate club (Zachary 1977)', () => {
    const g = karateClub();
    const ex = plan(g, { k: 3, method: 'exhaustive' });
    assert.equal(ex.certified, true);
    for (const m of ['greedy', 'widened', 'swap', 'lazy-greedy'] as const) {
      const r = plan(g, { k: 3, method: m });
      assert.equal(r.method, m);
      assert.ok(r.total >= ex.total * (1 - 1e-9));
      assert.ok(r.lowerBound <= ex.total * (1 + 1e-9));
      assert.ok(relClose(r.gap, r.total - r.lowerBound, 1e-9) || r.certified);
    }
    assert.equal(plan(g, { k: 1, method: 'greedy' }).certified, true);
  });

  it('lazy greedy on sparse solvers agrees with dense greedy on open data sets', () => {
    for (const g of [karateClub(), miserables()]) {
      for (const k of [2, 4, 6]) {
        const dense = plan(g, { k, method: 'greedy' });
        // With enough exact checks every round is proven, so the choices are exactly greedy's.
        const exact = plan(g, { k, method: 'lazy-greedy', lazyChecks: g.ids.length });
        assert.equal(exact.method, 'lazy-greedy');
        assert.match(exact.notes.join(' '), / in 0 of /);
        if (exact.starters[0] === dense.starters[0]) {
          assert.deepEqual(exact.starters, dense.starters);
          assert.ok(relClose(exact.total, dense.total, 1e-8));
        }
        const quick = plan(g, { k, method: 'lazy-greedy' });
        assert.ok(relClose(quick.total, exactReach(g, quick.starters).total, 1e-8));
        assert.ok(quick.lowerBound <= dense.total * (1 + 1e-9));
        assert.ok(exact.lowerBound <= dense.total * (1 + 1e-9));
      }
    }
  });

  it('above the dense limit auto runs the sparse exact greedy on undirected rooms and lazy greedy on directed ones', () => {
    const g = miserables();
    const r = plan(g, { k: 3, method: 'auto', denseLimit: 50 });
    assert.equal(r.method, 'greedy');
    assert.equal(r.solverPath, 'sparse-factor');
    assert.deepEqual(r.starters, plan(g, { k: 3, method: 'greedy', sparseFrom: Infinity }).starters);
    const d = plan(randomRoom(70, 200, true, 5), { k: 3, method: 'auto', denseLimit: 50 });
    assert.equal(d.method, 'lazy-greedy');
    assert.equal(d.solverPath, 'iterative');
  });

  it('exhaustive at its time limit returns the best found with a proven gap', () => {
    const g = randomRoom(70, 160, false, 21);
    const r = plan(g, { k: 8, method: 'exhaustive', timeLimitMs: 30 });
    assert.equal(r.method, 'exhaustive');
    assert.ok(r.warnings.some((w) => w.code === 'search-time-limit' && /^Time limit/.test(w.text)) || r.certified);
    assert.ok(r.lowerBound <= r.total);
    assert.ok(relClose(r.gap, r.certified ? 0 : r.total - r.lowerBound, 1e-12));
    const greedy = plan(g, { k: 8, method: 'greedy' });
    assert.ok(r.total <= greedy.total * (1 + 1e-12));
  });

  it('each kind of warning carries its code, with the numbers in its text', () => {
    const codes = (r: { warnings: readonly { code: string }[] }) => r.warnings.map((w) => w.code);
    // A deadline that has passed before the first seed is extended: widening, the search and
    // (when a pass improved) swap polish all stop at their first check.
    const cut = plan(miserables(), { k: 6, method: 'exhaustive', timeLimitMs: 0.001 });
    assert.equal(cut.certified, false);
    assert.ok(codes(cut).includes('widening-time-limit'), JSON.stringify(cut.warnings));
    assert.ok(codes(cut).includes('search-time-limit'), JSON.stringify(cut.warnings));
    for (const w of cut.warnings) assert.ok(['widening-time-limit', 'swap-time-limit', 'search-time-limit'].includes(w.code), w.code);
    // The count is of the seeds extended, at least the one after which the clock was read.
    const seeds = cut.warnings.find((w) => w.code === 'widening-time-limit')!.text;
    assert.match(seeds, /^Time limit reached after [1-9]\d* of \d+ seeds\.$/);
    const fromBase = plan(miserables(), { k: 4, method: 'widened', mustInclude: [0], timeLimitMs: 0.001 });
    assert.deepEqual(fromBase.warnings, [{ code: 'widening-time-limit', text: 'Time limit reached while widening.' }]);

    const sparse = plan(miserables(), { k: 3, method: 'swap', denseLimit: 50 });
    assert.deepEqual(codes(sparse), ['over-dense-limit']);
    assert.match(sparse.warnings[0].text, /77 people, above the dense limit of 50: exact greedy was used instead of swap/);
    const lazy = plan(randomRoom(70, 200, true, 5), { k: 3, method: 'swap', denseLimit: 50 });
    assert.deepEqual(codes(lazy), ['over-dense-limit']);
    assert.match(lazy.warnings[0].text, /lazy greedy was used instead of swap/);

    // 34 choose 4 = 46 376 plans, above the 20 000 the no-show exhaustive scores one by one.
    const noShow = plan(karateClub(), { k: 4, method: 'exhaustive', noShow: 0.1 });
    assert.deepEqual(codes(noShow), ['no-show-not-exhaustive']);
    assert.deepEqual(plan(karateClub(), { k: 2, method: 'greedy' }).warnings, []);
  });

  it('plans with mixing and laziness scale consistently', () => {
    const g = prepareRoom(randomRoom(12, 20, true, 8));
    const a = plan(g, { k: 3, method: 'exhaustive' });
    const b = plan(g, { k: 3, method: 'exhaustive', laziness: 0.5 });
    assert.deepEqual([...a.starters].sort(), [...b.starters].sort());
    assert.ok(relClose(b.total, 2 * a.total, 1e-10));
    assert.ok(relClose(b.lowerBound, 2 * a.lowerBound, 1e-9) || b.certified);
  });
});
