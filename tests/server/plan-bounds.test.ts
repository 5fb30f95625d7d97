/**
 * Shared proven bounds: plans of the same room version, k and constraints share one lower bound,
 * so a plan of any method whose total equals a certified optimum is shown as proven best, and a
 * plan made before the certificate gains it when read again. Checked on Zachary's karate club
 * (Zachary 1977) against a brute-force scan of every pair of starters (exact reach per pair).
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { closePools } from '../../server/jobs/pools';
import { exactReach, prepareRoom } from '../../shared/engine/index';
import type { PlanDetail, PlanStarted, PlanSummary } from '../../shared/api/plans';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { karateClub, makeRoom, waitForJob, type MadeRoom } from './plans-support';
import { firstOf } from '../../shared/checked';

const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a));

describe('shared plan bounds', () => {
  let server: TestServer;
  let client: TestClient;
  let room: MadeRoom;
  const graph = karateClub();
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
    room = await makeRoom(client, graph, 'Karate bounds');
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  const plans = () => `/api/rooms/${room.id}/plans`;
  async function exhaustive(body: Record<string, unknown>): Promise<PlanDetail> {
    const r = await client.post<PlanStarted>(plans(), { method: 'exhaustive', timeLimitSeconds: 60, ...body });
    assert.equal(r.status, 202, r.text);
    const job = await waitForJob(client, r.body.job.id);
    assert.equal(job.status, 'done', job.message ?? '');
    return (await client.get<PlanDetail>(`/api/plans/${r.body.plan.id}`)).body;
  }

  it('a greedy plan made before the exhaustive search gains its certificate; a hand-made optimum is proven best', async () => {
    const greedy = await client.post<PlanDetail>(plans(), { k: 2, method: 'greedy' });
    assert.equal(greedy.status, 201, greedy.text);
    const best = await exhaustive({ k: 2 });
    assert.ok(best.certified && best.gap === 0, 'exhaustive certifies k = 2');

    // Independent of the planners: every pair of starters, scored by exact reach.
    const prepared = prepareRoom(graph, { laziness: 0, mixing: 0 });
    let optimum = Infinity;
    for (let a = 0; a < graph.ids.length; a++)
      for (let b = a + 1; b < graph.ids.length; b++) optimum = Math.min(optimum, exactReach(prepared, [a, b]).total);
    assert.ok(close(best.total!, optimum), `exhaustive ${best.total} vs brute force ${optimum}`);

    const again = (await client.get<PlanDetail>(`/api/plans/${greedy.body.id}`)).body;
    assert.ok(close(again.lowerBound!, optimum), 'the greedy plan now carries the proven optimum as its bound');
    assert.equal(again.certified, close(again.total!, optimum));
    assert.ok(close(again.gap!, again.certified ? 0 : again.total! - optimum));
    assert.equal(again.optimumKnown, true);
    // The search proved it, unless the greedy run's own supermodular bound already reached the optimum.
    assert.ok(['search', 'supermodular'].includes(again.boundSource ?? ''), String(again.boundSource));

    const hand = await client.post<PlanDetail>(plans(), { starters: best.starters.map((s) => s.personId) });
    assert.equal(hand.status, 201, hand.text);
    assert.equal(hand.body.certified, true, 'the optimal set picked by hand is proven best');
    assert.equal(hand.body.gap, 0);

    const list = (await client.get<PlanSummary[]>(plans())).body;
    const listed = list.find((p) => p.id === greedy.body.id)!;
    assert.equal(listed.lowerBound, again.lowerBound, 'the list shows the same shared bound');
  });

  it('plans with other constraints or another k do not borrow the bound', async () => {
    const k3 = await client.post<PlanDetail>(plans(), { k: 3, method: 'greedy' });
    const best2 = (await client.get<PlanSummary[]>(plans())).body.find((p) => p.k === 2 && p.methodUsed === 'exhaustive')!;
    assert.ok(k3.body.lowerBound! < best2.total!, 'k = 3 keeps its own (smaller) bound');
    const starterOf2 = firstOf(best2.starters, 'starters of the k = 2 optimum').personId;
    const without = await client.post<PlanDetail>(plans(), { k: 2, method: 'greedy', cannotBrief: [starterOf2] });
    assert.equal(without.status, 201, without.text);
    assert.ok(without.body.total! >= best2.total! - 1e-9, 'excluding a starter of the optimum cannot beat it');
    assert.ok(without.body.lowerBound! <= without.body.total! + 1e-9);
    // The constrained problem has its own key: proven best only when its own bound meets its own total.
    assert.equal(
      without.body.certified,
      without.body.optimumKnown && Math.abs(without.body.total! - without.body.lowerBound!) <= 1e-9 * without.body.total!,
    );
  });
});
