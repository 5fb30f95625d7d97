/**
 * Saved searches and proving in the background. A search stopped at its time limit leaves its
 * state with the key's bound row (plan_bounds.search_state); the next search of the same room
 * version, k and constraints continues it, so nodes add up over the runs. An automatic plan shown
 * with a gap above 0 gets a background proof job that continues the search, tightens the shared
 * bound and never changes the shown plan. Room: the demo all-hands room (60 people in six groups,
 * seed-data/rooms.ts), where ten starters take a few seconds to prove; the optimum is checked against an uninterrupted
 * search of the engine, which tests/engine checks against brute force on small rooms.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { and, eq } from 'drizzle-orm';
import { planBounds } from '../../db/schema/plan-bounds';
import { config } from '../../server/config';
import { db } from '../../server/db';
import { closePools } from '../../server/jobs/pools';
import { planWithWorkers } from '../../shared/engine/parallel/index';
import type { JobEvent, PlanDetail, PlanStarted } from '../../shared/api/plans';
import { allHandsContent } from '../../seed-data/rooms';
import type { RoomGraph } from '../../shared/engine/index';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { makeRoom, readEvents, waitForJob, type MadeRoom } from './plans-support';

/** Reads a job's event stream until a progress event carries a proven lower bound (true) or the stream ends (false). */
async function provenBoundOnStream(client: TestClient, jobId: number): Promise<boolean> {
  const stop = new AbortController();
  const res = await fetch(`${client.baseUrl}/api/jobs/${jobId}/events`, {
    headers: { cookie: client.cookieHeader(), accept: 'text/event-stream' },
    signal: stop.signal,
  });
  const reader = res.body!.getReader();
  const text = new TextDecoder();
  let buf = '';
  try {
    for (;;) {
      const { value, done } = await reader.read();
      if (done) return false;
      buf += text.decode(value, { stream: true });
      for (const block of buf.split('\n\n').slice(0, -1)) {
        const data = /^data: (.+)$/m.exec(block)?.[1];
        const e = data ? (JSON.parse(data) as JobEvent) : null;
        if (e?.type === 'progress' && typeof e.search?.lowerBound === 'number') return true;
        if (e && ['done', 'failed', 'cancelled', 'interrupted'].includes(e.type)) return false;
      }
    }
  } finally {
    stop.abort();
  }
}

/** The demo all-hands room as an engine graph. */
function allHands(): RoomGraph {
  const c = allHandsContent();
  return {
    ids: c.people.map((p) => p.key),
    directed: false,
    ties: c.ties.map((t) => ({ source: t.source, target: t.target, strength: t.strength })),
  };
}

const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a));

