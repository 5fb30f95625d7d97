/**
 * Proven lower bounds (docs/bounds.md), branch and bound, search progress and cancellation,
 * and no-show plans, each checked against brute force over all k-sets (and, for no-shows, over
 * all 2^k subsets of attendance, each solved independently by exactReach) on many small random
 * rooms (fast-check, fixed seed).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { exactReach, plan, type PlanProgress, type RoomGraph } from '../../shared/engine/index';
import { planContext } from '../../shared/engine/plan-context';
import { firstStarterBounds, oneHopBound, oneHopBoundSparse } from '../../shared/engine/plan-bounds';
import { kSets, randomRoom, relClose } from './engine-fixtures';

const roomArb = fc
  .record({
    n: fc.integer({ min: 4, max: 9 }),
    extra: fc.integer({ min: 0, max: 16 }),
    directed: fc.boolean(),
    seed: fc.integer({ min: 1, max: 1_000_000 }),
    kFrac: fc.double({ min: 0, max: 0.99, noNaN: true }),
    mixing: fc.constantFrom(0, 0, 0.05),
    laziness: fc.constantFrom(0, 0, 0.3),
  })
  .map((r) => ({
    g: randomRoom(r.n, r.extra, r.directed, r.seed, true),
    k: 1 + Math.floor(r.kFrac * (r.n - 1)),
    mixing: r.mixing,
    laziness: r.laziness,
  }));

function optimum(g: RoomGraph, k: number, walk: { mixing: number; laziness: number }): number {
  let best = Infinity;
  for (const s of kSets(g.ids.length, k)) best = Math.min(best, exactReach(g, s, walk).total);
  return best;
}

describe('lower bounds never exceed the brute-force optimum (property-based, seeded)', () => {
  it('first-starter pair bound, one-hop bound, and every planner lowerBound', () => {
    fc.assert(
      fc.property(roomArb, ({ g, k, mixing, laziness }) => {
        const walk = { mixing, laziness };
        const opt = optimum(g, k, walk);
        const tol = 1e-9 * opt;
        const ctx = planContext(g, { k, ...walk });
        const scale = 1 / (1 - laziness);
        assert.ok(oneHopBound(ctx) * scale <= opt + tol, 'one-hop bound');
        assert.ok(Math.abs(oneHopBoundSparse(ctx) - oneHopBound(ctx)) <= 1e-9 * Math.max(1, Math.abs(oneHopBound(ctx))), 'sparse one-hop');
        const fb = firstStarterBounds(ctx, k);
        if (fb) assert.ok(Math.min(...fb.bound) * scale <= opt + tol, 'pair bound');
        for (const method of ['greedy', 'widened', 'swap'] as const) {
          const r = plan(g, { k, method, ...walk });
          assert.ok(r.lowerBound <= opt + tol, `${method} lowerBound ${r.lowerBound} > optimum ${opt}`);
          assert.ok(r.total >= opt - tol);
        }
        const sparse = plan(g, { k, method: 'greedy', ...walk, sparseFrom: 2 });
        assert.ok(sparse.lowerBound <= opt + tol, `sparse greedy lowerBound ${sparse.lowerBound} > optimum ${opt}`);
      }),
      { numRuns: 250, seed: 9090 },
    );
  });
});

describe('dual bound of a search node (bound 4 of docs/bounds.md, property-based, seeded)', () => {
  // Source of the device: Minoux, "Accelerated greedy algorithms for maximizing submodular set
  // functions" (1978), and Nemhauser, Wolsey & Fisher, "An analysis of approximations for
  // maximizing submodular set functions" (1978): F(X) - top_r gains at X bounds every set near X.
  it('never exceeds the best completion S ∪ B over all r-subsets B of the candidates, and equals F(S ∪ Y) - top_r gains', async () => {
    const { AbsorbingState, prepareRoom } = await import('../../shared/engine/index');
    const { CandState } = await import('../../shared/engine/plan-branch-state');
    const arb = fc.record({
      n: fc.integer({ min: 6, max: 11 }),
      extra: fc.integer({ min: 0, max: 20 }),
      directed: fc.boolean(),
      seed: fc.integer({ min: 1, max: 1_000_000 }),
      s: fc.integer({ min: 1, max: 2 }),
      r: fc.integer({ min: 1, max: 4 }),
    });
    fc.assert(
      fc.property(arb, ({ n, extra, directed, seed, s, r }) => {
        const room = prepareRoom(randomRoom(n, extra, directed, seed, true), {});
        const set = Array.from({ length: s }, (_, q) => (q * 5 + seed) % n).filter((v, q, a) => a.indexOf(v) === q);
        const cand = Int32Array.from(Array.from({ length: n }, (_, i) => i).filter((i) => !set.includes(i)));
        if (cand.length < r + 1) return;
        const full = AbsorbingState.fromStarters(room, set);
        const node = new CandState(n).load(full, cand);
        const dual = node.dualBound(r, new CandState(n), new Uint8Array(n));
        let best = Infinity;
        for (const b of kSets(cand.length, r)) best = Math.min(best, exactReach(room, [...set, ...b.map((q) => cand[q])]).total);
        assert.ok(dual <= best + 1e-9 * best, `dual ${dual} > best completion ${best}`);
        // Independent value: greedy r-completion Y by exact totals, then F(S ∪ Y) - top_r gains.
        const Y = [...set];
        for (let step = 0; step < r; step++) {
          const totals = [...cand].filter((c) => !Y.includes(c)).map((c) => ({ c, t: exactReach(room, [...Y, c]).total }));
          totals.sort((a, b) => a.t - b.t);
          if (totals.length > 1 && Math.abs(totals[1].t - totals[0].t) < 1e-7 * totals[0].t) return; // a near tie: greedy may pick either
          Y.push(totals[0].c);
        }
        const fy = exactReach(room, Y).total;
        const gains = [...cand]
          .filter((c) => !Y.includes(c))
          .map((c) => Math.max(0, fy - exactReach(room, [...Y, c]).total))
          .sort((a, b) => b - a);
        const expected = fy - gains.slice(0, r).reduce((t, g) => t + g, 0);
        assert.ok(relClose(dual, expected, 1e-8), `dual ${dual}, independent ${expected}`);
      }),
      { numRuns: 300, seed: 4242 },
    );
  });
});

describe('branch and bound (property-based, seeded)', () => {
  it('finds the optimum, certified implies lowerBound = total, never worse than widened/swap at any time limit', () => {
    fc.assert(
      fc.property(roomArb, fc.constantFrom(0.01, 1, 10_000), ({ g, k, mixing, laziness }, limit) => {
        const walk = { mixing, laziness };
        const opt = optimum(g, k, walk);
        const ex = plan(g, { k, method: 'exhaustive', timeLimitMs: limit, ...walk });
        const sw = plan(g, { k, method: 'swap', ...walk });
        const wi = plan(g, { k, method: 'widened', ...walk });
        assert.ok(ex.total <= Math.min(sw.total, wi.total) * (1 + 1e-12), 'never worse than the heuristics');
        assert.ok(ex.lowerBound <= opt * (1 + 1e-9));
        if (ex.certified) {
          assert.equal(ex.lowerBound, ex.total);
          assert.equal(ex.gap, 0);
          assert.ok(relClose(ex.total, opt, 1e-9), `certified ${ex.total} vs brute force ${opt}`);
        } else assert.ok(ex.searchLeft! > 0);
        if (limit === 10_000) assert.ok(ex.certified);
      }),
      { numRuns: 150, seed: 4242 },
    );
  });

  it('reports progress that only grows and stops on request with a proven gap', () => {
    const g = randomRoom(40, 60, false, 77);
    const seen: PlanProgress[] = [];
    const full = plan(g, { k: 5, method: 'exhaustive', onProgress: (p) => p.stage === 'exhaustive' && seen.push(p) });
    assert.ok(full.certified);
    assert.ok(seen.length >= 2);
    for (let q = 1; q < seen.length; q++) assert.ok(seen[q].fraction! >= seen[q - 1].fraction!);
    assert.equal(seen[seen.length - 1].fraction, 1);
    let calls = 0;
    const stopped = plan(g, { k: 7, method: 'exhaustive', shouldStop: () => ++calls > 3 });
    assert.equal(stopped.stopped, true);
    assert.equal(stopped.certified, false);
    assert.ok(stopped.lowerBound <= stopped.total && stopped.searchLeft! > 0);
    const controller = new AbortController();
    controller.abort();
    const aborted = plan(g, { k: 7, method: 'exhaustive', signal: controller.signal });
    assert.ok(aborted.stopped && aborted.total <= plan(g, { k: 7, method: 'swap' }).total * (1 + 1e-12));
  });
});

/** Independent evaluation: every attendance subset solved from scratch by exactReach. */
function expectedBySubsets(g: RoomGraph, set: number[], p: number, walk: { mixing: number; laziness: number }): number {
  const k = set.length;
  let sum = 0;
  for (let mask = 1; mask < 1 << k; mask++) {
    const shows = set.filter((_, q) => mask & (1 << q));
    sum += (1 - p) ** shows.length * p ** (k - shows.length) * exactReach(g, shows, walk).total;
  }
  return sum / (1 - p ** k);
}

