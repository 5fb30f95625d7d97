import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import mysql from 'mysql2/promise';
import { config } from '../../server/config';
import { pool } from '../../server/db';
import { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { startWebProcess } from '../support/web-process';
import { createPathRoom } from './rooms-helpers';
import { firstOf } from '../../shared/checked';

/**
 * One user's heavy writes cannot occupy the database for everyone: small edit batches, at most
 * MAX_HEAVY_WRITES_PER_USER (2) at once per account, and a batch whose client left is rolled back.
 * The room row is held locked from a separate connection, so the batches wait inside their
 * transactions for as long as the test needs: no timing involved.
 */
describe('heavy writes', () => {
  let server: TestServer;
  before(async () => {
    // A counter scope this process shares with the second web process of the cross-process test.
    config.RATE_LIMIT_SCOPE = `heavy-writes-test-${process.pid}`;
    server = await startTestServer();
  });
  after(async () => server.stop());

  const addPeople = (n: number, prefix: string) =>
    Array.from({ length: n }, (_, i) => ({ op: 'addPerson', tempId: `${prefix}${i}`, name: `${prefix} ${i}` }));

  async function holdRoomLock(roomId: number) {
    const conn = await mysql.createConnection({
      host: config.DB_HOST,
      port: config.DB_PORT,
      user: config.DB_USER,
      password: config.DB_PASSWORD,
      database: config.DB_NAME,
    });
    await conn.beginTransaction();
    await conn.query('SELECT id FROM rooms WHERE id = ? FOR UPDATE', [roomId]);
    return conn;
  }

  async function waitersOnRoom(): Promise<number> {
    const [rows] = (await pool.query(
      "SELECT COUNT(*) AS n FROM information_schema.PROCESSLIST WHERE INFO LIKE '%from `rooms`%for update%' AND DB = ? AND ID <> CONNECTION_ID()",
      [config.DB_NAME],
    )) as unknown as [{ n: number }[]];
    return Number(firstOf(rows, 'waiter count').n);
  }

  async function until(check: () => Promise<boolean>) {
    while (!(await check())) await new Promise((r) => setTimeout(r, 20));
  }

  it('refuses a batch above the cap with a clear 400', async () => {
    const { client } = await signedInClient(server);
    const room = await createPathRoom(client, 2);
    const reply = await client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: addPeople(2001, 'p') });
    assert.equal(reply.status, 400);
    assert.match(reply.body.error.message, /at most 2000 ops in one batch/);
  });

  it('a third concurrent heavy write of one account waits its turn (429); other users are served', async () => {
    const { client } = await signedInClient(server);
    const { client: colleague } = await signedInClient(server);
    const room = await createPathRoom(client, 2);
    const lock = await holdRoomLock(room.id);
    try {
      const first = client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: addPeople(50, 'a') });
      const second = client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: addPeople(50, 'b') });
      await until(async () => (await waitersOnRoom()) >= 2);
      const third = await client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: addPeople(50, 'c') });
      assert.equal(third.status, 429);
      assert.equal(third.body.error.code, 'busy_writing');
      assert.match(third.body.error.message, /already have 2 large changes/);
      const other = await colleague.get('/api/rooms');
      assert.equal(other.status, 200, 'another user is served while the two wait');
      await lock.rollback();
      const statuses = [(await first).status, (await second).status].sort();
      assert.deepEqual(statuses, [200, 409], 'one saves, the other is stale (same version)');
    } finally {
      await lock.end();
    }
  });

  it('the cap holds over all web processes: two writes here, the third on another process waits (429)', async () => {
    const { client } = await signedInClient(server);
    const room = await createPathRoom(client, 2);
    const other = await startWebProcess({ RATE_LIMIT_SCOPE: config.RATE_LIMIT_SCOPE! });
    const lock = await holdRoomLock(room.id);
    try {
      const first = client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: addPeople(50, 'a') });
      const second = client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: addPeople(50, 'b') });
      await until(async () => (await waitersOnRoom()) >= 2);
      // The same session (sessions live in MariaDB) on the second process.
      const there = new TestClient(other.url);
      for (const [k, v] of client.cookies) there.cookies.set(k, v);
      const third = await there.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: addPeople(50, 'c') });
      assert.equal(third.status, 429, third.text);
      assert.equal(third.body.error.code, 'busy_writing');
      await lock.rollback();
      assert.deepEqual([(await first).status, (await second).status].sort(), [200, 409]);
      // Both slots are free again: the other process takes the next write.
      const fresh = (await client.get(`/api/rooms/${room.id}`)).body.version as number;
      const after = await there.post(`/api/rooms/${room.id}/edits`, { version: fresh, ops: addPeople(1, 'd') });
      assert.equal(after.status, 200, after.text);
    } finally {
      await lock.end();
      await other.stop();
    }
  });

  it('a batch whose client went away is rolled back, not committed', async () => {
    const { client } = await signedInClient(server);
    const room = await createPathRoom(client, 2);
    const lock = await holdRoomLock(room.id);
    const gone = new AbortController();
    const headers: Record<string, string> = {
      'content-type': 'application/json',
      cookie: client.cookieHeader(),
      'x-xsrf-token': decodeURIComponent(client.cookies.get('XSRF-TOKEN')!),
    };
    const abandoned = fetch(`${server.url}/api/rooms/${room.id}/edits`, {
      method: 'POST',
      headers,
      body: JSON.stringify({ version: room.version, ops: addPeople(20, 'gone') }),
      signal: gone.signal,
    }).catch(() => 'aborted');
    await until(async () => (await waitersOnRoom()) >= 1);
    gone.abort();
    assert.equal(await abandoned, 'aborted');
    // The next batch from the same version queues behind the abandoned one on the room lock:
    // it saves only if the abandoned batch did not commit.
    const next = client.post(`/api/rooms/${room.id}/edits`, { version: room.version, ops: addPeople(1, 'kept') });
    await until(async () => (await waitersOnRoom()) >= 2);
    await lock.rollback();
    await lock.end();
    const saved = await next;
    assert.equal(saved.status, 200, saved.text);
    const people = await client.get(`/api/rooms/${room.id}/people?pageSize=100`);
    assert.equal(people.body.total, 3, 'two at start plus the one kept; none of the abandoned twenty');
  });
});
