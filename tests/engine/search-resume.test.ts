/**
 * A branch and bound stopped part-way and continued from its saved state (shared/engine/plan-resume.ts)
 * must end exactly where one uninterrupted search ends: the same optimum, the same certificate,
 * and (on one thread, where the order of the search is fixed) the same nodes in total, split
 * between the runs. Every run in between keeps a plan no worse than the heuristic incumbent and a
 * lower bound that never falls. The optimum itself is checked against the uninterrupted search,
 * which plan.test.ts checks against brute force over every k-set on small rooms.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { exactReach, plan, type PlanOptions, type PlanResult, type RoomGraph } from '../../shared/engine/index';
import { planWithWorkers } from '../../shared/engine/parallel/index';
import { groupRoom } from '../bench/team-rooms';
import { randomRoom, relClose } from './engine-fixtures';

type Planner = (g: RoomGraph, o: PlanOptions) => Promise<PlanResult> | PlanResult;

/** Runs the search in pieces of budgets[i] nodes (cycling) until it certifies; returns every run. */
async function inPieces(g: RoomGraph, base: PlanOptions, budgets: number[], run: Planner = plan): Promise<PlanResult[]> {
  const runs: PlanResult[] = [];
  let resume: PlanResult['resume'];
  for (let i = 0; i < 10_000; i++) {
    const r = await run(g, { ...base, maxNodes: budgets[i % budgets.length], ...(resume ? { resume } : {}) });
    runs.push(r);
    if (r.certified) return runs;
    assert.ok(r.resume, 'a stopped search leaves its state');
    resume = r.resume;
  }
  throw new Error('the search never finished');
}

function checkRuns(g: RoomGraph, runs: PlanResult[], whole: PlanResult, heuristicTotal: number, exactNodes: boolean): void {
  const last = runs[runs.length - 1];
  assert.ok(last.certified);
  assert.deepEqual(
    [...last.starters].sort((a, b) => a - b),
    [...whole.starters].sort((a, b) => a - b),
  );
  assert.ok(relClose(last.total, whole.total, 1e-12), `${last.total} vs ${whole.total}`);
  assert.equal(last.lowerBound, last.total);
  const runNodes = runs.reduce((t, r) => t + (r.nodes ?? 0), 0);
  assert.equal(last.resume?.nodes, runNodes, 'the saved count is the sum of the runs');
  assert.equal(last.resume?.runs, runs.length);
  assert.equal(last.resume?.closed, last.resume?.space, 'every k-set decided once');
  if (exactNodes) assert.equal(runNodes, whole.nodes, 'the runs visit exactly the nodes of one uninterrupted search');
  let lower = -Infinity;
  let closed = 0;
  for (const r of runs) {
    assert.ok(r.total <= heuristicTotal * (1 + 1e-12), 'never worse than the heuristic incumbent');
    assert.ok(r.lowerBound <= whole.total * (1 + 1e-12), 'a proven bound never passes the optimum');
    assert.ok(r.lowerBound >= lower - 1e-9 * Math.abs(lower), 'the proven bound never falls between runs');
    assert.ok((r.resume?.closed ?? 0) >= closed, 'decided sets only grow');
    lower = r.lowerBound;
    closed = r.resume?.closed ?? 0;
    assert.ok(relClose(r.total, exactReach(g, r.starters).total, 1e-9), 'the reported total is the set’s own');
  }
}

describe('resuming a stopped branch and bound', () => {
  it('one thread: any split of the nodes reaches the same optimum, certificate and node count as one run', async () => {
    const cases: [RoomGraph, number, number[][]][] = [
      [
        randomRoom(40, 60, false, 5),
        5,
        [
          [3, 17],
          [64, 5, 300],
        ],
      ],
      [groupRoom(7), 5, [[577], [1201, 64, 2900]]],
    ];
    for (const [g, k, schedules] of cases) {
      const whole = plan(g, { k, method: 'exhaustive', timeLimitMs: 600_000 });
      const heuristic = plan(g, { k, method: 'swap' });
      assert.ok(whole.certified);
      assert.ok((whole.nodes ?? 0) > 100, 'the search is long enough to be cut');
      for (const budgets of schedules) {
        const runs = await inPieces(g, { k, method: 'exhaustive', timeLimitMs: 600_000 }, budgets);
        assert.ok(runs.length > 2, `budgets ${budgets.join(',')}: cut into ${runs.length} runs`);
        checkRuns(g, runs, whole, heuristic.total, true);
      }
    }
  });

  it('auto plans resume too, and a finished state answers at once with the certified optimum', async () => {
    const g = groupRoom(11);
    const whole = plan(g, { k: 5, method: 'auto', timeLimitMs: 600_000 });
    const runs = await inPieces(g, { k: 5, method: 'auto', timeLimitMs: 600_000 }, [900]);
    checkRuns(g, runs, whole, plan(g, { k: 5, method: 'swap' }).total, true);
    const again = plan(g, { k: 5, method: 'auto', resume: runs[runs.length - 1].resume! });
    assert.ok(again.certified);
    assert.equal(again.nodes, 0, 'nothing left to search');
    assert.ok(relClose(again.total, whole.total, 1e-12));
  });

  it('two threads: resumed runs reach the single-thread optimum and certificate, and their counts add up', async () => {
    const g = groupRoom(7);
    const whole = plan(g, { k: 6, method: 'exhaustive', timeLimitMs: 600_000 });
    const runs = await inPieces(g, { k: 6, method: 'exhaustive', timeLimitMs: 600_000 }, [2500], (gg, o) => planWithWorkers(gg, o, 2));
    assert.ok(runs.length > 2, `cut into ${runs.length} runs`);
    checkRuns(g, runs, whole, plan(g, { k: 6, method: 'swap' }).total, false);
  });

  it('a saved state of another problem is not used: the search starts afresh and says so', () => {
    const g = groupRoom(7);
    const part = plan(g, { k: 5, method: 'exhaustive', maxNodes: 500 });
    assert.ok(!part.certified && part.resume);
    const other = plan(g, { k: 5, method: 'exhaustive', mustInclude: [3], maxNodes: 500, resume: part.resume });
    assert.ok(other.notes.some((n) => /did not match/.test(n)));
    assert.equal(other.resume?.runs, 1);
    const tampered = plan(g, { k: 5, method: 'exhaustive', maxNodes: 500, resume: { ...part.resume, bestRaw: part.resume.bestRaw * 0.5 } });
    assert.ok(tampered.notes.some((n) => /did not match/.test(n)));
    assert.ok(tampered.total >= part.total * (1 - 1e-12), 'a claimed total is never taken on trust');
  });
});
