import assert from 'node:assert/strict';
import { randomBytes } from 'node:crypto';
import { after, before, describe, it } from 'node:test';
import { config } from '../../server/config';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { newWorkshop, sheetTokens } from './workshops-support';

// Its own file (its own process): once the limit is reached, every link request from this address waits.
describe('guessing participant links', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('good links never count and are never refused; failed guesses are capped per address', async () => {
    const { client } = await signedInClient(server);
    const { id } = await newWorkshop(client, [{ name: 'Lea Morcant' }, { name: 'Max Uribe' }]);
    const good = (await sheetTokens(client, id)).get('Lea Morcant')!;
    const anon = server.client();
    for (let i = 0; i < config.RATE_LIMIT_LINK_PER_15MIN + 5; i++) assert.equal((await anon.get(`/api/p/${good}`)).status, 200);
    const limit = config.RATE_LIMIT_LINK_PER_15MIN;
    for (let i = 0; i < limit; i++) {
      const guess = randomBytes(32).toString('base64url');
      assert.equal((await anon.get(`/api/p/${guess}`)).status, 404, `guess ${i}`);
    }
    const blocked = await anon.get(`/api/p/${randomBytes(32).toString('base64url')}`);
    assert.equal(blocked.status, 429);
    assert.match(blocked.body.error.message, /Too many links that do not work/);
    assert.equal((await anon.post(`/api/p/join/${randomBytes(32).toString('base64url')}/claim`, { participantId: 1 })).status, 429);
    // One office network shares an address: a participant with a good link is never locked out.
    assert.equal((await anon.get(`/api/p/${good}`)).status, 200, 'a good link still works past the limit');
    assert.equal((await anon.get(`/api/p/${randomBytes(32).toString('base64url')}`)).status, 429, 'guesses still wait');
  });
});
