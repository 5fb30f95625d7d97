/**
 * Rehearsal jobs end to end against real MariaDB and the real worker pool: server-sent events,
 * cancel, the per-user queue, idempotent starts, start-up recovery (a job left running becomes
 * interrupted and never shows results), and reproducibility from the seed.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { eq } from 'drizzle-orm';
import { jobs } from '../../db/schema/plans';
import { db } from '../../server/db';
import { closePools } from '../../server/jobs/pools';
import { endJob } from '../../server/jobs/store';
import { simulate } from '../../shared/engine/index';
import type { JobEvent, RehearsalDetail } from '../../shared/api/plans';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { karateClub, makeRoom, readEvents, ringRoom, waitForJob, type MadeRoom } from './plans-support';
import { itemAt } from '../../shared/checked';

describe('rehearsal jobs', () => {
  let server: TestServer;
  let client: TestClient;
  let karate: MadeRoom;
  let planId: number;
  let slowPlanId: number;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
    karate = await makeRoom(client, karateClub(), 'Karate');
    planId = (await client.post(`/api/rooms/${karate.id}/plans`, { k: 2, method: 'greedy' })).body.id;
    // One starter on a ring of 300: walks of thousands of hops, so a rehearsal takes a while.
    const ring = await makeRoom(client, ringRoom(300, 0), 'Slow ring');
    slowPlanId = (await client.post(`/api/rooms/${ring.id}/plans`, { starters: [ring.personIds[0]] })).body.id;
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  async function detail(id: number): Promise<RehearsalDetail> {
    return (await client.get<RehearsalDetail>(`/api/rehearsals/${id}`)).body;
  }

  it('streams queued/progress events and the final state over SSE, then closes', async () => {
    const start = await client.post(`/api/plans/${planId}/rehearsals`, { runs: 20000, seed: 'sse-1' });
    assert.equal(start.status, 202, start.text);
    const id = start.body.rehearsal.id;
    const { events, contentType, raw } = await readEvents(client, `/api/rehearsals/${id}/events`);
    assert.match(contentType, /^text\/event-stream/);
    assert.match(raw, /^retry: 3000/);
    const types = events.map((e) => e.type);
    assert.equal(types.at(-1), 'done', types.join(','));
    const fractions = events.filter((e) => e.type === 'progress').map((e) => e.fraction!);
    assert.ok(fractions.length >= 2, `progress events: ${fractions.join(',')}`);
    for (const [i, f] of fractions.entries()) if (i > 0) assert.ok(f >= itemAt(fractions, i - 1, 'progress'), 'progress never goes back');
    assert.ok(
      fractions.some((f) => f > 0 && f < 1),
      'some progress strictly between 0 and 1',
    );
    const last = events.at(-1) as JobEvent;
    assert.equal(last.job.status, 'done');
    assert.equal(last.job.progress, 1);
    // A late subscriber gets the final state at once.
    const late = await readEvents(client, `/api/rehearsals/${id}/events`, 5000);
    assert.deepEqual(
      late.events.map((e) => e.type),
      ['done'],
    );
    const d = await detail(id);
    assert.equal(d.status, 'done');
    assert.equal(d.people.length, 34);
    assert.ok(d.verdict && d.verdict.agrees, d.verdict?.line);
    assert.match(d.verdict!.line, /^Agrees with the analysis/);
  });

  it('the same seed gives identical stored results; the numbers are the engine’s; another seed differs', async () => {
    const first = (await client.post(`/api/plans/${planId}/rehearsals`, { runs: 3000, seed: 'same-seed' })).body.rehearsal.id;
    await waitForJob(client, (await detail(first)).jobId);
    const again = await client.post(`/api/rehearsals/${first}/rerun`, {});
    assert.equal(again.status, 202, again.text);
    assert.equal(again.body.reused, false);
    const second = again.body.rehearsal.id;
    assert.notEqual(second, first);
    await waitForJob(client, again.body.job.id);
    const a = await detail(first);
    const b = await detail(second);
    assert.equal(b.seed, 'same-seed');
    assert.equal(b.rerunOf, first);
    assert.deepEqual(b.people, a.people);
    assert.deepEqual(b.reach, a.reach);
    assert.equal(b.average, a.average);
    assert.deepEqual(b.verdict, a.verdict);
    // The stored means are exactly what the engine computes in this thread for that seed.
    const plan = (await client.get(`/api/plans/${planId}`)).body;
    const graph = karateClub();
    const index = new Map(karate.personIds.map((id, i) => [id, i]));
    const local = simulate(
      graph,
      plan.starters.map((s: { personId: number }) => index.get(s.personId)!),
      3000,
      'same-seed',
    );
    assert.deepEqual(
      a.people.map((p) => p.mean),
      Array.from(local.mean),
    );
    const other = (await client.post(`/api/plans/${planId}/rehearsals`, { runs: 3000, seed: 'other-seed' })).body;
    await waitForJob(client, other.job.id);
    assert.notDeepEqual(
      (await detail(other.rehearsal.id)).people.map((p) => p.mean),
      a.people.map((p) => p.mean),
    );
  });

  it('starting is idempotent: one key, or the same plan + seed + runs just now, starts one job', async () => {
    const body = { runs: 1000, seed: 'twice', idempotencyKey: 'click-1' };
    const [r1, r2] = await Promise.all([
      client.post(`/api/plans/${planId}/rehearsals`, body),
      client.post(`/api/plans/${planId}/rehearsals`, body),
    ]);
    assert.equal(r1.body.rehearsal.id, r2.body.rehearsal.id);
    assert.deepEqual([r1.body.reused, r2.body.reused].sort(), [false, true]);
    const r3 = await client.post(`/api/plans/${planId}/rehearsals`, { runs: 1000, seed: 'twice' });
    const r4 = await client.post(`/api/plans/${planId}/rehearsals`, { runs: 1000, seed: 'twice' });
    assert.equal(r4.body.rehearsal.id, r3.body.rehearsal.id);
    assert.equal(r4.body.reused, true);
    const r5 = await client.post(`/api/plans/${planId}/rehearsals`, { runs: 1000 });
    const r6 = await client.post(`/api/plans/${planId}/rehearsals`, { runs: 1000 });
    assert.equal(r6.body.rehearsal.id, r5.body.rehearsal.id, 'a double click without seed or key');
    assert.match(r5.body.rehearsal.seed, /^[0-9a-f]{16}$/, 'a random seed is chosen, returned and stored');
    const reusedKey = await client.post(`/api/plans/${planId}/rehearsals`, { runs: 999, idempotencyKey: 'click-1' });
    assert.equal(reusedKey.status, 409, reusedKey.text);
    for (const r of [r1, r3, r5]) await waitForJob(client, r.body.job.id);
  });

  it('cancel stops the work and leaves no results presented as complete', async () => {
    const start = (await client.post(`/api/plans/${slowPlanId}/rehearsals`, { runs: 3000, seed: 'cancel-me' })).body;
    const id = start.rehearsal.id;
    const stream = readEvents(client, `/api/rehearsals/${id}/events`);
    for (let i = 0; i < 200 && (await client.get(`/api/jobs/${start.job.id}`)).body.status !== 'running'; i++)
      await new Promise((r) => setTimeout(r, 25));
    const c = await client.post(`/api/rehearsals/${id}/cancel`, {});
    assert.equal(c.status, 200, c.text);
    assert.equal(c.body.status, 'cancelled');
    const { events } = await stream;
    assert.equal(events.at(-1)!.type, 'cancelled');
    await new Promise((r) => setTimeout(r, 300));
    const d = await detail(id);
    assert.equal(d.status, 'cancelled');
    assert.equal(d.average, null);
    assert.equal(d.verdict, null);
    assert.deepEqual(d.people, []);
    assert.equal(d.reach, null);
    const samples = await client.get(`/api/rehearsals/${id}/samples`);
    assert.equal(samples.status, 400);
    assert.equal(samples.body.error.code, 'not_ready');
    const replay = await client.get(`/api/rehearsals/${id}/replay`);
    assert.equal(replay.status, 400);
    assert.equal(replay.body.error.code, 'not_ready');
  });

  it('a per-user limit: the third job waits in the queue with its position, and starts when one ends', async () => {
    const starts = [];
    for (const seed of ['q1', 'q2', 'q3'])
      starts.push((await client.post(`/api/plans/${slowPlanId}/rehearsals`, { runs: 3000, seed })).body);
    assert.equal(starts[2].job.status, 'queued');
    assert.equal(starts[2].job.queuePosition, 1);
    const events = readEvents(client, `/api/jobs/${starts[2].job.id}/events`);
    await client.post(`/api/jobs/${starts[0].job.id}/cancel`, {});
    for (let i = 0; i < 200 && (await client.get(`/api/jobs/${starts[2].job.id}`)).body.status === 'queued'; i++)
      await new Promise((r) => setTimeout(r, 25));
    assert.equal((await client.get(`/api/jobs/${starts[2].job.id}`)).body.status, 'running');
    await client.post(`/api/jobs/${starts[1].job.id}/cancel`, {});
    await client.post(`/api/jobs/${starts[2].job.id}/cancel`, {});
    const seen = (await events).events;
    const [first] = seen;
    assert.ok(first, 'at least one event');
    assert.equal(first.type, 'queued');
    assert.equal(first.position, 1);
    assert.ok(seen.some((e) => e.type === 'started'));
    assert.equal(seen.at(-1)!.type, 'cancelled');
  });

  it('a job ended from elsewhere while it runs never gets its late result written; it can be re-run', async () => {
    const start = (await client.post(`/api/plans/${slowPlanId}/rehearsals`, { runs: 400, seed: 'crash' })).body;
    for (let i = 0; i < 200 && (await client.get(`/api/jobs/${start.job.id}`)).body.status !== 'running'; i++)
      await new Promise((r) => setTimeout(r, 25));
    // Another process ends the row (as a cancel from another web process would).
    assert.ok(await endJob(start.job.id, 'interrupted', 'Ended elsewhere; nothing partial was kept.'));
    const [row] = await db.select().from(jobs).where(eq(jobs.id, start.job.id));
    assert.ok(row, 'the job row');
    assert.equal(row.status, 'interrupted');
    // This process's worker still computes; the final write must see the row is no longer running.
    await new Promise((r) => setTimeout(r, 200));
    for (let i = 0; i < 600; i++) {
      const d = await detail(start.rehearsal.id);
      assert.equal(d.status, 'interrupted');
      assert.equal(d.average, null);
      if (i > 20) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    const rerun = await client.post(`/api/rehearsals/${start.rehearsal.id}/rerun`, {});
    assert.equal(rerun.status, 202, rerun.text);
    assert.equal(rerun.body.rehearsal.seed, 'crash');
    await client.post(`/api/jobs/${rerun.body.job.id}/cancel`, {});
  });

  it('the history lists a room’s rehearsals with filters', async () => {
    const all = (await client.get(`/api/rooms/${karate.id}/rehearsals`)).body;
    assert.ok(all.length >= 5);
    const done = (await client.get(`/api/rooms/${karate.id}/rehearsals?status=done`)).body;
    assert.ok(done.length > 0 && done.every((r: { status: string }) => r.status === 'done'));
    const byPlan = (await client.get(`/api/rooms/${karate.id}/rehearsals?planId=${planId}`)).body;
    assert.ok(byPlan.every((r: { planId: number }) => r.planId === planId));
    const future = (await client.get(`/api/rooms/${karate.id}/rehearsals?from=2999-01-01`)).body;
    assert.deepEqual(future, []);
    const past = (await client.get(`/api/rooms/${karate.id}/rehearsals?to=2000-01-01`)).body;
    assert.deepEqual(past, []);
  });
});
