import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { randomBytes, randomInt } from 'node:crypto';

// Own process (node --test isolates files): low limits, and trust proxy so that each test
// can speak from an address of its own through X-Forwarded-For.
process.env['RATE_LIMIT_SIGNIN_PER_15MIN'] = '3';
process.env['SIGNIN_ACCOUNT_MAX_FAILURES'] = '4';
process.env['RATE_LIMIT_RESET_PER_15MIN'] = '2';
process.env['RATE_LIMIT_IP_PER_15MIN'] = '6';
process.env['TRUST_PROXY'] = 'true';
process.env['RATE_LIMIT_LINK_PER_15MIN'] = '3';
// One counter scope for this process and the second web process it starts (it inherits the env).
process.env['RATE_LIMIT_SCOPE'] = `rate-limit-test-${process.pid}`;
const { createAccount, startTestServer } = await import('../support/test-server');
const { TestClient } = await import('../support/http-client');
const { startWebProcess } = await import('../support/web-process');
const { lastMailId, mailsTo, waitForMail } = await import('./mail-support');
const { issueToken } = await import('../../server/auth/tokens');
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

  it("failed sign-ins back off the account; the owner's known device is never slowed (NIST SP 800-63B 5.2.2)", async () => {
    const account = await createAccount('facilitator');
    const owner = from(freshIp());
    assert.equal((await owner.post('/api/auth/sign-in', { email: account.email, password: account.password })).status, 200);
    assert.ok(owner.c.cookies.has('rh.device'), 'a successful sign-in remembers the browser');
    const attackerIp = freshIp();
    const attacker = from(attackerIp);
    for (let i = 0; i < 3; i++)
      assert.equal((await attacker.post('/api/auth/sign-in', { email: account.email, password: 'guess-' + i })).status, 401);
    const slowed = await attacker.post('/api/auth/sign-in', { email: account.email, password: 'guess-x' });
    assert.equal(slowed.status, 429, 'past the free failures: one try a minute');
    assert.match(slowed.body.error.message, /Too many failed sign-ins for this account. Wait \d+ seconds/);
    assert.ok(Number(slowed.headers.get('retry-after')) > 0, 'Retry-After says how long');
    const newBrowser = from(freshIp());
    assert.equal((await newBrowser.post('/api/auth/sign-in', { email: account.email, password: account.password })).status, 429);
    assert.equal(
      (await owner.post('/api/auth/sign-in', { email: account.email, password: account.password })).status,
      200,
      "the owner's own browser signs in at once",
    );
    const otherAccount = await createAccount('facilitator');
    const sameAddress = from(attackerIp);
    assert.equal((await sameAddress.post('/api/auth/sign-in', { email: otherAccount.email, password: otherAccount.password })).status, 200);
  });

  it('caps failures per account over all browsers and addresses (at most 100; 4 here)', async () => {
    const account = await createAccount('facilitator');
    const owner = from(freshIp());
    await owner.post('/api/auth/sign-in', { email: account.email, password: account.password });
    for (let i = 0; i < 3; i++) await from(freshIp()).post('/api/auth/sign-in', { email: account.email, password: 'guess-' + i });
    assert.equal((await owner.post('/api/auth/sign-in', { email: account.email, password: 'typo-by-owner' })).status, 401);
    const capped = await owner.post('/api/auth/sign-in', { email: account.email, password: account.password });
    assert.equal(capped.status, 429, 'the account waits for the window to end');
    assert.match(capped.body.error.message, /This account had too many failed sign-ins/);
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
    // The mail goes out after the answer: wait for the two, then check no third came.
    await waitForMail(account.email, since);
    const deadline = Date.now() + 5000;
    while ((await mailsTo(account.email, since)).length < 2 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
    assert.equal((await mailsTo(account.email, since)).length, 2, 'only the allowed requests sent mail');
    const cap = await post('/api/auth/password-reset', { email: 'third@x.example' });
    assert.equal(cap.status, 429, 'the per-address cap (6) is reached');
    assert.match(cap.body.error.message, /from this address/);
  });

  it('the link-guessing limit covers invitation and reset links; a good link is never refused', async () => {
    const ip = freshIp();
    const { post } = from(ip);
    const guess = () => randomBytes(32).toString('base64url');
    assert.equal((await post('/api/auth/password-reset/check', { token: guess() })).status, 410);
    assert.equal((await post('/api/auth/invitation/check', { token: guess() })).status, 410);
    assert.equal((await post('/api/auth/password-reset/complete', { token: guess(), password: 'a-long-new-password' })).status, 410);
    const blocked = await post('/api/auth/invitation/check', { token: guess() });
    assert.equal(blocked.status, 429, 'the fourth dead link from this address waits');
    assert.match(blocked.body.error.message, /Too many links that do not work/);
    assert.equal((await post('/api/auth/password-reset/check', { token: guess() })).status, 429);
    const invited = await createAccount('facilitator', 'invited');
    const { token } = await issueToken(invited.id, 'invite', 3600_000, null);
    const good = await post('/api/auth/invitation/check', { token });
    assert.equal(good.status, 200, 'a real invitation still opens from the same address');
    assert.equal(good.body.email, invited.email);
  });
  it('the account back-off holds across web processes: failures on one count on the other (the counters live in Redis)', async () => {
    const other = await startWebProcess();
    try {
      const account = await createAccount('facilitator');
      // Each try from an address of its own, so only the per-account back-off can answer 429.
      const tryOn = async (url: string, password: string) =>
        (
          await new TestClient(url).request(
            'POST',
            '/api/auth/sign-in',
            { email: account.email, password },
            { headers: { 'x-forwarded-for': freshIp() } },
          )
        ).status;
      assert.equal(await tryOn(server.url, 'guess-a'), 401);
      assert.equal(await tryOn(other.url, 'guess-b'), 401);
      assert.equal(await tryOn(server.url, 'guess-c'), 401);
      assert.equal(await tryOn(other.url, 'guess-d'), 429, 'the second process knows of the failures seen by the first');
      assert.equal(await tryOn(server.url, 'guess-e'), 429);
    } finally {
      await other.stop();
    }
  });
});
