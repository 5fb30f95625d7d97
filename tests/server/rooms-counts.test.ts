import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { pool } from '../../server/db';
import type { RoomDto, RoomListItem } from '../../shared/api/rooms';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { upload } from './rooms-helpers';

/**
 * The rooms list reads people and tie counts stored with each room. Every way content changes
 * (create with content, an edit batch, deleting a person with ties, a replacing import, a room
 * duplicated) must leave the stored counts equal to the rows themselves.
 */
describe('stored people and tie counts', () => {
  let server: TestServer;
  let client: TestClient;
  before(async () => {
    server = await startTestServer();
    client = (await signedInClient(server)).client;
  });
  after(async () => server.stop());

  const listed = async (id: number) => {
    const page = (await client.get<{ items: RoomListItem[] }>('/api/rooms?pageSize=100')).body;
    const item = page.items.find((r) => r.id === id);
    assert.ok(item, `room ${id} is listed`);
    return [item.people, item.ties];
  };
  /** Every room whose stored counts differ from its rows (should be none). */
  const drifted = async () => {
    const [rows] = (await pool.query(
      `SELECT r.id FROM rooms r WHERE r.people_count <> (SELECT COUNT(*) FROM people p WHERE p.room_id = r.id)
         OR r.ties_count <> (SELECT COUNT(*) FROM ties t WHERE t.room_id = r.id)`,
    )) as unknown as [{ id: number }[]];
    return rows.map((r) => r.id);
  };

  it('follow creation, edits, deletes, a replacing import and a duplicate', async () => {
    const made = await client.post('/api/rooms', {
      name: 'Counted',
      people: ['a', 'b', 'c'].map((key) => ({ key, name: `Person ${key}` })),
      ties: [
        { source: 'a', target: 'b', strength: 1 },
        { source: 'b', target: 'c', strength: 1 },
      ],
    });
    assert.equal(made.status, 201, made.text);
    const id = made.body.id as number;
    assert.deepEqual(await listed(id), [3, 2]);

    let room = (await client.get<RoomDto>(`/api/rooms/${id}`)).body;
    const a = room.people.find((p) => p.key === 'a')!.id;
    const b = room.people.find((p) => p.key === 'b')!.id;
    const added = await client.post(`/api/rooms/${id}/edits`, {
      version: room.version,
      ops: [
        { op: 'addPerson', tempId: 'd', name: 'Dee' },
        { op: 'addTie', source: 'd', target: a, strength: 2 },
      ],
    });
    assert.equal(added.status, 200, added.text);
    assert.deepEqual(await listed(id), [4, 3]);

    // Deleting b also deletes both of b's ties.
    room = (await client.get<RoomDto>(`/api/rooms/${id}`)).body;
    const removed = await client.post(`/api/rooms/${id}/edits`, { version: room.version, ops: [{ op: 'deletePerson', id: b }] });
    assert.equal(removed.status, 200, removed.text);
    assert.deepEqual(await listed(id), [3, 1]);

    room = (await client.get<RoomDto>(`/api/rooms/${id}`)).body;
    const csv = 'source,target,strength\nv,w,1\nw,x,1\nx,y,1\ny,z,1\n';
    const replaced = await upload(
      client,
      `/api/rooms/${id}/import?dryRun=false`,
      { file: { name: 'ties.csv', content: csv } },
      { version: String(room.version) },
    );
    assert.equal(replaced.status, 200, replaced.text);
    assert.deepEqual(await listed(id), [5, 4]);

    const copy = await client.post(`/api/rooms/${id}/duplicate`, {});
    assert.equal(copy.status, 201, copy.text);
    assert.deepEqual(await listed(copy.body.id as number), [5, 4]);

    // Sorting by people uses the stored counts too.
    const byPeople = (await client.get<{ items: RoomListItem[] }>('/api/rooms?sort=people&direction=desc&pageSize=100')).body.items;
    assert.deepEqual(
      byPeople.map((r) => r.people),
      [...byPeople.map((r) => r.people)].sort((x, y) => y - x),
    );
    assert.deepEqual(await drifted(), []);
  });
});
