import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { and, eq } from 'drizzle-orm';
import { accountTokens, users } from '../../db/schema/accounts';
import { db } from '../../server/db';
import { hashToken } from '../../server/auth/tokens';
import { RESET_REQUEST_ANSWER } from '../../shared/api/accounts';
import { createAccount, signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { lastMailId, mailsTo, tokenFrom, waitForMail } from './mail-support';

const uniqueEmail = (tag: string) => `${tag}-${Math.random().toString(36).slice(2, 10)}@test.ripplehall.local`;

describe('invitation and password-reset links, through the SMTP fake', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('an invitation crosses SMTP, its link sets name and password once, and the account can sign in', async () => {
    const { client: admin } = await signedInClient(server, 'admin');
    const email = uniqueEmail('invitee');
    const since = await lastMailId();
    const invited = await admin.post('/api/admin/invitations', { email, name: '' });
    assert.equal(invited.status, 201, invited.text);
    const mail = await waitForMail(email, since);
    assert.equal(mail.subject, 'You are invited to Ripplehall');
    assert.ok(mail.htmlBody && mail.textBody, 'text and HTML parts');
    assert.match(mail.raw, /^Content-Type: multipart\/alternative/im);
    const token = tokenFrom(mail, '/account/accept');
    assert.ok(Buffer.from(token, 'base64url').length >= 16, 'at least 128 bits');
    assert.ok(mail.htmlBody!.includes(`token=${token}`), 'the HTML part carries the same link');

    // Only the SHA-256 of the token is stored, and it expires in 72 hours.
    const rows = await db.select().from(accountTokens).where(eq(accountTokens.userId, invited.body.id));
    const [row] = rows;
    assert.ok(row && rows.length === 1, `one token row, got ${rows.length}`);
    assert.equal(row.tokenHash, hashToken(token));
    assert.ok(!JSON.stringify(rows).includes(token));
    const hours = (row.expiresAt.getTime() - row.createdAt.getTime()) / 3600e3;
    assert.ok(Math.abs(hours - 72) < 0.01, `expires after ${hours} h`);

    const guest = server.client();
    const check = await guest.post('/api/auth/invitation/check', { token });
    assert.equal(check.status, 200);
    assert.equal(check.body.email, email);
    assert.equal(
      (await server
        .client()
        .signIn(email, 'x')
        .catch((e) => e)) instanceof Error,
      true,
      'no sign-in before accepting',
    );
    const weak = await guest.post('/api/auth/invitation/accept', { token, name: 'Ida Morrow', password: 'short' });
    assert.equal(weak.status, 400);
    assert.equal(weak.body.error.details.fields[0].field, 'password');
    const ok = await guest.post('/api/auth/invitation/accept', { token, name: 'Ida Morrow', password: 'a-good-long-password' });
    assert.equal(ok.status, 200, ok.text);
    const again = await guest.post('/api/auth/invitation/accept', { token, name: 'Ida Morrow', password: 'a-good-long-password' });
    assert.equal(again.status, 410, 'single use');
    assert.match(again.body.error.message, /no longer works/);
    const me = await (async () => {
      const c = server.client();
      await c.signIn(email, 'a-good-long-password');
      return (await c.get('/api/auth/me')).body.user;
    })();
    assert.deepEqual([me.name, me.role], ['Ida Morrow', 'facilitator']);
  });

  it('resend revokes the old link; revoke kills the link; an expired link is refused', async () => {
    const { client: admin } = await signedInClient(server, 'admin');
    const email = uniqueEmail('resend');
    let since = await lastMailId();
    const { body } = await admin.post('/api/admin/invitations', { email, name: 'Tomas Field', role: 'facilitator' });
    const first = tokenFrom(await waitForMail(email, since), '/account/accept');
    const dup = await admin.post('/api/admin/invitations', { email });
    assert.equal(dup.status, 409);
    assert.match(dup.body.error.message, /invited already/);

    since = await lastMailId();
    assert.equal((await admin.post(`/api/admin/accounts/${body.id}/invitation`)).status, 204);
    const second = tokenFrom(await waitForMail(email, since), '/account/accept');
    assert.notEqual(second, first);
    const guest = server.client();
    assert.equal((await guest.post('/api/auth/invitation/check', { token: first })).status, 410, 'old link revoked');
    assert.equal((await guest.post('/api/auth/invitation/check', { token: second })).status, 200);

    assert.equal((await admin.delete(`/api/admin/accounts/${body.id}/invitation`)).status, 204);
    assert.equal((await guest.post('/api/auth/invitation/check', { token: second })).status, 410, 'revoked');
    assert.equal((await admin.delete(`/api/admin/accounts/${body.id}/invitation`)).status, 409, 'nothing left to revoke');
    const list = await admin.get(`/api/admin/accounts?q=${encodeURIComponent(email)}`);
    assert.equal(list.body.items[0].invitation, 'revoked');

    since = await lastMailId();
    await admin.post(`/api/admin/accounts/${body.id}/invitation`);
    const third = tokenFrom(await waitForMail(email, since), '/account/accept');
    await db
      .update(accountTokens)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(accountTokens.tokenHash, hashToken(third)));
    const expired = await guest.post('/api/auth/invitation/accept', {
      token: third,
      name: 'Tomas Field',
      password: 'a-good-long-password',
    });
    assert.equal(expired.status, 410);
    const [row] = await db.select().from(users).where(eq(users.id, body.id));
    assert.ok(row, 'the account row');
    assert.equal(row.status, 'invited', 'nothing changed');
    assert.equal(row.passwordHash, null);
    assert.equal((await guest.post('/api/auth/invitation/check', { token: 'not a token' })).status, 410);
    assert.equal((await guest.post('/api/auth/invitation/check', { token: third, extra: 1 })).status, 400);
  });

  it('a reset request answers the same for known and unknown addresses and mails only real accounts', async () => {
    const account = await createAccount('facilitator');
    const gone = await createAccount('facilitator', 'deactivated');
    const since = await lastMailId();
    const c = server.client();
    const known = await c.post('/api/auth/password-reset', { email: account.email });
    const unknown = await c.post('/api/auth/password-reset', { email: uniqueEmail('nobody') });
    const off = await c.post('/api/auth/password-reset', { email: gone.email });
    for (const r of [known, unknown, off]) {
      assert.equal(r.status, 202);
      assert.deepEqual(r.body, { message: RESET_REQUEST_ANSWER });
    }
    const mail = await waitForMail(account.email, since);
    assert.equal(mail.subject, 'Choose a new Ripplehall password');
    await new Promise((r) => setTimeout(r, 300));
    assert.equal((await mailsTo(gone.email, since)).length, 0, 'no mail to a deactivated account');
  });

  it('a reset link works once, within one hour, and signs the account out everywhere', async () => {
    const { client: open, account } = await signedInClient(server);
    let since = await lastMailId();
    await server.client().post('/api/auth/password-reset', { email: account.email });
    const token = tokenFrom(await waitForMail(account.email, since), '/account/reset-password');
    const [row] = await db
      .select()
      .from(accountTokens)
      .where(and(eq(accountTokens.tokenHash, hashToken(token)), eq(accountTokens.purpose, 'reset')));
    assert.ok(row, 'the reset token row');
    const minutes = (row.expiresAt.getTime() - row.createdAt.getTime()) / 60e3;
    assert.ok(Math.abs(minutes - 60) < 0.1, `expires after ${minutes} min`);

    const guest = server.client();
    assert.equal((await guest.post('/api/auth/password-reset/check', { token })).body.email, account.email);
    const done = await guest.post('/api/auth/password-reset/complete', { token, password: 'reset-to-this-one' });
    assert.equal(done.status, 200, done.text);
    assert.equal((await guest.post('/api/auth/password-reset/complete', { token, password: 'and-again-this-one' })).status, 410);
    assert.equal((await open.get('/api/auth/me')).body.user, null, 'the open session ended');
    await server.client().signIn(account.email, 'reset-to-this-one');
    const old = await server.client().post('/api/auth/sign-in', { email: account.email, password: account.password });
    assert.equal(old.status, 401);

    since = await lastMailId();
    await server.client().post('/api/auth/password-reset', { email: account.email });
    const late = tokenFrom(await waitForMail(account.email, since), '/account/reset-password');
    await db
      .update(accountTokens)
      .set({ expiresAt: new Date(Date.now() - 1) })
      .where(eq(accountTokens.tokenHash, hashToken(late)));
    const expired = await guest.post('/api/auth/password-reset/complete', { token: late, password: 'too-late-password' });
    assert.equal(expired.status, 410);
    assert.match(expired.body.error.message, /expired/);
  });
});
