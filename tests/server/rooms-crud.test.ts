import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { startTestServer, signedInClient, type TestServer } from '../support/test-server';
import type { TestClient } from '../support/http-client';
import { createPathRoom } from './rooms-helpers';

describe('rooms: create, read, change, delete', () => {
  let server: TestServer;
  let client: TestClient;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
  });
  after(async () => server.stop());

  it('creates a room with people and ties and reads it back in order', async () => {
    const room = await createPathRoom(client, 5);
    const got = await client.get(`/api/rooms/${room.id}`);
    assert.equal(got.status, 200);
    assert.equal(got.body.access, 'owner');
    assert.equal(got.body.version, 1);
    assert.deepEqual(
      got.body.people.map((p: { key: string }) => p.key),
      ['k0', 'k1', 'k2', 'k3', 'k4'],
    );
    assert.equal(got.body.ties.length, 4);
    assert.deepEqual(got.body.settings, { directed: false, minutesPerHop: 5, laziness: 0, mixing: 0 });
  });
});
