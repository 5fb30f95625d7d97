import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';

// Own process: PUBLIC_URL on https while the test server speaks plain http, as with no TLS in front.
process.env['PUBLIC_URL'] = 'https://ripplehall.example.test';
const { config, startupWarnings } = await import('../../server/config');
const { createAccount, startTestServer } = await import('../support/test-server');
type TestServer = Awaited<ReturnType<typeof startTestServer>>;

describe('PUBLIC_URL on https without TLS in front', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('warns at start-up', () => {
    const [warning] = startupWarnings(config);
    assert.ok(warning, 'one warning');
    assert.match(warning, /PUBLIC_URL is https:\/\/ripplehall\.example\.test.*TRUST_PROXY/);
  });

  it('says in the sign-in answer that the browser will not keep the cookie', async () => {
    const account = await createAccount('facilitator');
    const c = server.client();
    const reply = await c.post('/api/auth/sign-in', { email: account.email, password: account.password });
    assert.equal(reply.status, 200);
    assert.ok(!c.cookies.has('rh.sid'), 'no session cookie over plain http');
    assert.match(reply.body.warning, /plain http.*PUBLIC_URL starts with https/);
  });
});
