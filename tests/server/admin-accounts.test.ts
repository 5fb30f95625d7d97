import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { and, eq, ne } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { db, pool } from '../../server/db';
import { createAccount, signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { lastMailId, waitForMail } from './mail-support';

describe('admin console API', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('deactivation ends the open session at once (401 right after); reactivation lets it sign in again', async () => {
    const { client: admin } = await signedInClient(server, 'admin');
    const { client: fac, account } = await signedInClient(server, 'facilitator');
    const body = { currentPassword: account.password, newPassword: 'a-brand-new-password' };
    assert.equal((await fac.get('/api/auth/me')).body.user.id, account.id);
    assert.equal((await admin.post(`/api/admin/accounts/${account.id}/deactivate`)).status, 204);
    const [rows] = (await pool.query("SELECT COUNT(*) AS n FROM sessions WHERE JSON_VALUE(data, '$.userId') = ?", [
      String(account.id),
    ])) as any;
    assert.equal(rows[0].n, 0, 'stored sessions removed');
    // The CSRF token was bound to the ended session: the first write is refused as stale (403), and
    // the fresh token that answer set gets as far as the sign-in check (401), as the client's retry does.
    assert.equal((await fac.post('/api/auth/password', body)).status, 403);
    assert.equal((await fac.post('/api/auth/password', body)).status, 401);
    assert.equal((await fac.get('/api/auth/me')).body.user, null);
    const refused = await server.client().post('/api/auth/sign-in', { email: account.email, password: account.password });
    assert.equal(refused.status, 401);
    assert.equal((await admin.post(`/api/admin/accounts/${account.id}/reactivate`)).status, 204);
    await server.client().signIn(account.email, account.password);
  });

  it('the last active admin cannot be demoted or deactivated (409 with a clear message)', async () => {
    const { client: admin, account: me } = await signedInClient(server, 'admin');
    const other = await createAccount('admin');
    // Make `me` the only active admin in this test database.
    await db
      .update(users)
      .set({ role: 'facilitator' })
      .where(and(eq(users.role, 'admin'), ne(users.id, me.id)));
    const demote = await admin.put(`/api/admin/accounts/${me.id}/role`, { role: 'facilitator' });
    assert.equal(demote.status, 409);
    assert.match(demote.body.error.message, /last active admin/);
    const off = await admin.post(`/api/admin/accounts/${me.id}/deactivate`);
    assert.equal(off.status, 409);
    assert.match(off.body.error.message, /last active admin/);
    assert.equal((await admin.get('/api/auth/me')).body.user.role, 'admin');

    assert.equal((await admin.put(`/api/admin/accounts/${other.id}/role`, { role: 'admin' })).status, 204);
    const self = await admin.post(`/api/admin/accounts/${me.id}/deactivate`);
    assert.equal(self.status, 409, 'still no self-deactivation');
    assert.match(self.body.error.message, /your own account/);
    assert.equal(
      (await admin.put(`/api/admin/accounts/${me.id}/role`, { role: 'facilitator' })).status,
      204,
      'with a second admin it works',
    );
    assert.equal((await admin.get('/api/admin/accounts')).status, 403, 'the role change applies to the open session');
    // Two admins again, for later tests.
    await db.update(users).set({ role: 'admin' }).where(eq(users.id, me.id));
  });

  it('changes roles, refuses bad input, and answers 404 for unknown accounts', async () => {
    const { client: admin } = await signedInClient(server, 'admin');
    const { client: fac, account } = await signedInClient(server, 'facilitator');
    assert.equal((await fac.get('/api/admin/accounts')).status, 403);
    assert.equal((await admin.put(`/api/admin/accounts/${account.id}/role`, { role: 'admin' })).status, 204);
    assert.equal((await fac.get('/api/admin/accounts')).status, 200, 'promotion applies to the open session');
    assert.equal((await admin.put(`/api/admin/accounts/${account.id}/role`, { role: 'owner' })).status, 400);
    const extra = await admin.put(`/api/admin/accounts/${account.id}/role`, { role: 'admin', note: 'x' });
    assert.equal(extra.status, 400);
    assert.match(extra.body.error.message, /note/);
    assert.equal((await admin.put('/api/admin/accounts/999999/role', { role: 'admin' })).status, 404);
    // One id pattern everywhere (server/core/ids.ts): a malformed id is simply not found.
    for (const bad of ['abc', '0x1', '1e0', '01', '-1', '1.0', '%201'])
      assert.equal((await admin.post(`/api/admin/accounts/${bad}/deactivate`)).status, 404, bad);
    assert.equal((await admin.get('/api/admin/outbox/0x1')).status, 404, 'hex is not an id');
    assert.equal((await admin.get('/api/admin/accounts?pageSize=5000')).status, 400);
    assert.equal((await admin.get('/api/admin/accounts?sort=password_hash')).status, 400);
    const oldNames = await admin.get('/api/admin/accounts?size=5&dir=asc&filter=x');
    assert.equal(oldNames.status, 400, 'every list takes page, pageSize, sort, direction and q');
    assert.match(oldNames.body.error.message, /Unknown fields: size, dir, filter/);
    assert.equal((await admin.post('/api/admin/invitations', { email: 'not-an-address' })).status, 400);
  });

  it('lists accounts with server paging, sort and filter', async () => {
    const { client: admin } = await signedInClient(server, 'admin');
    const tag = `zeta${Date.now()}`;
    for (const n of ['c', 'a', 'b']) {
      await db
        .insert(users)
        .values({ email: `${tag}-${n}@test.ripplehall.local`, name: `${tag} ${n}`, role: 'facilitator', status: 'active' });
    }
    const page0 = await admin.get(`/api/admin/accounts?q=${tag}&sort=name&direction=asc&pageSize=2&page=0`);
    assert.equal(page0.status, 200);
    assert.equal(page0.body.total, 3);
    assert.deepEqual([page0.body.page, page0.body.pageSize, page0.body.size], [0, 2, undefined], 'the one Page<T> shape');
    assert.deepEqual(
      page0.body.items.map((r: { name: string }) => r.name),
      [`${tag} a`, `${tag} b`],
    );
    const page1 = await admin.get(`/api/admin/accounts?q=${tag}&sort=name&direction=asc&pageSize=2&page=1`);
    assert.deepEqual(
      page1.body.items.map((r: { name: string }) => r.name),
      [`${tag} c`],
    );
    const desc = await admin.get(`/api/admin/accounts?q=${tag}&sort=email&direction=desc`);
    assert.equal(desc.body.items[0].email, `${tag}-c@test.ripplehall.local`);
    assert.ok(!('passwordHash' in desc.body.items[0]), 'no hashes leave the server');
    const wild = await admin.get('/api/admin/accounts?q=%25');
    assert.equal(wild.body.total, 0, 'a % in the filter is taken literally');
  });

  it('records who did what, when and from where in the audit log', async () => {
    const { client: admin, account: me } = await signedInClient(server, 'admin');
    const target = await createAccount('facilitator');
    await admin.post(`/api/admin/accounts/${target.id}/deactivate`);
    const log = await admin.get(`/api/admin/audit?q=${encodeURIComponent(target.email)}`);
    assert.equal(log.status, 200);
    const entry = log.body.items.find((e: { action: string }) => e.action === 'account.deactivated');
    assert.ok(entry, JSON.stringify(log.body.items));
    assert.equal(entry.actorEmail, me.email);
    assert.equal(entry.targetEmail, target.email);
    assert.match(entry.ip, /127\.0\.0\.1/);
    assert.ok(Math.abs(Date.parse(entry.createdAt) - Date.now()) < 60_000);
    const paged = await admin.get('/api/admin/audit?pageSize=1&page=0');
    assert.equal(paged.body.items.length, 1);
    assert.ok(paged.body.total > 1);
  });

  it('shows the captured outbox while the mail fake is on; the HTML part comes with its own strict CSP', async () => {
    const { client: admin } = await signedInClient(server, 'admin');
    const { client: fac } = await signedInClient(server, 'facilitator');
    assert.deepEqual((await admin.get('/api/admin/settings')).body, { mailFake: true });
    const email = `outbox-${Date.now()}@test.ripplehall.local`;
    const since = await lastMailId();
    await admin.post('/api/admin/invitations', { email });
    const mail = await waitForMail(email, since);
    const list = await admin.get('/api/admin/outbox?pageSize=5');
    assert.equal(list.body.items[0].id, mail.id);
    assert.equal(list.body.items[0].to, email);
    const one = await admin.get(`/api/admin/outbox/${mail.id}`);
    assert.match(one.body.text, /Set up my account/);
    assert.equal(one.body.hasHtml, true);
    const html = await admin.get(`/api/admin/outbox/${mail.id}/html`);
    assert.equal(html.status, 200);
    assert.match(html.headers.get('content-type')!, /text\/html/);
    const csp = html.headers.get('content-security-policy')!;
    assert.match(csp, /default-src 'none'/);
    assert.match(csp, /sandbox/);
    assert.doesNotMatch(csp, /script-src/);
    assert.equal((await fac.get('/api/admin/outbox')).status, 403);
    assert.equal((await server.client().get(`/api/admin/outbox/${mail.id}/html`)).status, 401);
    assert.equal((await admin.get('/api/admin/outbox/999999')).status, 404);
  });

  it('an admin can send a reset link to an active account', async () => {
    const { client: admin } = await signedInClient(server, 'admin');
    const target = await createAccount('facilitator');
    const since = await lastMailId();
    assert.equal((await admin.post(`/api/admin/accounts/${target.id}/password-reset`)).status, 204);
    const mail = await waitForMail(target.email, since);
    assert.match(mail.textBody!, /\/account\/reset-password\?token=/);
  });
});
