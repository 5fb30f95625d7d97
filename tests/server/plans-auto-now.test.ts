/**
 * Small automatic plans are computed in the request (PLAN_LIMITS.autoInlineMaxSets): 201 without a
 * job, the best plan (checked against every starter set scored on its own), and what the job
 * would have stored (the key's bound and saved search, so the next run of the key continues it).
 * Larger searches, no-show plans and plans asked for in the background stay jobs; the job quota
 * applies as it does to the job.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { and, eq } from 'drizzle-orm';
import { planBounds } from '../../db/schema/plan-bounds';
import { config } from '../../server/config';
import { db } from '../../server/db';
import { closePools } from '../../server/jobs/pools';
import { autoRunsNow, setsAtMost } from '../../server/plans/where-it-runs';
import { exactReach, prepareRoom } from '../../shared/engine/index';
import { PLAN_LIMITS, type PlanDetail, type PlanStarted } from '../../shared/api/plans';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { makeRoom, ringRoom, waitForJob } from './plans-support';

/** Every k-set of 0..n-1. */
function* sets(n: number, k: number, from = 0, chosen: number[] = []): Generator<number[]> {
  if (chosen.length === k) {
    yield [...chosen];
    return;
  }
  for (let i = from; i <= n - (k - chosen.length); i++) yield* sets(n, k, i + 1, [...chosen, i]);
}

describe('automatic plans computed in the request', () => {
  let server: TestServer;
  let client: TestClient;
  const saved = { open: config.MAX_OPEN_JOBS_PER_USER };
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
  });
  after(async () => {
    config.MAX_OPEN_JOBS_PER_USER = saved.open;
    await closePools();
    await server.stop();
  });

  it('counts the starter sets against the limit exactly, and stops counting once past it', () => {
    assert.equal(setsAtMost(12, 4, 495), true, 'C(12, 4) = 495');
    assert.equal(setsAtMost(12, 4, 494), false);
    assert.equal(setsAtMost(40, 3, 9880), true, 'C(40, 3) = 9880');
    assert.equal(setsAtMost(40, 3, 9879), false);
    assert.equal(setsAtMost(120, 60, 10_000), false, 'C(120, 60) is about 1e35');
    assert.equal(setsAtMost(7, 0, 1), true);
    assert.equal(setsAtMost(7, 7, 1), true);
  });

  it('only plain automatic plans of small searches run now; required and excluded people shrink the search', () => {
    const limit = PLAN_LIMITS.autoInlineMaxSets;
    assert.ok(setsAtMost(30, 3, limit) && !setsAtMost(30, 4, limit), 'the cases below sit on both sides of the limit');
    assert.equal(autoRunsNow({ k: 3 }, 30, 0, 0), true, 'method auto is the default');
    assert.equal(autoRunsNow({ k: 4, method: 'auto' }, 30, 0, 0), false);
    assert.equal(autoRunsNow({ k: 4, method: 'auto' }, 30, 1, 0), true, 'one required person: 3 of 29 left to choose');
    assert.equal(autoRunsNow({ k: 4, method: 'auto' }, 30, 0, 5), false, 'C(25, 4) = 12,650');
    assert.equal(autoRunsNow({ k: 3, method: 'auto', noShow: 0.1 }, 30, 0, 0), false);
    assert.equal(autoRunsNow({ k: 3, method: 'auto', background: true }, 30, 0, 0), false);
    assert.equal(autoRunsNow({ k: 3, method: 'exhaustive' }, 30, 0, 0), false);
    assert.equal(autoRunsNow({ k: 1, method: 'auto' }, PLAN_LIMITS.exhaustiveMaxPeople + 1, 0, 0), false);
  });

  it('a 12-person automatic plan answers 201 without a job: the best set, its bound and saved search stored for the key', async () => {
    const graph = ringRoom(12, 4, 11);
    const room = await makeRoom(client, graph, 'Auto now');
    const k = 3;
    const r = await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { k, method: 'auto' });
    assert.equal(r.status, 201, r.text);
    assert.equal(r.body.jobId, null, 'no job was queued');
    assert.equal(r.body.status, 'ready');
    assert.equal(r.body.certified, true);
    assert.equal(r.body.gap, 0);
    assert.equal(r.body.proving, null);
    // Every 3-set of the room scored on its own (220 exact reach solves): none is faster.
    const prepared = prepareRoom(graph, {});
    let best = Infinity;
    for (const s of sets(12, k)) best = Math.min(best, exactReach(prepared, s).total);
    assert.ok(Math.abs(r.body.total! - best) <= 1e-9 * best, `total ${r.body.total} against the best set's ${best}`);

    const [bound] = await db
      .select()
      .from(planBounds)
      .where(and(eq(planBounds.roomId, room.id), eq(planBounds.k, k)));
    assert.ok(bound, 'the key has a bound row');
    assert.ok(Math.abs(bound.lowerBound - r.body.total!) <= 1e-9 * best, 'the proven optimum is the key bound');
    assert.equal(bound.searchState?.runs, 1, 'the finished search is saved with the key');
    const again = await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { k, method: 'auto' });
    assert.equal(again.status, 201, again.text);
    assert.ok(
      again.body.notes.some((n) => /continued where an earlier one/.test(n)),
      again.body.notes.join(' / '),
    );
    assert.deepEqual(
      again.body.starters.map((s) => s.personId),
      r.body.starters.map((s) => s.personId),
    );
  });

  it('a search over more sets than the limit, or one asked for in the background, is still a job', async () => {
    const room = await makeRoom(client, ringRoom(30, 20, 5), 'Auto as a job');
    const big = await client.post<PlanDetail | PlanStarted>(`/api/rooms/${room.id}/plans`, { k: 4, method: 'auto' });
    assert.ok(big.status === 201 || big.status === 202, big.text);
    const plan = 'job' in big.body ? big.body.plan : big.body;
    assert.notEqual(plan.jobId, null, 'C(30, 4) = 27,405 sets: a job');
    if ('job' in big.body) assert.equal((await waitForJob(client, big.body.job.id)).status, 'done');
    const asked = await client.post<PlanStarted>(`/api/rooms/${room.id}/plans`, { k: 2, method: 'auto', background: true });
    assert.equal(asked.status, 202, asked.text);
    assert.equal((await waitForJob(client, asked.body.job.id)).status, 'done');
  });

  it('the job quota applies to a plan computed in the request as to its job: 429 and nothing stored', async () => {
    const room = await makeRoom(client, ringRoom(110, 200, 3), 'Auto quota');
    config.MAX_OPEN_JOBS_PER_USER = 1;
    const long = await client.post<PlanStarted>(`/api/rooms/${room.id}/plans`, { k: 6, method: 'exhaustive', timeLimitSeconds: 120 });
    assert.equal(long.status, 202, long.text);
    const small = await makeRoom(client, ringRoom(12, 4, 2), 'Auto quota small');
    const refused = await client.post(`/api/rooms/${small.id}/plans`, { k: 2, method: 'auto' });
    assert.equal(refused.status, 429, refused.text);
    assert.equal(refused.body.error.code, 'quota_jobs');
    assert.equal((await client.get<unknown[]>(`/api/rooms/${small.id}/plans`)).body.length, 0, 'the refused plan was not stored');
    await client.post(`/api/jobs/${long.body.job.id}/cancel`, {});
    assert.equal((await waitForJob(client, long.body.job.id)).status, 'cancelled');
    const fits = await client.post<PlanDetail>(`/api/rooms/${small.id}/plans`, { k: 2, method: 'auto' });
    assert.equal(fits.status, 201, fits.text);
  });
});
