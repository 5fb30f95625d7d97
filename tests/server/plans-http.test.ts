/**
 * Plan API: per-person expected hops, minutes and reach curve checked against closed forms,
 * the stale flag, list / rename / choose / compare / delete, the k-sweep, background plan jobs
 * with SSE and re-run, and the briefing sheet exports (CSV safe against formula injection, PDF).
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { closePools } from '../../server/jobs/pools';
import type { RoomGraph } from '../../shared/engine/index';
import type { KSweepResult, PlanDetail } from '../../shared/api/plans';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { karateClub, makeRoom, readEvents, ringRoom, waitForJob } from './plans-support';
import { itemAt } from '../../shared/checked';

const path = (n: number): RoomGraph => ({
  ids: Array.from({ length: n + 1 }, (_, i) => `v${i}`),
  directed: false,
  ties: Array.from({ length: n }, (_, i) => ({ source: i, target: i + 1, strength: 1 })),
});

const complete = (n: number): RoomGraph => {
  const ties = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) ties.push({ source: i, target: j, strength: 1 });
  return { ids: Array.from({ length: n }, (_, i) => `k${i}`), directed: false, ties };
};

describe('plans API', () => {
  let server: TestServer;
  let client: TestClient;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  it('per-person expected hops and minutes match the gambler’s ruin h_i = i (n - i) on a path with both ends briefed', async () => {
    // Levin, Peres, Wilmer, Markov Chains and Mixing Times (2009), gambler's ruin: E[T] = i (n - i).
    const n = 10;
    const room = await makeRoom(client, path(n), 'Path', { minutesPerHop: 2 });
    const r = await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { starters: [room.personIds[0], room.personIds[n]] });
    assert.equal(r.status, 201, r.text);
    for (let i = 0; i <= n; i++) {
      const p = itemAt(r.body.perPerson, i, 'per-person row');
      assert.equal(p.personId, room.personIds[i]);
      assert.ok(Math.abs(p.expectedHops - i * (n - i)) < 1e-9, `person ${i}: ${p.expectedHops}`);
      assert.ok(Math.abs(p.expectedMinutes - 2 * i * (n - i)) < 1e-9);
      assert.equal(p.starter, i === 0 || i === n);
    }
    let total = 0;
    for (let i = 1; i < n; i++) total += i * (n - i);
    assert.ok(Math.abs(r.body.total! - total) < 1e-9);
    assert.ok(Math.abs(r.body.average! - total / (n - 1)) < 1e-9);
    assert.ok(Math.abs(r.body.averageMinutes! - (2 * total) / (n - 1)) < 1e-9);
  });

  it('the reach curve on a complete room with one starter is geometric: 1 - (1 - 1/(n-1))^t', async () => {
    // From K_n a walk hits a given person with probability 1/(n-1) per hop (Lovász 1993, random walks on graphs: a survey).
    const n = 12;
    const room = await makeRoom(client, complete(n), 'Complete', { minutesPerHop: 3 });
    const r = await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { k: 1, method: 'greedy' });
    assert.equal(r.status, 201, r.text);
    const reach = r.body.reach!;
    const q = 1 - 1 / (n - 1);
    for (let t = 0; t < Math.min(40, reach.byHop.length); t++) {
      const byHop = itemAt(reach.byHop, t, 'reach by hop');
      assert.ok(Math.abs(byHop - (1 - q ** t)) < 1e-9, `hop ${t}: ${byHop}`);
      assert.equal(itemAt(reach.byMinute, t, 'reach by minute').minutes, 3 * t);
    }
    const half = reach.quantiles.find((x) => x.share === 0.5)!;
    const ninety = reach.quantiles.find((x) => x.share === 0.9)!;
    assert.equal(half.hop, Math.ceil(Math.log(0.5) / Math.log(q)));
    assert.equal(ninety.hop, Math.ceil(Math.log(0.1) / Math.log(q)));
    assert.equal(ninety.minutes, 3 * ninety.hop!);
    assert.equal(reach.quantiles.find((x) => x.share === 1)!.hop, null, '100% is never guaranteed here');
    assert.ok(Math.abs(r.body.average! - (n - 1)) < 1e-9, 'K_n: H = n - 1');
  });

  it('flags a plan as stale when the room changes, and keeps its numbers', async () => {
    const room = await makeRoom(client, karateClub(), 'Karate stale');
    const p = (await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { k: 2, method: 'greedy' })).body;
    assert.equal(p.stale, false);
    const edit = await client.post(`/api/rooms/${room.id}/edits`, {
      version: room.version,
      ops: [{ op: 'addTie', source: room.personIds[4], target: room.personIds[20], strength: 3 }],
    });
    assert.equal(edit.status, 200, edit.text);
    const again = (await client.get<PlanDetail>(`/api/plans/${p.id}`)).body;
    assert.equal(again.stale, true);
    assert.equal(again.roomVersion, room.version);
    assert.equal(again.currentRoomVersion, edit.body.version);
    assert.equal(again.total, p.total);
    assert.deepEqual(again.perPerson, p.perPerson);
    const list = (await client.get(`/api/rooms/${room.id}/plans`)).body;
    assert.equal(list[0].stale, true);
  });

  it('lists, renames, marks one plan chosen, compares two and deletes', async () => {
    const room = await makeRoom(client, karateClub(), 'Karate list');
    const a = (await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { k: 3, method: 'greedy' })).body;
    const b = (
      await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { starters: room.personIds.slice(10, 13), name: 'Three in a row' })
    ).body;
    const list = (await client.get(`/api/rooms/${room.id}/plans`)).body;
    assert.deepEqual(
      list.map((p: { id: number }) => p.id),
      [b.id, a.id],
    );
    assert.equal(list[0].name, 'Three in a row');
    assert.equal((await client.patch(`/api/plans/${a.id}`, { name: '  Greedy three ' })).body.name, 'Greedy three');
    assert.equal((await client.patch(`/api/plans/${a.id}`, { chosen: true })).body.chosen, true);
    assert.equal((await client.patch(`/api/plans/${b.id}`, { chosen: true })).body.chosen, true);
    assert.equal((await client.get(`/api/plans/${a.id}`)).body.chosen, false, 'only one chosen plan per room');
    assert.equal((await client.patch(`/api/plans/${a.id}`, { name: '' })).status, 400);
    const cmp = (await client.get(`/api/plans/compare?a=${a.id}&b=${b.id}`)).body;
    assert.equal(cmp.people.length, 34);
    assert.ok(Math.abs(cmp.averageDifference - (b.average! - a.average!)) < 1e-12);
    assert.ok(cmp.averageDifference > 0, 'the greedy plan beats three people in a row');
    assert.match(cmp.line, /higher than "Greedy three"/);
    for (const p of cmp.people) assert.ok(Math.abs(p.difference - (p.b - p.a)) < 1e-12);
    const rehearsal = (await client.post(`/api/plans/${b.id}/rehearsals`, { runs: 200, seed: 'gone' })).body;
    await waitForJob(client, rehearsal.job.id);
    assert.equal((await client.delete(`/api/plans/${b.id}`)).status, 204);
    assert.equal((await client.get(`/api/plans/${b.id}`)).status, 404);
    assert.equal((await client.get(`/api/rehearsals/${rehearsal.rehearsal.id}`)).status, 404, 'its rehearsals go with it');
    assert.equal((await client.get(`/api/rooms/${room.id}/plans`)).body.length, 1);
  });

  it('k-sweep: widened and swap are never worse than greedy, bounds hold, the random baseline is seeded', async () => {
    const room = await makeRoom(client, karateClub(), 'Karate sweep');
    const s = (await client.post<KSweepResult>(`/api/rooms/${room.id}/plans/sweep`, { maxK: 6, seed: 'abc' })).body;
    assert.equal(s.points.length, 6);
    for (const p of s.points) {
      assert.ok(p.widened! <= p.greedy! + 1e-9 && p.swap! <= p.greedy! + 1e-9, `k = ${p.k}`);
      for (const v of [p.greedy!, p.widened!, p.swap!, p.mostTies!, p.random!]) assert.ok(v >= p.lowerBound! - 1e-9, `bound at k = ${p.k}`);
      assert.ok(p.random! >= p.swap! - 1e-9);
    }
    for (const [i, p] of s.points.entries())
      if (i > 0) assert.ok(p.greedy! <= itemAt(s.points, i - 1, 'sweep point').greedy! + 1e-9, 'greedy average falls with k');
    const again = (await client.post<KSweepResult>(`/api/rooms/${room.id}/plans/sweep`, { maxK: 6, seed: 'abc' })).body;
    assert.deepEqual(again.points, s.points);
    const other = (await client.post<KSweepResult>(`/api/rooms/${room.id}/plans/sweep`, { maxK: 6, seed: 'xyz' })).body;
    assert.notDeepEqual(
      other.points.map((p) => p.random),
      s.points.map((p) => p.random),
    );
  });

  it('k-sweep on a room with closed groups: no plan below their number, and a note says why', async () => {
    const two: RoomGraph = {
      ids: ['a', 'b', 'c', 'd', 'e', 'f'],
      directed: false,
      ties: [
        { source: 0, target: 1, strength: 1 },
        { source: 1, target: 2, strength: 1 },
        { source: 3, target: 4, strength: 1 },
        { source: 4, target: 5, strength: 1 },
      ],
    };
    const room = await makeRoom(client, two, 'Two parts');
    const s = (await client.post<KSweepResult>(`/api/rooms/${room.id}/plans/sweep`, { maxK: 4 })).body;
    const [k1, k2] = s.points;
    assert.ok(k1 && k2, `sweep points for k = 1 and 2, got ${s.points.length}`);
    assert.equal(k1.greedy, null);
    assert.equal(k1.mostTies, null, 'one starter cannot reach both parts');
    assert.ok(k2.greedy! > 0);
    assert.ok(s.notes.some((n) => /closed groups/.test(n)));
    assert.ok(s.notes.some((n) => /^For \d+ values of k some random draws/.test(n)));
  });

  it('big or exhaustive plans run as background jobs with progress over SSE; a cancelled one can be re-run', async () => {
    const room = await makeRoom(client, karateClub(), 'Karate exhaustive');
    const r = await client.post(`/api/rooms/${room.id}/plans`, { k: 3, method: 'exhaustive' });
    assert.equal(r.status, 202, r.text);
    assert.equal(r.body.plan.status, 'computing');
    const { events } = await readEvents(client, `/api/jobs/${r.body.job.id}/events`);
    assert.equal(events.at(-1)!.type, 'done');
    const plan = (await client.get<PlanDetail>(`/api/plans/${r.body.plan.id}`)).body;
    assert.equal(plan.status, 'ready');
    assert.equal(plan.methodUsed, 'exhaustive');
    assert.equal(plan.certified, true);
    assert.equal(plan.gap, 0);
    // A long search, cancelled, then run again to the end.
    const big = await makeRoom(client, ringRoom(110, 200, 3), 'Ring 110');
    const slow = await client.post(`/api/rooms/${big.id}/plans`, { k: 6, method: 'exhaustive', timeLimitSeconds: 2 });
    assert.equal(slow.status, 202, slow.text);
    await client.post(`/api/jobs/${slow.body.job.id}/cancel`, {});
    const cancelled = (await client.get<PlanDetail>(`/api/plans/${slow.body.plan.id}`)).body;
    assert.equal(cancelled.status, 'cancelled');
    assert.equal(cancelled.total, null);
    assert.deepEqual(cancelled.perPerson, []);
    const rerun = await client.post(`/api/plans/${slow.body.plan.id}/rerun`, {});
    assert.equal(rerun.status, 202, rerun.text);
    const job = await waitForJob(client, rerun.body.job.id);
    assert.equal(job.status, 'done', job.message ?? '');
    const done = (await client.get<PlanDetail>(`/api/plans/${slow.body.plan.id}`)).body;
    assert.equal(done.status, 'ready');
    assert.equal(done.starters.length, 6);
    assert.ok(done.lowerBound! <= done.total! && done.gap! >= 0);
  });

  it('a running search asked to stop keeps its best plan so far, marked as stopped, with its proven gap', async () => {
    const big = await makeRoom(client, ringRoom(110, 200, 5), 'Ring 110 stop');
    const slow = await client.post(`/api/rooms/${big.id}/plans`, { k: 9, method: 'exhaustive', timeLimitSeconds: 60 });
    assert.equal(slow.status, 202, slow.text);
    const jobId = slow.body.job.id;
    const until = Date.now() + 30_000;
    while ((await client.get(`/api/jobs/${jobId}`)).body.status !== 'running') {
      assert.ok(Date.now() < until, 'the job never started');
      await new Promise((res) => setTimeout(res, 50));
    }
    await new Promise((res) => setTimeout(res, 2500));
    assert.equal((await client.post(`/api/jobs/${jobId}/cancel`, { keepBest: 'yes' })).status, 400);
    const asked = Date.now();
    const stop = await client.post(`/api/jobs/${jobId}/cancel`, { keepBest: true });
    assert.equal(stop.status, 200, stop.text);
    const job = await waitForJob(client, jobId);
    assert.equal(job.status, 'done', job.message ?? '');
    assert.ok(Date.now() - asked < 15_000, `the stopped search took ${Date.now() - asked} ms to hand back its plan`);
    const plan = (await client.get<PlanDetail>(`/api/plans/${slow.body.plan.id}`)).body;
    assert.equal(plan.status, 'ready');
    assert.equal(plan.starters.length, 9);
    assert.equal(plan.certified, false);
    assert.equal(plan.extras?.stopped, true);
    assert.ok(
      plan.warnings.some((w) => w.code === 'search-stopped' && /stopped after \d+ steps/.test(w.text)),
      JSON.stringify(plan.warnings),
    );
    assert.ok(plan.lowerBound! <= plan.total! && plan.gap! > 0);
  });

  it('briefing sheet: data, CSV safe against formula injection, PDF', async () => {
    const graph = karateClub();
    const room = await makeRoom(client, graph, 'Karate briefing', { minutesPerHop: 4 });
    const names = ['=HYPERLINK("http://example.invalid","x")', '+1+1', '-2', '@SUM(A1)'];
    const ops = names.map((name, i) => ({ op: 'updatePerson', id: room.personIds[i], name }));
    const edit = await client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops });
    assert.equal(edit.status, 200, edit.text);
    const plan = (await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { starters: [room.personIds[0], room.personIds[33]] })).body;
    const sheet = (await client.get(`/api/plans/${plan.id}/briefing`)).body;
    assert.deepEqual(
      sheet.starters.map((s: { name: string }) => s.name),
      [names[0], 'Person 33'],
    );
    const ninety = plan.reach!.quantiles.find((q) => q.share === 0.9)!;
    assert.ok(
      sheet.expectations.some(
        (e: { line: string }) =>
          e.line === `90% of the people not briefed will have heard within ${4 * ninety.hop!} minutes (${ninety.hop} hops).`,
      ),
    );
    assert.match(sheet.cautions[0], /simplification of real conversation/);
    assert.equal(sheet.roomVersion, edit.body.version);
    const csv = await client.get(`/api/plans/${plan.id}/briefing.csv`);
    assert.match(csv.headers.get('content-type')!, /text\/csv/);
    assert.match(csv.headers.get('content-disposition')!, /attachment/);
    const lines = csv.text
      .replace(/^\uFEFF/, '')
      .trim()
      .split('\r\n');
    assert.equal(lines.length, 35);
    assert.equal(lines[1], `1,0,"'=HYPERLINK(""http://example.invalid"",""x"")",North,brief first,0.000,0.0`);
    for (const bad of ['+1+1', '-2', '@SUM(A1)']) {
      assert.ok(
        lines.some((l) => l.includes(`,'${bad},`)),
        `${bad} is protected`,
      );
      assert.ok(!lines.some((l) => l.includes(`,${bad},`)), `${bad} never appears bare`);
    }
    const pdf = await fetch(`${server.url}/api/plans/${plan.id}/briefing.pdf`, { headers: { cookie: client.cookieHeader() } });
    assert.equal(pdf.headers.get('content-type'), 'application/pdf');
    const bytes = Buffer.from(await pdf.arrayBuffer());
    assert.equal(bytes.subarray(0, 5).toString(), '%PDF-');
    assert.ok(bytes.length > 2000);
  });
});
