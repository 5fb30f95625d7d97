/** Every bad plan or rehearsal request gets a specific 400 (or 404) that says what to fix; never a 500. */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { closePools } from '../../server/jobs/pools';
import type { Reply, TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { karateClub, makeRoom, ringRoom, type MadeRoom } from './plans-support';
import type { RoomGraph } from '../../shared/engine/index';

function fails(r: Reply, status: number, code: string, message: RegExp) {
  assert.equal(r.status, status, r.text);
  assert.equal(r.body.error.code, code, r.text);
  assert.match(r.body.error.message, message);
}

/** Two separate triangles and one person on their own: three closed groups. */
const threeParts: RoomGraph = {
  ids: ['a1', 'a2', 'a3', 'b1', 'b2', 'b3', 'c'],
  directed: false,
  ties: [
    { source: 0, target: 1, strength: 1 },
    { source: 1, target: 2, strength: 1 },
    { source: 2, target: 0, strength: 1 },
    { source: 3, target: 4, strength: 1 },
    { source: 4, target: 5, strength: 1 },
    { source: 5, target: 3, strength: 1 },
  ],
};

describe('plans and rehearsals: bad input', () => {
  let server: TestServer;
  let client: TestClient;
  let karate: MadeRoom;
  let planId: number;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
    karate = await makeRoom(client, karateClub(), 'Karate');
    const r = await client.post(`/api/rooms/${karate.id}/plans`, { k: 2, method: 'greedy' });
    planId = r.body.id;
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  const plans = () => `/api/rooms/${karate.id}/plans`;

  it('k of 0, k at or above the room size, a fractional k, no k at all', async () => {
    fails(await client.post(plans(), { k: 0, method: 'greedy' }), 400, 'invalid_k', /at least 1/);
    fails(await client.post(plans(), { k: 34, method: 'greedy' }), 400, 'invalid_k', /At most 33 in a room of 34/);
    fails(await client.post(plans(), { k: 500, method: 'swap' }), 400, 'invalid_k', /Choose 1 to 33/);
    fails(await client.post(plans(), { k: 1.5 }), 400, 'bad_request', /k must be a whole number/);
    fails(await client.post(plans(), { method: 'greedy' }), 400, 'bad_request', /Give k/);
    fails(await client.post(plans(), { k: 2, method: 'magic' }), 400, 'bad_request', /method/);
    fails(await client.post(plans(), { k: 2, colour: 'red' }), 400, 'bad_request', /Unknown field: colour/);
  });

  it('k below the number of closed groups that each need a starter', async () => {
    const room = await makeRoom(client, threeParts, 'Three parts');
    fails(
      await client.post(`/api/rooms/${room.id}/plans`, { k: 2, method: 'greedy' }),
      400,
      'k_below_closed_groups',
      /3 closed groups.*at least 3/,
    );
    const ok = await client.post(`/api/rooms/${room.id}/plans`, { k: 3, method: 'greedy' });
    assert.equal(ok.status, 201, ok.text);
  });

  it('more people who must be briefed than k, and conflicting constraints', async () => {
    const ids = karate.personIds;
    fails(
      await client.post(plans(), { k: 2, method: 'greedy', mustBrief: ids.slice(0, 3) }),
      400,
      'must_include_too_many',
      /3 people must be briefed but the budget is 2/,
    );
    fails(
      await client.post(plans(), { k: 3, method: 'greedy', mustBrief: [ids[0]], cannotBrief: [ids[0]] }),
      400,
      'conflicting_constraints',
      /cannot be in both lists/,
    );
    fails(
      await client.post(plans(), { k: 3, method: 'greedy', cannotBrief: ids.slice(0, 32) }),
      400,
      'no_feasible_plan',
      /fewer than the budget of 3/,
    );
  });

  it('unknown and deleted people', async () => {
    fails(
      await client.post(plans(), { k: 2, method: 'greedy', mustBrief: [987654] }),
      400,
      'unknown_person',
      /person 987654 is not in this room/,
    );
    fails(await client.post(plans(), { starters: [karate.personIds[0], 987654] }), 400, 'unknown_person', /987654/);
    const room = await makeRoom(client, karateClub(), 'Karate to edit');
    const gone = room.personIds[7];
    const del = await client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: [{ op: 'deletePerson', id: gone }] });
    assert.equal(del.status, 200, del.text);
    fails(
      await client.post(`/api/rooms/${room.id}/plans`, { k: 2, method: 'greedy', cannotBrief: [gone] }),
      400,
      'unknown_person',
      /deleted, or from another room/,
    );
    fails(await client.post(`/api/rooms/${room.id}/plans`, { starters: [gone] }), 400, 'unknown_person', new RegExp(`person ${gone}`));
    // A person of another room is just as unknown here.
    fails(await client.post(plans(), { starters: [room.personIds[0]] }), 400, 'unknown_person', /not in this room/);
  });

  it('a room too big for the exhaustive method says so and offers another method', async () => {
    const room = await makeRoom(client, ringRoom(150, 150), 'Big ring');
    const r = await client.post(`/api/rooms/${room.id}/plans`, { k: 3, method: 'exhaustive' });
    fails(r, 400, 'exhaustive_infeasible', /at most 120 people; this room has 150\. Use auto/);
    assert.equal(r.body.error.details.suggest, 'auto');
  });

  it('a hand-made plan that leaves people unreachable names them; duplicates and empty lists are refused', async () => {
    const room = await makeRoom(client, threeParts, 'Three parts, hand-made');
    const [a1, , , b1] = room.personIds;
    const r = await client.post(`/api/rooms/${room.id}/plans`, { starters: [a1, b1] });
    fails(r, 400, 'unreachable_people', /1 person can never hear \(Person c\)/);
    assert.deepEqual(
      r.body.error.details.people.map((p: { personId: number }) => p.personId),
      [room.personIds[6]],
    );
    fails(await client.post(`/api/rooms/${room.id}/plans`, { starters: [a1, a1] }), 400, 'invalid_starters', /listed twice/);
    fails(await client.post(`/api/rooms/${room.id}/plans`, { starters: [] }), 400, 'invalid_k', /at least one starter/);
    fails(
      await client.post(`/api/rooms/${room.id}/plans`, { starters: [a1], method: 'greedy' }),
      400,
      'bad_request',
      /no method or constraints/,
    );
  });

  it('k-sweep bounds', async () => {
    const sweep = `/api/rooms/${karate.id}/plans/sweep`;
    fails(await client.post(sweep, { maxK: 0 }), 400, 'invalid_k', /up to k = 20/);
    fails(await client.post(sweep, { maxK: 21 }), 400, 'invalid_k', /up to k = 20/);
    fails(await client.post(sweep, { maxK: 3, seed: 'no spaces' }), 400, 'bad_request', /seed/);
  });

  it('cascades above the cap, a malformed seed, a bad number of cascades', async () => {
    const start = `/api/plans/${planId}/rehearsals`;
    fails(
      await client.post(start, { runs: 100001 }),
      400,
      'too_many_cascades',
      /At most 100,000 cascades per rehearsal \(you asked for 100,001\)/,
    );
    fails(await client.post(start, { runs: 0 }), 400, 'invalid_option', /at least 1/);
    fails(await client.post(start, { runs: 2.5 }), 400, 'invalid_option', /whole number/);
    fails(await client.post(start, { runs: 100, seed: 'not a seed!' }), 400, 'invalid_seed', /1 to 64 letters/);
    fails(await client.post(start, { runs: 100, seed: 'x'.repeat(65) }), 400, 'invalid_seed', /1 to 64/);
    fails(await client.post(start, { runs: 100, seed: '' }), 400, 'invalid_seed', /random one/);
    fails(await client.post(start, { runs: '100' }), 400, 'bad_request', /runs must be a number/);
  });

  it('wrong ids are simply not found; comparing plans of two rooms is refused', async () => {
    fails(await client.get('/api/plans/abc'), 404, 'not_found', /plan/);
    fails(await client.get('/api/plans/99999999'), 404, 'not_found', /plan/);
    fails(await client.get('/api/rehearsals/99999999'), 404, 'not_found', /rehearsal/);
    fails(await client.get('/api/jobs/0'), 404, 'not_found', /job/);
    fails(await client.get(`/api/plans/${planId}/briefing.csv`.replace(String(planId), '77777777')), 404, 'not_found', /plan/);
    const other = await makeRoom(client, karateClub(), 'Other karate');
    const p = await client.post(`/api/rooms/${other.id}/plans`, { k: 2, method: 'greedy' });
    fails(await client.get(`/api/plans/compare?a=${planId}&b=${p.body.id}`), 400, 'invalid_input', /same room/);
    fails(await client.get(`/api/rooms/${karate.id}/rehearsals?status=sleeping`), 400, 'bad_request', /status/);
    fails(await client.get(`/api/rooms/${karate.id}/rehearsals?from=yesterday`), 400, 'bad_request', /ISO date/);
  });
});
