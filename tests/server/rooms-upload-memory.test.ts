import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';

// Own process: a small memory cap for the upload threads, so a file within the upload size meets it.
process.env['IMPORT_WORKER_MB'] = '40';
process.env['MAX_ROOM_PEOPLE'] = '2000000';
const { signedInClient, startTestServer } = await import('../support/test-server');
const { upload } = await import('./rooms-helpers');
type TestServer = Awaited<ReturnType<typeof startTestServer>>;

describe('the memory cap of the upload threads', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('a file that needs more memory than the cap answers 400 naming the cap, and the next upload works', async () => {
    const { client } = await signedInClient(server);
    // About 6 MB of node-link JSON: 350,000 tiny nodes.
    const nodes = Array.from({ length: 350_000 }, (_, i) => `{"id":"n${i}"}`).join(',');
    const big = await upload(client, '/api/rooms/import?dryRun=true', {
      file: { name: 'big.json', content: `{"nodes":[${nodes}],"links":[]}` },
    });
    assert.equal(big.status, 400, big.text.slice(0, 300));
    assert.equal(big.body.error.code, 'too_big_to_read');
    assert.match(big.body.error.message, /more than 40 MB of memory/);
    const small = await upload(client, '/api/rooms/import?dryRun=true', { file: { name: 't.csv', content: 'source,target\na,b\n' } });
    assert.equal(small.status, 200, small.text);
  });
});
