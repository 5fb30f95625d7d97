import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import type { TestClient } from '../support/http-client';
import { newWorkshop, sheetTokens } from './workshops-support';

const NAMES = ['Hal Verity', 'Ines Parrow', 'Jon Bekker', 'Kit Aldane'].map((name) => ({ name }));

async function waitForRehearsal(c: TestClient, id: number) {
  for (let i = 0; i < 100; i++) {
    const r = await c.get(`/api/rehearsals/${id}`);
    if (r.body.status === 'done') return r.body;
    if (['failed', 'cancelled', 'interrupted'].includes(r.body.status)) throw new Error(`rehearsal ${r.body.status}: ${r.text}`);
    await new Promise((res) => setTimeout(res, 100));
  }
  throw new Error('rehearsal did not finish');
}

describe('workshop room build, debrief and who may reach what', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('builds the room from answers, releases a debrief, and keeps every participant to their own data', async () => {
    const { client: owner } = await signedInClient(server);
    const { client: co, account: coAccount } = await signedInClient(server);
    const { client: stranger } = await signedInClient(server);
    const { id, byName } = await newWorkshop(owner, NAMES);
    const idOf = (name: string): number => {
      const pid = byName.get(name);
      assert.ok(pid, `${name} is on the list`);
      return pid;
    };
    const [h, i, j, k] = [idOf('Hal Verity'), idOf('Ines Parrow'), idOf('Jon Bekker'), idOf('Kit Aldane')];
    assert.equal((await owner.post(`/api/workshops/${id}/facilitators`, { email: coAccount.email })).status, 201);
    const unknownCo = await owner.post(`/api/workshops/${id}/facilitators`, { email: 'nobody@test.ripplehall.local' });
    assert.equal(unknownCo.status, 400);
    const tokens = await sheetTokens(owner, id);
    await co.post(`/api/workshops/${id}/status`, { to: 'collecting' });
    // A chain Hal - Ines - Jon - Kit, answered both ways except that Kit does not answer.
    const answer = async (name: string, picks: number[]) => {
      const c = server.client();
      const t = tokens.get(name)!;
      await c.post(`/api/p/${t}/consent`);
      const r = await c.put(`/api/p/${t}/answers`, { version: 0, nominations: picks.map((p) => ({ participantId: p, level: 'often' })) });
      assert.equal(r.status, 200, r.text);
    };
    await answer('Hal Verity', [i]);
    await answer('Ines Parrow', [h, j]);
    await answer('Jon Bekker', [i, k]);
    const progress = await co.get(`/api/workshops/${id}/progress`);
    assert.deepEqual([progress.body.participants, progress.body.answered], [4, 3]);
    const missing = await owner.get(`/api/workshops/${id}/missing?mode=either`);
    assert.deepEqual(
      missing.body.map((m: { name: string; nominatedBy: number }) => [m.name, m.nominatedBy]),
      [['Kit Aldane', 1]],
    );
    await owner.post(`/api/workshops/${id}/status`, { to: 'running' });
    const mutual = await co.post(`/api/workshops/${id}/build`, { mode: 'reciprocated' });
    assert.equal(mutual.status, 200, mutual.text);
    assert.equal(mutual.body.ties, 2, 'only Hal-Ines and Ines-Jon are mutual');
    const built = await co.post(`/api/workshops/${id}/build`, { mode: 'either' });
    assert.equal(built.body.ties, 3, 'rebuilding replaces the survey ties');
    assert.equal(built.body.roomId, mutual.body.roomId, 'the same room is updated');
    const roomId = built.body.roomId as number;
    const room = await owner.get(`/api/rooms/${roomId}`);
    assert.equal(room.status, 200, room.text);
    assert.equal(room.body.people.length, 4);
    assert.equal(room.body.settings.directed, false);

    const plan = await owner.post(`/api/rooms/${roomId}/plans`, { k: 1, method: 'greedy' });
    assert.equal(plan.status, 201, plan.text);
    const started = await owner.post(`/api/plans/${plan.body.id}/rehearsals`, { runs: 200, seed: 'debrief-check' });
    assert.equal(started.status, 202, started.text);
    const rehearsal = await waitForRehearsal(owner, started.body.rehearsal.id);
    const release = await co.post(`/api/workshops/${id}/release`, { rehearsalId: rehearsal.id, sampleRun: 0, showStarters: false });
    assert.equal(release.status, 200, release.text);
    assert.equal(release.body.status, 'debrief');

    const kit = await server.client().get(`/api/p/${tokens.get('Kit Aldane')}/debrief`);
    assert.equal(kit.status, 200, kit.text);
    assert.equal(kit.body.name, 'Kit Aldane');
    assert.equal(kit.body.inMap, true);
    assert.equal(kit.body.starters, null, 'starter names stay hidden unless allowed');
    assert.equal(kit.body.peopleInMap, 4);
    // Greedy with k = 1 on the path H-I-J-K picks a middle person. If it is Jon, Kit's only tie is to Jon,
    // so Kit's first question always reaches him: exactly 1 hop (worked by hand).
    const starterName = plan.body.starters[0].name as string;
    assert.ok(['Ines Parrow', 'Jon Bekker'].includes(starterName));
    if (starterName === 'Jon Bekker') assert.equal(kit.body.expectedHops, 1);
    assert.ok(kit.body.heardAtHop === null || kit.body.heardAtHop >= 0);
    assert.ok(Array.isArray(kit.body.reachCurve) && kit.body.reachCurve.length > 1);
    assert.equal(Object.keys(kit.body).includes('byPerson'), false, 'no other participant’s entries are sent');
    await owner.patch(`/api/workshops/${id}`, { showStarters: true });
    const shown = await server.client().get(`/api/p/${tokens.get('Hal Verity')}/debrief`);
    assert.deepEqual(shown.body.starters, [starterName]);

    // Authorization matrix.
    for (const path of [`/api/workshops/${id}`, `/api/workshops/${id}/progress`, `/api/workshops/${id}/missing`]) {
      assert.equal((await co.get(path)).status, 200, `co-facilitator ${path}`);
      assert.equal((await stranger.get(path)).status, 404, `another facilitator ${path}`);
      assert.equal((await server.client().get(path)).status, 401, `no session ${path}`);
    }
    // Co-facilitators get editor access to the workshop's room (here built from the survey).
    const workshopRoom = (await owner.get(`/api/workshops/${id}`)).body.roomId;
    assert.ok(workshopRoom, 'the workshop has its room');
    const coRoom = await co.get(`/api/rooms/${workshopRoom}`);
    assert.equal(coRoom.status, 200, 'co-facilitator opens the workshop room');
    assert.equal(coRoom.body.access, 'editor');
    assert.equal((await stranger.get(`/api/rooms/${workshopRoom}`)).status, 404, 'another facilitator cannot');
    assert.equal((await stranger.post(`/api/workshops/${id}/links/sheet`, {})).status, 404);
    assert.equal((await stranger.post(`/api/workshops/${id}/status`, { to: 'closed' })).status, 404);
    assert.equal((await co.delete(`/api/workshops/${id}`)).status, 403, 'only the owner deletes');
    const listOfStranger = await stranger.get('/api/workshops');
    assert.ok(!listOfStranger.body.some((w: { id: number }) => w.id === id));
    // A participant link opens nothing of the facilitator API, even with the token as a header or query.
    const participant = server.client();
    const t = tokens.get('Hal Verity')!;
    assert.equal((await participant.get(`/api/p/${t}`)).status, 200);
    for (const path of [
      `/api/workshops/${id}`,
      `/api/workshops/${id}/progress?token=${t}`,
      `/api/rooms/${roomId}`,
      `/api/rehearsals/${rehearsal.id}/samples`,
      '/api/workshops',
    ]) {
      const r = await participant.request('GET', path, undefined, { headers: { authorization: `Bearer ${t}` } });
      assert.equal(r.status, 401, `participant ${path}`);
    }
    // Nor another participant's survey: the id in the path is ignored, only the token counts.
    assert.equal((await participant.get(`/api/p/${t}/debrief`)).body.name, 'Hal Verity');
  });
});
