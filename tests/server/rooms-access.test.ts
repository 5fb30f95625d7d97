import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import {
  createAccount,
  msUntilStatus,
  SESSION_BOUND_SLACK_MS,
  startTestServer,
  signedInClient,
  type TestServer,
} from '../support/test-server';
import { config } from '../../server/config';
import type { Reply, TestClient } from '../support/http-client';
import { pool } from '../../server/db';
import { createPathRoom, personOf, tieOf, type SmallRoom, upload } from './rooms-helpers';

type Who = 'owner' | 'editor' | 'viewer' | 'stranger' | 'admin' | 'signedOut';
type Expect = Record<Who, number>;

/**
 * The authorization matrix: every rooms route for the owner, an editor, a viewer, another
 * facilitator (404: room ids cannot be probed), an admin who is not shared in (404 as well:
 * rooms hold personal data) and a signed-out caller (401).
 */
describe('rooms: who may do what', () => {
  let server: TestServer;
  const clients = {} as Record<Who, TestClient>;
  let room: SmallRoom;

  before(async () => {
    server = await startTestServer();
    clients.owner = (await signedInClient(server)).client;
    const editor = await signedInClient(server);
    const viewer = await signedInClient(server);
    clients.editor = editor.client;
    clients.viewer = viewer.client;
    clients.stranger = (await signedInClient(server)).client;
    clients.admin = (await signedInClient(server, 'admin')).client;
    clients.signedOut = server.client();
    room = await createPathRoom(clients.owner, 3, 'Matrix room');
    assert.equal((await clients.owner.post(`/api/rooms/${room.id}/shares`, { email: editor.account.email, role: 'editor' })).status, 201);
    assert.equal((await clients.owner.post(`/api/rooms/${room.id}/shares`, { email: viewer.account.email, role: 'viewer' })).status, 201);
  });
  after(async () => server.stop());

  const read: Expect = { owner: 200, editor: 200, viewer: 200, stranger: 404, admin: 404, signedOut: 401 };
  const edit: Expect = { owner: 200, editor: 200, viewer: 403, stranger: 404, admin: 404, signedOut: 401 };
  const own: Expect = { owner: 200, editor: 403, viewer: 403, stranger: 404, admin: 404, signedOut: 401 };

  const cases: [string, Expect, (c: TestClient) => Promise<Reply>][] = [
    ['get room', read, (c) => c.get(`/api/rooms/${room.id}`)],
    ['people page', read, (c) => c.get(`/api/rooms/${room.id}/people`)],
    ['ties page', read, (c) => c.get(`/api/rooms/${room.id}/ties`)],
    ['summary', read, (c) => c.get(`/api/rooms/${room.id}/summary`)],
    ['export', read, (c) => c.get(`/api/rooms/${room.id}/export?format=json`)],
    [
      'patch',
      edit,
      async (c) => {
        const v = (await clients.owner.get(`/api/rooms/${room.id}`)).body.version;
        return c.patch(`/api/rooms/${room.id}`, { version: v, description: 'changed' });
      },
    ],
    [
      'layout moves',
      edit,
      (c) => c.post(`/api/rooms/${room.id}/edits`, { ops: [{ op: 'movePeople', moves: [{ id: personOf(room, 0).id, x: 1, y: 2 }] }] }),
    ],
    [
      'import dry run',
      edit,
      (c) => upload(c, `/api/rooms/${room.id}/import`, { file: { name: 't.csv', content: 'source,target\na,b\n' } }),
    ],
    ['list shares', own, (c) => c.get(`/api/rooms/${room.id}/shares`)],
  ];

  for (const [name, expect, call] of cases) {
    it(`${name}: owner ${expect.owner}, editor ${expect.editor}, viewer ${expect.viewer}, others ${expect.stranger}, signed out ${expect.signedOut}`, async () => {
      for (const who of Object.keys(expect) as Who[]) {
        const reply = await call(clients[who]);
        assert.equal(reply.status, expect[who], `${who}: ${reply.text.slice(0, 200)}`);
        if (expect[who] === 404) assert.match(reply.body.error.message, /That room was not found/);
      }
    });
  }

  it('a viewer is told why they cannot change the room', async () => {
    const reply = await clients.viewer.post(`/api/rooms/${room.id}/edits`, {
      version: 1,
      ops: [{ op: 'deleteTie', id: tieOf(room, 0).id }],
    });
    assert.equal(reply.status, 403);
    assert.match(reply.body.error.message, /view this room but not change it/);
    const del = await clients.editor.delete(`/api/rooms/${room.id}`);
    assert.equal(del.status, 403);
    assert.match(del.body.error.message, /Only the owner/);
  });

  it('a room that does not exist and a room of someone else answer alike', async () => {
    const missing = await clients.stranger.get('/api/rooms/987654321');
    const other = await clients.stranger.get(`/api/rooms/${room.id}`);
    assert.equal(missing.status, other.status);
    assert.deepEqual(missing.body, other.body);
  });

  it('the rooms list shows rooms shared with me, with my access', async () => {
    const list = await clients.viewer.get('/api/rooms');
    const item = list.body.items.find((r: { id: number }) => r.id === room.id);
    assert.equal(item.access, 'viewer');
    const shared = await clients.editor.get('/api/rooms?scope=shared');
    assert.deepEqual(
      shared.body.items.map((r: { id: number; access: string }) => [r.id, r.access]),
      [[room.id, 'editor']],
    );
    assert.equal((await clients.editor.get('/api/rooms?scope=mine')).body.total, 0);
    assert.equal((await clients.stranger.get('/api/rooms')).body.items.filter((r: { id: number }) => r.id === room.id).length, 0);
  });

  it('only the owner deletes; deleting ends the shares too', async () => {
    const other = await createPathRoom(clients.owner, 2, 'Short-lived');
    const viewer = await createAccount();
    await clients.owner.post(`/api/rooms/${other.id}/shares`, { email: viewer.email, role: 'viewer' });
    assert.equal((await clients.stranger.delete(`/api/rooms/${other.id}`)).status, 404);
    assert.equal((await clients.owner.delete(`/api/rooms/${other.id}`)).status, 204);
    const [[row]] = (await pool.query('SELECT COUNT(*) AS n FROM room_shares WHERE room_id = ?', [other.id])) as unknown as [
      [{ n: number }],
    ];
    assert.equal(Number(row.n), 0);
  });

  it('a deactivated collaborator loses access within SESSION_CACHE_MS, even when the change bypasses the app', async () => {
    const gone = await signedInClient(server);
    const r = await createPathRoom(clients.owner, 2, 'Deactivation');
    await clients.owner.post(`/api/rooms/${r.id}/shares`, { email: gone.account.email, role: 'editor' });
    assert.equal((await gone.client.get(`/api/rooms/${r.id}`)).status, 200);
    await pool.query("UPDATE users SET status = 'deactivated' WHERE id = ?", [gone.account.id]);
    const ms = await msUntilStatus(async () => (await gone.client.get(`/api/rooms/${r.id}`)).status, 401);
    assert.ok(ms <= config.SESSION_CACHE_MS + SESSION_BOUND_SLACK_MS, `refused after ${ms} ms`);
  });
});