describe('saved searches and proving in the background', () => {
  let server: TestServer;
  let client: TestClient;
  const saved = { proof: config.PROOF_SECONDS, open: config.MAX_OPEN_JOBS_PER_USER };
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
  });
  after(async () => {
    config.PROOF_SECONDS = saved.proof;
    config.MAX_OPEN_JOBS_PER_USER = saved.open;
    await closePools();
    await server.stop();
  });

  async function stateOf(room: MadeRoom, k: number) {
    const [row] = await db
      .select()
      .from(planBounds)
      .where(and(eq(planBounds.roomId, room.id), eq(planBounds.k, k)));
    return row;
  }

  async function planned(room: MadeRoom, body: Record<string, unknown>): Promise<PlanDetail> {
    const r = await client.post<PlanStarted | PlanDetail>(`/api/rooms/${room.id}/plans`, body);
    assert.ok(r.status === 201 || r.status === 202, r.text);
    const id = 'job' in r.body ? r.body.plan.id : r.body.id;
    if ('job' in r.body) assert.equal((await waitForJob(client, r.body.job.id, 120_000)).status, 'done');
    return (await client.get<PlanDetail>(`/api/plans/${id}`)).body;
  }

  it('a search stopped at its time limit is stored and the next search of the key continues it', async () => {
    config.PROOF_SECONDS = 0;
    const room = await makeRoom(client, allHands(), 'Saved search');
    const first = await planned(room, { k: 10, method: 'exhaustive', timeLimitSeconds: 1 });
    assert.equal(first.certified, false, 'k = 10 is not settled in one second');
    const one = (await stateOf(room, 10))!.searchState!;
    assert.equal(one.runs, 1);
    assert.equal(one.nodes, first.extras!.nodes);
    assert.ok(one.closed < one.space && one.open.length + (one.pieces - one.from) > 0, 'something is left open');

    const second = await planned(room, { k: 10, method: 'exhaustive', timeLimitSeconds: 1 });
    assert.ok(
      second.notes.some((n) => /continued where an earlier one/.test(n)),
      second.notes.join(' / '),
    );
    const two = (await stateOf(room, 10))!.searchState!;
    assert.equal(two.runs, 2, 'the second run continued the first');
    assert.equal(two.nodes, one.nodes + (second.extras!.nodes ?? NaN), 'nodes add up over the runs');
    assert.ok(two.closed >= one.closed, 'decided groups only grow');
    assert.ok(second.lowerBound! >= first.lowerBound! * (1 - 1e-12), 'the proven bound never falls');
    assert.ok(second.total! <= first.total! * (1 + 1e-12), 'the best total never rises');

    // Another k is another problem: it starts afresh.
    await planned(room, { k: 9, method: 'exhaustive', timeLimitSeconds: 1 });
    assert.equal((await stateOf(room, 9))!.searchState!.runs, 1);
  });

  it('an automatic plan left with a gap goes on proving in the background until the gap is 0; the shown plan stays as made', async () => {
    config.PROOF_SECONDS = 90;
    const graph = allHands();
    const room = await makeRoom(client, graph, 'Background proof');
    const shown = await planned(room, { k: 10, method: 'auto', timeLimitSeconds: 1 });
    assert.equal(shown.certified, false, 'one second does not settle k = 10');
    assert.ok(shown.proving, 'a background proof was queued with the plan');
    assert.ok(await provenBoundOnStream(client, shown.proving.jobId), 'the stream carries the proven bound as it rises');
    assert.equal((await waitForJob(client, shown.proving.jobId, 150_000)).status, 'done');
    const { events } = await readEvents(client, `/api/jobs/${shown.proving.jobId}/events`, 10_000);
    assert.equal(events[0]?.type, 'done', 'a late reader gets the final state at once');

    const after = (await client.get<PlanDetail>(`/api/plans/${shown.id}`)).body;
    assert.deepEqual(
      after.starters.map((s) => s.personId),
      shown.starters.map((s) => s.personId),
      'the shown plan keeps its starters',
    );
    assert.equal(after.total, shown.total);
    assert.equal(after.proving, null);
    assert.equal(after.searchSoFar?.finished, true);
    // On worker threads: this process also serves the API, whose connections must not stall.
    const optimum = await planWithWorkers(graph, { k: 10, method: 'exhaustive', timeLimitMs: 600_000 }, 2);
    assert.ok(optimum.certified);
    if (close(after.total!, optimum.total)) {
      assert.equal(after.certified, true, 'proven best without a click');
      assert.equal(after.gap, 0);
    } else {
      assert.ok(after.fasterPlanId, 'the faster plan found in the background is offered');
      const faster = (await client.get<PlanDetail>(`/api/plans/${after.fasterPlanId}`)).body;
      assert.ok(close(faster.total!, optimum.total));
      assert.equal(faster.certified, true);
      assert.ok(close(after.lowerBound!, optimum.total), 'the shown plan carries the proven optimum as its bound');
    }
    const state = (await stateOf(room, 10))!.searchState!;
    assert.equal(state.closed, state.space);
    assert.ok(state.runs >= 2 && state.nodes >= (shown.extras!.nodes ?? 0));
  });

  it('no background proof past the job quota, and none for plans that are not automatic', async () => {
    config.PROOF_SECONDS = 90;
    const room = await makeRoom(client, allHands(), 'Quota proof');
    const exhaustive = await planned(room, { k: 10, method: 'exhaustive', timeLimitSeconds: 1 });
    assert.equal(exhaustive.certified, false);
    assert.equal(exhaustive.proving, null, 'a plan that is not automatic is proven by hand');
    config.MAX_OPEN_JOBS_PER_USER = 1; // the plan's own job fills it
    try {
      const fresh = await makeRoom(client, allHands(), 'Quota proof, no saved search');
      const auto = await planned(fresh, { k: 10, method: 'auto', timeLimitSeconds: 1 });
      assert.equal(auto.certified, false);
      assert.equal(auto.proving, null, 'no proof beyond the quota');
    } finally {
      config.MAX_OPEN_JOBS_PER_USER = saved.open;
    }
  });
});
