import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { startTestServer, signedInClient, type TestServer } from '../support/test-server';

describe('server basics', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('answers health and unknown API routes as JSON', async () => {
    const c = server.client();
    assert.equal((await c.get('/api/health')).status, 200);
    const missing = await c.get('/api/no-such-thing');
    assert.equal(missing.status, 404);
    assert.match(missing.body.error.message, /not found/);
  });

  it('signs in and reports the account', async () => {
    const { client, account } = await signedInClient(server);
    const me = await client.get('/api/auth/me');
    assert.equal(me.body.user.email, account.email);
  });
});
