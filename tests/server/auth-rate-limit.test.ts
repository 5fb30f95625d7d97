import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { randomInt } from 'node:crypto';

// Own process (node --test isolates files): low limits, and trust proxy so that each test
// can speak from an address of its own through X-Forwarded-For.
process.env['RATE_LIMIT_SIGNIN_PER_15MIN'] = '3';
process.env['RATE_LIMIT_RESET_PER_15MIN'] = '2';
process.env['RATE_LIMIT_IP_PER_15MIN'] = '6';
process.env['TRUST_PROXY'] = 'true';
const { createAccount, startTestServer } = await import('../support/test-server');
const { lastMailId, mailsTo } = await import('./mail-support');
type TestServer = Awaited<ReturnType<typeof startTestServer>>;

const freshIp = () => `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`;

describe('rate limits on sign-in and password reset', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  const from = (ip: string) => {
    const c = server.client();
    const post = (path: string, body: unknown) => c.request('POST', path, body, { headers: { 'x-forwarded-for': ip } });
    return { c, post };
  };

  it('per account and address: failed sign-ins lock that account from that address only', async () => {
    const account = await createAccount('facilitator');
    const ip = freshIp();
    const { post } = from(ip);
    for (let i = 0; i < 3; i++)
      assert.equal((await post('/api/auth/sign-in', { email: account.email, password: 'guess-' + i })).status, 401);
    const locked = await post('/api/auth/sign-in', { email: account.email, password: account.password });
    assert.equal(locked.status, 429, 'even the right password waits');
    assert.match(locked.body.error.message, /Too many sign-in attempts for this account/);
    assert.ok(locked.headers.get('ratelimit-policy') || locked.headers.get('ratelimit'), 'standard RateLimit headers');
    const elsewhere = from(freshIp());
    assert.equal((await elsewhere.post('/api/auth/sign-in', { email: account.email, password: account.password })).status, 200);
    const otherAccount = await createAccount('facilitator');
    assert.equal((await post('/api/auth/sign-in', { email: otherAccount.email, password: otherAccount.password })).status, 200);
  });

  it('per address: many accounts from one address are capped', async () => {
    const { post } = from(freshIp());
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++)
      statuses.push((await post('/api/auth/sign-in', { email: `n${i}@x.example`, password: 'whatever-1' })).status);
    assert.deepEqual(statuses, [401, 401, 401, 401, 401, 401, 429]);
  });

  it('reset requests: per account and address, then per address; the limit answer is the same for unknown addresses', async () => {
    const account = await createAccount('facilitator');
    const ip = freshIp();
    const { post } = from(ip);
    const since = await lastMailId();
    const known = [];
    for (let i = 0; i < 3; i++) known.push((await post('/api/auth/password-reset', { email: account.email })).status);
    assert.deepEqual(known, [202, 202, 429]);
    const unknown = [];
    for (let i = 0; i < 3; i++) unknown.push((await post('/api/auth/password-reset', { email: 'no-such@x.example' })).status);
    assert.deepEqual(unknown, [202, 202, 429], 'the same pattern: the limit reveals nothing');
    await new Promise((r) => setTimeout(r, 300));
    assert.equal((await mailsTo(account.email, since)).length, 2, 'only the allowed requests sent mail');
    const cap = await post('/api/auth/password-reset', { email: 'third@x.example' });
    assert.equal(cap.status, 429, 'the per-address cap (6) is reached');
    assert.match(cap.body.error.message, /from this address/);
  });
});
