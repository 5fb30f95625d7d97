import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { createAccount, signedInClient, startTestServer, type TestServer } from '../support/test-server';

/** CSRF tokens are bound to the session (signed double-submit, OWASP CSRF Prevention Cheat Sheet). */
describe('CSRF token bound to the session; no caching of API answers', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('refuses a token minted by another session, even when cookie and header agree', async () => {
    const { client: victim, account } = await signedInClient(server);
    const { client: attacker } = await signedInClient(server);
    const foreign = decodeURIComponent(attacker.cookies.get('XSRF-TOKEN')!);
    victim.cookies.set('XSRF-TOKEN', foreign);
    const body = { currentPassword: account.password, newPassword: 'another-long-password' };
    const reply = await victim.request('POST', '/api/auth/password', body, { headers: { 'x-xsrf-token': foreign } });
    assert.equal(reply.status, 403);
    assert.equal(reply.body.error.code, 'csrf');
    // A token minted by an anonymous GET is refused for a signed-in session too.
    const anonymous = server.client();
    await anonymous.get('/api/auth/me');
    const anonToken = decodeURIComponent(anonymous.cookies.get('XSRF-TOKEN')!);
    victim.cookies.set('XSRF-TOKEN', anonToken);
    const again = await victim.request('POST', '/api/auth/password', body, { headers: { 'x-xsrf-token': anonToken } });
    assert.equal(again.status, 403);
    // The refusal handed out a token for the victim's own session: with it, the change works.
    assert.notEqual(victim.cookies.get('XSRF-TOKEN'), anonToken);
    assert.equal((await victim.post('/api/auth/password', body)).status, 204);
  });

  it('rotates the token at sign-in and at sign-out', async () => {
    const account = await createAccount('facilitator');
    const c = server.client();
    await c.get('/api/auth/me');
    const before = c.cookies.get('XSRF-TOKEN');
    await c.signIn(account.email, account.password);
    const signedIn = c.cookies.get('XSRF-TOKEN');
    assert.ok(signedIn && signedIn !== before, 'a new token at sign-in');
    assert.equal((await c.post('/api/auth/sign-out')).status, 204);
    assert.notEqual(c.cookies.get('XSRF-TOKEN'), signedIn, 'a new token at sign-out');
  });

  it('marks API answers with personal data as not to be stored', async () => {
    const { client } = await signedInClient(server);
    for (const path of ['/api/auth/me', '/api/rooms', '/api/workshops', '/api/health', '/api/no-such-route']) {
      const reply = await client.get(path);
      assert.equal(reply.headers.get('cache-control'), 'no-store', path);
    }
  });
});
