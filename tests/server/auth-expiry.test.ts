import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';

// This file runs in its own process (node --test isolates files): short session limits are
// set before the app's configuration is read, so the real idle and absolute timeouts act.
process.env['SESSION_IDLE_MINUTES'] = String(2 / 60); // 2 s
process.env['SESSION_MAX_HOURS'] = String(5 / 3600); // 5 s
const { signedInClient, startTestServer } = await import('../support/test-server');
const { pool } = await import('../../server/db');
type TestServer = Awaited<ReturnType<typeof startTestServer>>;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('session idle timeout and absolute lifetime (SESSION_IDLE_MINUTES, SESSION_MAX_HOURS)', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('ends a session left idle longer than the idle timeout', async () => {
    const { client, account } = await signedInClient(server);
    const cookie = client.cookies.get('rh.sid')!;
    const sid = decodeURIComponent(cookie).slice(2).split('.')[0];
    const [rows] = (await pool.query('SELECT expires FROM sessions WHERE session_id = ?', [sid])) as any;
    const left = rows[0].expires - Date.now() / 1000;
    assert.ok(left > 0 && left <= 3, `the stored expiry is about 2 s ahead (${left.toFixed(1)} s)`);
    assert.equal((await client.get('/api/auth/me')).body.user.id, account.id);
    await sleep(3200);
    // Sent by hand with the old cookie, as a browser that ignored the cookie's Max-Age would.
    const stale = server.client();
    stale.cookies.set('rh.sid', cookie);
    assert.equal((await stale.get('/api/auth/me')).body.user, null);
  });

  it('keeps an active session past the idle timeout, then ends it at the absolute lifetime', async () => {
    const { client, account } = await signedInClient(server);
    const started = Date.now();
    // A request every second: never idle for 2 s, so only the 5 s lifetime can end it.
    while (Date.now() - started < 4000) {
      await sleep(1000);
      assert.equal((await client.get('/api/auth/me')).body.user?.id, account.id, `still signed in at ${Date.now() - started} ms`);
    }
    let endedAt = 0;
    while (Date.now() - started < 9000) {
      await sleep(700);
      if ((await client.get('/api/auth/me')).body.user === null) {
        endedAt = Date.now() - started;
        break;
      }
    }
    assert.ok(endedAt >= 5000 && endedAt < 7000, `ended ${endedAt} ms after sign-in (lifetime 5000 ms)`);
    assert.equal((await client.post('/api/auth/password', { currentPassword: 'x', newPassword: 'y'.repeat(12) })).status, 401);
  });
});
