/**
 * Authorization for plans, rehearsals and jobs: owner and editor may create, change and cancel;
 * a viewer may read (403 on changes); another facilitator gets 404 everywhere, so ids cannot be
 * probed; signed-out callers get 401.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { closePools } from '../../server/jobs/pools';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { karateClub, makeRoom, readEvents, share, waitForJob, type MadeRoom } from './plans-support';

describe('plans and rehearsals: who may do what', () => {
  let server: TestServer;
  let owner: TestClient;
  let editor: TestClient;
  let viewer: TestClient;
  let stranger: TestClient;
  let room: MadeRoom;
  let planId: number;
  let rehearsalId: number;
  let jobId: number;
  before(async () => {
    server = await startTestServer();
    ({ client: owner } = await signedInClient(server));
    const e = await signedInClient(server);
    const v = await signedInClient(server);
    editor = e.client;
    viewer = v.client;
    ({ client: stranger } = await signedInClient(server));
    room = await makeRoom(owner, karateClub(), 'Shared karate');
    await share(owner, room.id, e.account.email, 'editor');
    await share(owner, room.id, v.account.email, 'viewer');
    planId = (await owner.post(`/api/rooms/${room.id}/plans`, { k: 2, method: 'greedy' })).body.id;
    const r = (await owner.post(`/api/plans/${planId}/rehearsals`, { runs: 500, seed: 'acl' })).body;
    rehearsalId = r.rehearsal.id;
    jobId = r.job.id;
    await waitForJob(owner, jobId);
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  const reads = () => [
    `/api/rooms/${room.id}/plans`,
    `/api/plans/${planId}`,
    `/api/plans/compare?a=${planId}&b=${planId}`,
    `/api/plans/${planId}/briefing`,
    `/api/plans/${planId}/briefing.csv`,
    `/api/plans/${planId}/briefing.pdf`,
    `/api/rooms/${room.id}/rehearsals`,
    `/api/rehearsals/${rehearsalId}`,
    `/api/rehearsals/${rehearsalId}/samples`,
    `/api/rehearsals/${rehearsalId}/samples/0`,
    `/api/rehearsals/${rehearsalId}/replay`,
    `/api/jobs/${jobId}`,
  ];

  it('the replay in one answer is the index and each of its samples, in order', async () => {
    const bundle = await viewer.get(`/api/rehearsals/${rehearsalId}/replay`);
    assert.equal(bundle.status, 200, bundle.text);
    const index = (await viewer.get(`/api/rehearsals/${rehearsalId}/samples`)).body;
    assert.deepEqual(bundle.body.index, index);
    assert.ok(index.samples.length > 0, 'the rehearsal kept samples');
    const samples = [];
    for (const s of index.samples) samples.push((await viewer.get(`/api/rehearsals/${rehearsalId}/samples/${s.n}`)).body);
    assert.deepEqual(bundle.body.samples, samples);
  });

  it('owner, editor and viewer can read everything; another facilitator gets 404; signed out gets 401', async () => {
    for (const path of reads()) {
      for (const [who, c] of [
        ['owner', owner],
        ['editor', editor],
        ['viewer', viewer],
      ] as const) {
        assert.equal((await c.get(path)).status, 200, `${who} ${path}`);
      }
      const s = await stranger.get(path);
      assert.equal(s.status, 404, `stranger ${path}: ${s.text}`);
      assert.equal((await server.client().get(path)).status, 401, `signed out ${path}`);
    }
    const sse = await readEvents(viewer, `/api/rehearsals/${rehearsalId}/events`, 5000);
    assert.equal(sse.events.at(-1)!.type, 'done');
    const hidden = await fetch(`${server.url}/api/rehearsals/${rehearsalId}/events`, { headers: { cookie: stranger.cookieHeader() } });
    assert.equal(hidden.status, 404);
    assert.equal((await stranger.post(`/api/rooms/${room.id}/plans/sweep`, { maxK: 2 })).status, 404);
    assert.equal((await viewer.post(`/api/rooms/${room.id}/plans/sweep`, { maxK: 2 })).status, 200);
  });

  it('a viewer may not create, change, rehearse, cancel or delete (403); a stranger gets 404', async () => {
    const writes: [string, string, unknown?][] = [
      ['POST', `/api/rooms/${room.id}/plans`, { k: 2, method: 'greedy' }],
      ['PATCH', `/api/plans/${planId}`, { name: 'Mine now' }],
      ['DELETE', `/api/plans/${planId}`],
      ['POST', `/api/plans/${planId}/rehearsals`, { runs: 100 }],
      ['POST', `/api/rehearsals/${rehearsalId}/rerun`, {}],
      ['POST', `/api/rehearsals/${rehearsalId}/cancel`, {}],
      ['DELETE', `/api/rehearsals/${rehearsalId}`],
      ['POST', `/api/jobs/${jobId}/cancel`, {}],
    ];
    for (const [method, path, body] of writes) {
      const v = await viewer.request(method, path, body);
      assert.equal(v.status, 403, `viewer ${method} ${path}: ${v.text}`);
      assert.match(v.body.error.message, /view this room but not change it/);
      const s = await stranger.request(method, path, body);
      assert.equal(s.status, 404, `stranger ${method} ${path}: ${s.text}`);
    }
    assert.equal((await owner.get(`/api/plans/${planId}`)).body.name, 'Greedy, k = 2');
  });

  it('an editor may create plans, rehearse, rename, choose, cancel and delete', async () => {
    const p = await editor.post(`/api/rooms/${room.id}/plans`, { k: 3, method: 'swap', name: 'Editor plan' });
    assert.equal(p.status, 201, p.text);
    assert.equal((await editor.patch(`/api/plans/${p.body.id}`, { chosen: true })).body.chosen, true);
    const r = await editor.post(`/api/plans/${p.body.id}/rehearsals`, { runs: 100000, seed: 'editor' });
    assert.equal(r.status, 202, r.text);
    const c = await editor.post(`/api/rehearsals/${r.body.rehearsal.id}/cancel`, {});
    assert.equal(c.status, 200, c.text);
    assert.equal(c.body.status, 'cancelled');
    // The owner's job can be cancelled by an editor too (it is the room's work).
    assert.equal((await editor.post(`/api/jobs/${jobId}/cancel`, {})).status, 200);
    assert.equal((await editor.delete(`/api/plans/${p.body.id}`)).status, 204);
    assert.equal((await owner.get(`/api/plans/${p.body.id}`)).status, 404);
  });
});
