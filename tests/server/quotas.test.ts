import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { config } from '../../server/config';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { makeRoom, ringRoom, waitForJob, type MadeRoom } from './plans-support';

/**
 * Per-user quotas (set here through the config the environment fills): open jobs, cascades asked
 * for at once, plans kept. A refused request says which limit and what to do, stores nothing, and
 * another account is not affected by the first one's use.
 */
describe('per-user quotas', () => {
  let server: TestServer;
  let client: TestClient;
  let other: TestClient;
  let room: MadeRoom;
  const saved = { ...config };
  before(async () => {
    Object.assign(config, { MAX_OPEN_JOBS_PER_USER: 2, MAX_OPEN_CASCADES_PER_USER: 50_000, MAX_PLANS_PER_USER: 4 });
    server = await startTestServer();
    client = (await signedInClient(server)).client;
    other = (await signedInClient(server)).client;
    room = await makeRoom(client, ringRoom(110, 200, 3), 'Quota ring');
  });
  after(async () => {
    Object.assign(config, saved);
    await server.stop();
  });

  const plans = async (c: TestClient, roomId: number) => (await c.get<unknown[]>(`/api/rooms/${roomId}/plans`)).body.length;
  /** A search that cannot finish in the test's time: it stays an open job until cancelled. */
  const longSearch = (c: TestClient, roomId: number) =>
    c.post(`/api/rooms/${roomId}/plans`, { k: 6, method: 'exhaustive', timeLimitSeconds: 120 });

  it('a third open job is refused with 429 naming the limit; after a cancel it is accepted', async () => {
    const first = await longSearch(client, room.id);
    const second = await longSearch(client, room.id);
    assert.equal(first.status, 202, first.text);
    assert.equal(second.status, 202, second.text);
    const before = await plans(client, room.id);
    const third = await longSearch(client, room.id);
    assert.equal(third.status, 429, third.text);
    assert.equal(third.body.error.code, 'quota_jobs');
    assert.match(third.body.error.message, /at most 2\).*cancel one/);
    assert.equal(await plans(client, room.id), before, 'the refused plan was not stored');

    // Another account's jobs are not counted against it.
    const theirs = await makeRoom(other, ringRoom(12, 4), 'Their room');
    const elsewhere = await longSearch(other, theirs.id);
    assert.equal(elsewhere.status, 202, elsewhere.text);
    await other.post(`/api/jobs/${elsewhere.body.job.id}/cancel`, {});

    assert.equal((await client.post(`/api/jobs/${first.body.job.id}/cancel`, {})).status, 200);
    const again = await longSearch(client, room.id);
    assert.equal(again.status, 202, again.text);
    for (const j of [second.body.job.id, again.body.job.id]) await client.post(`/api/jobs/${j}/cancel`, {});
    for (const j of [first.body.job.id, second.body.job.id, again.body.job.id]) {
      assert.equal((await waitForJob(client, j)).status, 'cancelled');
    }
  });

  it('a rehearsal asking for more cascades than the open-cascade limit is refused before anything is queued', async () => {
    const plan = await client.post<{ id: number }>(`/api/rooms/${room.id}/plans`, { starters: [room.personIds[0]] });
    assert.equal(plan.status, 201, plan.text);
    const r = await client.post(`/api/plans/${plan.body.id}/rehearsals`, { runs: 60_000, seed: 'quota' });
    assert.equal(r.status, 429, r.text);
    assert.equal(r.body.error.code, 'quota_cascades');
    assert.match(r.body.error.message, /limit of 50,000/);
    assert.equal((await client.get<unknown[]>(`/api/rooms/${room.id}/rehearsals?planId=${plan.body.id}`)).body.length, 0);
    const fits = await client.post<{ job: { id: number } }>(`/api/plans/${plan.body.id}/rehearsals`, { runs: 2_000, seed: 'quota' });
    assert.equal(fits.status, 202, fits.text);
    assert.equal((await waitForJob(client, fits.body.job.id)).status, 'done');
  });

  it('plans kept are capped per account: the next one answers 409 until one is deleted', async () => {
    const small = await makeRoom(client, ringRoom(12, 4), 'Small');
    // The jobs test left 3 plans (cancelled searches) and the rehearsal test 1: the account is at its limit of 4.
    const stored = async () => (await plans(client, room.id)) + (await plans(client, small.id));
    assert.equal(await stored(), 4);
    const refused = await client.post(`/api/rooms/${small.id}/plans`, { k: 2, method: 'greedy' });
    assert.equal(refused.status, 409, refused.text);
    assert.equal(refused.body.error.code, 'quota_plans');
    assert.match(refused.body.error.message, /delete plans you no longer need/);
    assert.equal(await stored(), 4);
    const list = (await client.get<{ id: number }[]>(`/api/rooms/${room.id}/plans`)).body;
    assert.equal((await client.delete(`/api/plans/${list[0]!.id}`)).status, 204);
    const made = await client.post(`/api/rooms/${small.id}/plans`, { k: 2, method: 'greedy' });
    assert.equal(made.status, 201, made.text);
  });
});