describe('no-show plans (property-based, seeded)', () => {
  const undirected = roomArb.filter((c) => !c.g.directed || c.mixing > 0);
  it('expected total equals the weighted mean over all 2^k subsets to 1e-9; exhaustive finds the brute-force best', () => {
    fc.assert(
      fc.property(undirected, fc.double({ min: 0, max: 0.5, noNaN: true }), ({ g, k, mixing, laziness }, p) => {
        const walk = { mixing, laziness };
        const r = plan(g, { k, method: 'exhaustive', noShow: p, ...walk });
        const ns = r.noShow!;
        assert.ok(relClose(ns.expectedTotal, expectedBySubsets(g, r.starters, p, walk), 1e-9));
        assert.ok(relClose(ns.nobodyChance, p ** k, 1e-12));
        let best = Infinity;
        for (const s of kSets(g.ids.length, k)) best = Math.min(best, expectedBySubsets(g, s, p, walk));
        assert.ok(relClose(ns.expectedTotal, best, 1e-9), `no-show exhaustive ${ns.expectedTotal} vs ${best}`);
        if (k >= 2) {
          const missing = r.starters.map(
            (s) =>
              exactReach(
                g,
                r.starters.filter((t) => t !== s),
                walk,
              ).total,
          );
          assert.ok(relClose(ns.worstAbsence.total, Math.max(...missing), 1e-9));
        }
      }),
      { numRuns: 120, seed: 5151 },
    );
  });
});

