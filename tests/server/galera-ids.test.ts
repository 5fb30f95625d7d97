import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { pool } from '../../server/db';
import type { RoomDto } from '../../shared/api/rooms';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';

/**
 * Ids as a Galera cluster hands them out. A Galera node sets auto_increment_increment to the
 * cluster size and auto_increment_offset to its own place (MariaDB Knowledge Base, "Galera Cluster
 * system variables", wsrep_auto_increment_control), so the rows of one multi-row insert get ids
 * 3 apart in a cluster of three. Every connection of this test process gets those settings, and
 * people and ties added in bulk (a new room, an edit batch) must still be joined correctly.
 */
pool.on('connection', (conn) => {
  conn.query('SET SESSION auto_increment_increment = 3, auto_increment_offset = 2');
});

describe('ids on a Galera-like node (increment 3)', () => {
  let server: TestServer;
  let client: TestClient;
  before(async () => {
    server = await startTestServer();
    client = (await signedInClient(server)).client;
  });
  after(async () => server.stop());

  /** The room's ties as pairs of person keys. */
  const pairs = (room: RoomDto) => {
    const keyOf = new Map(room.people.map((p) => [p.id, p.key]));
    return room.ties.map((t) => `${keyOf.get(t.sourceId)}-${keyOf.get(t.targetId)}:${t.strength}`).sort();
  };

  it('the settings are in force: a multi-row insert steps its ids by 3', async () => {
    const [rows] = (await pool.query('SELECT @@auto_increment_increment AS step')) as unknown as [{ step: number }[]];
    assert.equal(Number(rows[0]!.step), 3);
    const made = await client.post('/api/rooms', {
      name: 'Step check',
      people: ['a', 'b', 'c'].map((key) => ({ key, name: `Person ${key}` })),
      ties: [],
    });
    assert.equal(made.status, 201, made.text);
    const room = (await client.get<RoomDto>(`/api/rooms/${made.body.id}`)).body;
    const ids = room.people.map((p) => p.id);
    assert.deepEqual([ids[1]! - ids[0]!, ids[2]! - ids[1]!], [3, 3]);
  });

  it('a room created with people and ties joins each tie to the people it names', async () => {
    const keys = ['ann', 'ben', 'cy', 'dee', 'eli', 'fay'];
    const ties = [
      { source: 'ann', target: 'ben', strength: 1 },
      { source: 'ben', target: 'cy', strength: 2 },
      { source: 'cy', target: 'fay', strength: 3 },
      { source: 'dee', target: 'eli', strength: 4 },
      { source: 'fay', target: 'ann', strength: 5 },
    ];
    const made = await client.post('/api/rooms', { name: 'Galera room', people: keys.map((key) => ({ key, name: key })), ties });
    assert.equal(made.status, 201, made.text);
    const room = (await client.get<RoomDto>(`/api/rooms/${made.body.id}`)).body;
    assert.deepEqual(
      room.people.map((p) => p.key),
      keys,
    );
    const want = ties.map((t) => [t.source, t.target].sort().join('-') + `:${t.strength}`).sort();
    const got = pairs(room).map((p) => {
      const [ends, s] = p.split(':');
      return ends!.split('-').sort().join('-') + `:${s}`;
    });
    assert.deepEqual(got.sort(), want);
  });

  it('an edit batch adding people and ties between them by tempId joins the right people', async () => {
    const made = await client.post('/api/rooms', { name: 'Galera edits', people: [{ key: 'x', name: 'Xan' }], ties: [] });
    const room = (await client.get<RoomDto>(`/api/rooms/${made.body.id}`)).body;
    const x = room.people[0]!.id;
    const r = await client.post(`/api/rooms/${room.id}/edits`, {
      version: room.version,
      ops: [
        { op: 'addPerson', tempId: 'p', name: 'Pia' },
        { op: 'addPerson', tempId: 'q', name: 'Quin' },
        { op: 'addPerson', tempId: 'r', name: 'Rue' },
        { op: 'addTie', source: 'p', target: 'q', strength: 1 },
        { op: 'addTie', source: 'q', target: 'r', strength: 2 },
        { op: 'addTie', source: x, target: 'r', strength: 3 },
      ],
    });
    assert.equal(r.status, 200, r.text);
    const after = (await client.get<RoomDto>(`/api/rooms/${room.id}`)).body;
    const nameOf = new Map(after.people.map((p) => [p.id, p.name]));
    const named = after.ties.map((t) => `${nameOf.get(t.sourceId)}-${nameOf.get(t.targetId)}:${t.strength}`).sort();
    assert.deepEqual(named, ['Pia-Quin:1', 'Quin-Rue:2', 'Xan-Rue:3']);
  });
});
