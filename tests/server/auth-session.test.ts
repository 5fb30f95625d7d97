import assert from 'node:assert/strict';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { after, before, describe, it } from 'node:test';
import { eq } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { db, pool } from '../../server/db';
import { hashPassword, verifyPassword } from '../../server/auth/passwords';
import { createApp } from '../../server/app';
import { TestClient } from '../support/http-client';
import { config } from '../../server/config';
import {
  createAccount,
  msUntilStatus,
  SESSION_BOUND_SLACK_MS,
  signedInClient,
  startTestServer,
  type TestServer,
} from '../support/test-server';

describe('sign-in, sessions, CSRF and request checks', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('signs in with the right password and gives a fresh session id', async () => {
    const account = await createAccount('facilitator');
    const c = server.client();
    const reply = await c.signIn(account.email, account.password);
    assert.equal(reply.body.user.email, account.email);
    const first = c.cookies.get('rh.sid');
    assert.ok(first, 'a session cookie is set');
    const setCookie = reply.headers.getSetCookie().find((l) => l.startsWith('rh.sid='))!;
    assert.match(setCookie, /HttpOnly/i);
    assert.match(setCookie, /SameSite=Lax/i);
    // Signing in again on a session that already exists (a planted one, say) gets a new id,
    // and the old id stops working.
    await c.signIn(account.email, account.password);
    const second = c.cookies.get('rh.sid');
    assert.notEqual(second, first, 'the session cookie value changes at sign-in');
    const stale = server.client();
    stale.cookies.set('rh.sid', first!);
    assert.equal((await stale.get('/api/auth/me')).body.user, null, 'the pre-sign-in session id is dead');
    assert.equal((await c.get('/api/auth/me')).body.user.id, account.id);
  });

  it('gives the same answer for a wrong password, an unknown account and a deactivated one', async () => {
    const active = await createAccount('facilitator');
    const off = await createAccount('facilitator', 'deactivated');
    const answers = await Promise.all([
      server.client().post('/api/auth/sign-in', { email: active.email, password: 'not-the-password' }),
      server.client().post('/api/auth/sign-in', { email: 'nobody-here@test.ripplehall.local', password: 'not-the-password' }),
      server.client().post('/api/auth/sign-in', { email: off.email, password: off.password }),
    ]);
    for (const a of answers) {
      assert.equal(a.status, 401);
      assert.equal(a.body.error.message, 'That e-mail and password do not match an active account.');
    }
  });

  it('sign-out destroys the server session: the old cookie no longer works', async () => {
    const { client } = await signedInClient(server);
    const cookie = client.cookies.get('rh.sid')!;
    const sid = decodeURIComponent(cookie).slice(2).split('.')[0];
    const [before] = (await pool.query('SELECT COUNT(*) AS n FROM sessions WHERE session_id = ?', [sid])) as any;
    assert.equal(before[0].n, 1);
    assert.equal((await client.post('/api/auth/sign-out')).status, 204);
    const [afterRows] = (await pool.query('SELECT COUNT(*) AS n FROM sessions WHERE session_id = ?', [sid])) as any;
    assert.equal(afterRows[0].n, 0, 'the stored session row is gone');
    const replay = server.client();
    replay.cookies.set('rh.sid', cookie);
    assert.equal((await replay.get('/api/auth/me')).body.user, null);
    assert.equal((await replay.post('/api/auth/password', { currentPassword: 'x', newPassword: 'y'.repeat(12) })).status, 401);
  });

  it('two web processes: a change counts at once in the process that makes it, and within SESSION_CACHE_MS in the other', async () => {
    const other = createServer(createApp());
    await new Promise<void>((resolve) => other.listen(0, '127.0.0.1', () => resolve()));
    try {
      const otherUrl = `http://127.0.0.1:${(other.address() as AddressInfo).port}`;
      const statusAt = async (url: string, cookies: Map<string, string>, path: string) => {
        const c = new TestClient(url);
        for (const [k, v] of cookies) c.cookies.set(k, v);
        return (await c.get(path)).status;
      };
      const onBoth = (cookies: Map<string, string>, path: string) =>
        Promise.all([server.url, otherUrl].map((url) => statusAt(url, cookies, path)));
      const bound = config.SESSION_CACHE_MS + SESSION_BOUND_SLACK_MS;
      /** How long each process took to give `want` for `path` (both asked in parallel). */
      const untilBoth = (cookies: Map<string, string>, path: string, want: number) =>
        Promise.all([server.url, otherUrl].map((url) => msUntilStatus(() => statusAt(url, cookies, path), want)));
      assert.ok(config.SESSION_CACHE_MS > 0 && config.SESSION_CACHE_MS <= 2000, 'the copies live at most 2 s');

      // Straight in the database (as an operator, or a process this one never hears from, would):
      // both processes see it within the bound.
      const { client, account } = await signedInClient(server);
      assert.deepEqual(await onBoth(client.cookies, '/api/rooms'), [200, 200]);
      await db.update(users).set({ role: 'admin' }).where(eq(users.id, account.id));
      for (const ms of await untilBoth(client.cookies, '/api/admin/accounts', 200))
        assert.ok(ms <= bound, `role change seen after ${ms} ms`);
      await db.update(users).set({ status: 'deactivated' }).where(eq(users.id, account.id));
      for (const ms of await untilBoth(client.cookies, '/api/rooms', 401)) assert.ok(ms <= bound, `deactivation seen after ${ms} ms`);

      // Sign-out in one process: refused there at once, in the other (which read the session just
      // before) within the bound.
      const second = await signedInClient(server);
      assert.deepEqual(await onBoth(second.client.cookies, '/api/rooms'), [200, 200]);
      const elsewhere = new TestClient(otherUrl);
      for (const [k, v] of second.client.cookies) elsewhere.cookies.set(k, v);
      assert.equal((await elsewhere.post('/api/auth/sign-out')).status, 204);
      assert.equal(await statusAt(otherUrl, second.client.cookies, '/api/rooms'), 401, 'at once where it signed out');
      const signedOut = await msUntilStatus(() => statusAt(server.url, second.client.cookies, '/api/rooms'), 401);
      assert.ok(signedOut <= bound, `sign-out seen by the other process after ${signedOut} ms`);

      // A password change in one process ends the account's other sessions: in that process at
      // once, in the other within the bound.
      const third = await signedInClient(server);
      const phone = server.client();
      await phone.signIn(third.account.email, third.account.password);
      assert.deepEqual(await onBoth(phone.cookies, '/api/rooms'), [200, 200]);
      const changed = await third.client.post('/api/auth/password', {
        currentPassword: third.account.password,
        newPassword: 'a-new-long-password-2',
      });
      assert.equal(changed.status, 204);
      assert.equal(await statusAt(server.url, phone.cookies, '/api/rooms'), 401, 'at once in the process that changed it');
      const ended = await msUntilStatus(() => statusAt(otherUrl, phone.cookies, '/api/rooms'), 401);
      assert.ok(ended <= bound, `the other session ended in the other process after ${ended} ms`);
      assert.deepEqual(await onBoth(third.client.cookies, '/api/rooms'), [200, 200], 'the session that changed it stays');
    } finally {
      other.closeAllConnections();
      await new Promise<void>((resolve) => other.close(() => resolve()));
    }
  });

  it('rejects state-changing requests without the XSRF header or with a wrong one (403)', async () => {
    const { client, account } = await signedInClient(server);
    const body = { currentPassword: account.password, newPassword: 'another-long-password' };
    const missing = await client.request('POST', '/api/auth/password', body, { headers: { 'x-xsrf-token': '' } });
    assert.equal(missing.status, 403);
    assert.equal(missing.body.error.code, 'csrf');
    const forged = await client.request('POST', '/api/auth/password', body, { headers: { 'x-xsrf-token': 'abc.def' } });
    assert.equal(forged.status, 403);
    // A cookie the attacker made up (right shape, wrong signature) is refused even when echoed.
    const planted = server.client();
    planted.cookies.set('XSRF-TOKEN', 'nonce.forged-mac');
    const echo = await planted.request(
      'POST',
      '/api/auth/sign-in',
      { email: account.email, password: account.password },
      {
        headers: { 'x-xsrf-token': 'nonce.forged-mac' },
      },
    );
    assert.equal(echo.status, 403);
    assert.equal((await client.post('/api/auth/password', body)).status, 204, 'with the header it works');
  });

  it('answers unknown fields, bad JSON and huge bodies with clear 400 / 413 messages', async () => {
    const c = server.client();
    const extra = await c.post('/api/auth/sign-in', { email: 'a@b.cd', password: 'x', remember: true });
    assert.equal(extra.status, 400);
    assert.match(extra.body.error.message, /remember/);
    assert.deepEqual(extra.body.error.details.fields[0].field, 'remember');
    const bad = await c.request('POST', '/api/auth/sign-in', undefined, {
      raw: '{"email": ',
      headers: { 'content-type': 'application/json' },
    });
    assert.equal(bad.status, 400);
    assert.equal(bad.body.error.code, 'bad_json');
    const huge = await c.request('POST', '/api/auth/sign-in', undefined, {
      raw: JSON.stringify({ email: 'a@b.cd', password: 'x'.repeat(3 * 1024 * 1024) }),
      headers: { 'content-type': 'application/json' },
    });
    assert.equal(huge.status, 413);
    assert.equal(huge.body.error.code, 'too_large');
    const missingField = await c.post('/api/auth/sign-in', { email: 'not-an-address' });
    assert.equal(missingField.status, 400);
    assert.deepEqual(missingField.body.error.details.fields.map((f: { field: string }) => f.field).sort(), ['email', 'password']);
  });

  it('stores passwords as scrypt with N=2^17, r=8, p=1 and a per-account salt', async () => {
    // Parameters from the OWASP Password Storage Cheat Sheet (OWASP Foundation, 2024 revision):
    // "scrypt with a minimum CPU/memory cost parameter of (2^17), a minimum block size of 8
    // (1024 bytes), and a parallelization parameter of 1".
    const account = await createAccount('facilitator');
    const [row] = await db.select({ hash: users.passwordHash }).from(users).where(eq(users.id, account.id));
    assert.ok(row?.hash, 'the account has a password hash');
    const [scheme, N, r, p, salt = '', key = ''] = row.hash.split('$');
    assert.equal(scheme, 'scrypt');
    assert.equal(Number(N), 2 ** 17);
    assert.equal(Number(r), 8);
    assert.equal(Number(p), 1);
    assert.ok(Buffer.from(salt, 'base64url').length >= 16, 'salt of at least 16 bytes');
    assert.equal(Buffer.from(key, 'base64url').length, 32);
    const a = await hashPassword('same password twice');
    const b = await hashPassword('same password twice');
    assert.notEqual(a, b, 'fresh salt per hash');
    assert.ok(await verifyPassword('same password twice', a));
    assert.ok(!(await verifyPassword('same password twice!', a)));
  });

  it('changing the password keeps this session and ends the others', async () => {
    const { client, account } = await signedInClient(server);
    const other = server.client();
    await other.signIn(account.email, account.password);
    const wrong = await client.post('/api/auth/password', { currentPassword: 'not-it-at-all', newPassword: 'brand-new-password-1' });
    assert.equal(wrong.status, 400);
    assert.equal(wrong.body.error.details.fields[0].field, 'currentPassword');
    const short = await client.post('/api/auth/password', { currentPassword: account.password, newPassword: 'short' });
    assert.equal(short.status, 400);
    assert.match(short.body.error.message, /newPassword: Use at least 10 characters/);
    assert.equal(
      (await client.post('/api/auth/password', { currentPassword: account.password, newPassword: 'brand-new-password-1' })).status,
      204,
    );
    assert.equal((await client.get('/api/auth/me')).body.user.id, account.id);
    assert.equal((await other.get('/api/auth/me')).body.user, null);
    await server.client().signIn(account.email, 'brand-new-password-1');
  });
});