describe('branch and bound on worker threads', () => {
  it('two piscina workers certify the same optimum as the one-thread search and report growing progress', async () => {
    const { exhaustiveParallel } = await import('../../shared/engine/parallel/parallel-branch');
    const { planStart, planFinish } = await import('../../shared/engine/plan');
    const g = randomRoom(36, 50, false, 31);
    const one = plan(g, { k: 6, method: 'exhaustive' });
    const fractions: number[] = [];
    const step = planStart(g, { k: 6, method: 'exhaustive', onProgress: (p) => p.fraction !== undefined && fractions.push(p.fraction) });
    assert.ok(!('result' in step));
    // soloMs = 0: every piece goes to the workers.
    const two = planFinish(step, await exhaustiveParallel(step.ctx, step.start, 2, 0));
    assert.ok(one.certified && two.certified);
    assert.ok(relClose(one.total, two.total, 1e-9));
    assert.equal(two.lowerBound, two.total);
    for (let q = 1; q < fractions.length; q++) assert.ok(fractions[q] >= fractions[q - 1] - 1e-12);
  });
});

describe('branch and bound sharing its best total with other threads', () => {
  it("returns its own best set with that set's own total, even when another thread holds a lower total", async () => {
    const { planStart } = await import('../../shared/engine/plan');
    const { BranchSearch } = await import('../../shared/engine/plan-exhaustive');
    for (const seed of [3, 17, 41]) {
      const g = randomRoom(24, 30, false, seed);
      const step = planStart(g, { k: 4, method: 'exhaustive' });
      assert.ok(!('result' in step));
      const best = plan(g, { k: 4, method: 'exhaustive' });
      assert.ok(best.certified);
      const scale = 1 / (1 - step.ctx.room.laziness);
      // Another thread has (say) already found a total below everything this thread can reach.
      const lower = (best.total / scale) * 0.9;
      const link = { best: () => lower, offer: () => undefined, publish: () => undefined };
      const incumbent = { starters: [...step.start.starters], rawTotal: step.start.rawTotal, scale };
      const search = new BranchSearch(step.ctx, incumbent, link);
      const items = search.prepare();
      let next = 0;
      search.searchItems(items, () => (next < items.length ? next++ : -1));
      const out = search.outcome();
      const own = exactReach(g, out.state.starters).total;
      assert.ok(relClose(out.state.total, own, 1e-9), `seed ${seed}: reported ${out.state.total}, the set's total is ${own}`);
    }
  });
});

describe('bounding search after a heuristic plan', () => {
  it('boundMs keeps the heuristic plan and raises its proven bound to the certified optimum on a small room', () => {
    const g = randomRoom(30, 40, false, 12);
    const plain = plan(g, { k: 4, method: 'greedy' });
    const bounded = plan(g, { k: 4, method: 'greedy', boundMs: 5000 });
    const best = plan(g, { k: 4, method: 'exhaustive' });
    assert.deepEqual(bounded.starters, plain.starters);
    assert.ok(best.certified);
    assert.ok(relClose(bounded.lowerBound, Math.min(best.total, bounded.total), 1e-9));
    assert.ok(bounded.lowerBound >= plain.lowerBound);
    assert.throws(() => plan(g, { k: 4, method: 'greedy', boundMs: -1 }), /bounding time/);
  });
});
