import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { forgetCachedAccount, SessionCache, type CachedSession } from '../../server/core/session-cache';

/** A session of account `userId` expiring `inSeconds` after `nowMs`. */
const row = (userId: number, nowMs: number, inSeconds = 1800): CachedSession => ({
  data: JSON.stringify({ userId, signedInAt: 1 }),
  expires: Math.round(nowMs / 1000) + inSeconds,
  account: { id: userId, email: `u${userId}@test.ripplehall.local`, name: 'U', role: 'facilitator', status: 'active' },
});

/** A cache on a clock the test moves, and a loader that counts its calls. */
function setUp(ttlMs = 1000) {
  let now = 1_000_000;
  const cache = new SessionCache(ttlMs, () => now);
  const loads: string[] = [];
  const rows = new Map<string, CachedSession | null>();
  const load = (sid: string) => async () => {
    loads.push(sid);
    return rows.get(sid) ?? null;
  };
  return {
    cache,
    loads,
    rows,
    load,
    tick: (ms: number) => (now += ms),
    now: () => now,
    done: () => cache.close(),
  };
}

/** A load the test finishes by hand (a read still in flight). */
function deferred() {
  let resolve: (v: CachedSession | null) => void = () => undefined;
  const promise = new Promise<CachedSession | null>((r) => (resolve = r));
  return { promise, resolve };
}

describe('SessionCache: how long a web process answers from its own copy of a session', () => {
  it('reads the store once per session and TTL, and again once the copy is TTL old', async () => {
    const t = setUp(1000);
    t.rows.set('a', row(7, t.now()));
    assert.equal((await t.cache.read('a', t.load('a')))?.account?.id, 7);
    t.tick(999);
    await t.cache.read('a', t.load('a'));
    assert.equal(t.loads.length, 1, 'a copy younger than the TTL is used');
    t.tick(1);
    await t.cache.read('a', t.load('a'));
    assert.equal(t.loads.length, 2, 'a copy TTL old is read again');
    t.done();
  });

  it('sees a change made elsewhere (row gone, account deactivated) at the latest TTL after its read', async () => {
    const t = setUp(1000);
    t.rows.set('a', row(7, t.now()));
    await t.cache.read('a', t.load('a'));
    t.rows.set('a', { ...row(7, t.now()), account: { ...row(7, t.now()).account!, status: 'deactivated' } });
    t.tick(1000);
    assert.equal((await t.cache.read('a', t.load('a')))?.account?.status, 'deactivated');
    t.rows.delete('a');
    t.tick(1000);
    assert.equal(await t.cache.read('a', t.load('a')), null);
    t.done();
  });

  it('forgets a session at once when this process saves or destroys it, and does not keep a read that was in flight', async () => {
    const t = setUp(1000);
    t.rows.set('a', row(7, t.now()));
    await t.cache.read('a', t.load('a'));
    t.cache.forget('a');
    t.rows.delete('a');
    assert.equal(await t.cache.read('a', t.load('a')), null, 'read again right after forget');
    // A read begun before the change may answer its own caller, but is not kept for the next.
    t.rows.set('b', row(8, t.now()));
    const slow = deferred();
    const inFlight = t.cache.read('b', () => slow.promise);
    t.cache.forget('b');
    slow.resolve(row(8, t.now()));
    await inFlight;
    assert.equal(t.cache.size, 0, 'the read from before the change was not kept');
    await t.cache.read('b', t.load('b'));
    assert.deepEqual(t.loads, ['a', 'a', 'b'], 'the first read, the one after forget, and b once (the in-flight one was not a load)');
    t.done();
  });

  it('forgets every session of an account in every cache of the process (password change, deactivation, role change)', async () => {
    const one = setUp(1000);
    const two = setUp(1000);
    one.rows.set('a', row(7, one.now()));
    one.rows.set('b', row(7, one.now()));
    one.rows.set('c', row(9, one.now()));
    two.rows.set('d', row(7, two.now()));
    for (const sid of ['a', 'b', 'c']) await one.cache.read(sid, one.load(sid));
    await two.cache.read('d', two.load('d'));
    // A read of account 7 in flight across the change is not kept either.
    const slow = deferred();
    const inFlight = one.cache.read('e', () => slow.promise);
    forgetCachedAccount(7);
    slow.resolve(row(7, one.now()));
    await inFlight;
    assert.equal(one.cache.size, 1, 'only the other account is left');
    assert.equal(two.cache.size, 0);
    await one.cache.read('c', one.load('c'));
    assert.deepEqual(one.loads, ['a', 'b', 'c'], 'the other account is still answered from its copy');
    one.done();
    two.done();
  });

  it('shares one read among requests arriving while it runs; a failed read is not kept', async () => {
    const t = setUp(1000);
    const slow = deferred();
    let calls = 0;
    const load = () => {
      calls++;
      return slow.promise;
    };
    const all = Promise.all(Array.from({ length: 50 }, () => t.cache.read('a', load)));
    slow.resolve(row(7, t.now()));
    assert.ok((await all).every((r) => r?.account?.id === 7));
    assert.equal(calls, 1);
    const failing = async (): Promise<CachedSession | null> => {
      throw new Error('connection lost');
    };
    await assert.rejects(t.cache.read('x', failing), /connection lost/);
    t.rows.set('x', row(9, t.now()));
    assert.equal((await t.cache.read('x', t.load('x')))?.account?.id, 9, 'the next request reads again');
    t.done();
  });

  it('reads again a session expiring within the TTL, and never keeps an unknown one', async () => {
    const t = setUp(1000);
    t.rows.set('a', row(7, t.now(), 1)); // expires in about 1 s
    await t.cache.read('a', t.load('a'));
    await t.cache.read('a', t.load('a'));
    assert.equal(t.loads.length, 2, 'a copy whose session may have been kept alive elsewhere is read again');
    await t.cache.read('nobody', t.load('nobody'));
    await t.cache.read('nobody', t.load('nobody'));
    assert.equal(t.loads.filter((s) => s === 'nobody').length, 2);
    t.done();
  });

  it('with a TTL of 0 reads the store on every request', async () => {
    const t = setUp(0);
    t.rows.set('a', row(7, t.now()));
    for (let i = 0; i < 3; i++) await t.cache.read('a', t.load('a'));
    assert.equal(t.loads.length, 3);
    assert.equal(t.cache.size, 0);
    t.done();
  });
});
