import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';

import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { upload } from './rooms-helpers';

/** Hostile uploads are read in capped worker threads: 400 naming the limit, and the server stays responsive. */
describe('hostile and large uploads', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  const deepJson = (levels: number) => '['.repeat(levels) + ']'.repeat(levels);
  const deepGraphml = (levels: number) =>
    '<?xml version="1.0"?><graphml><graph edgedefault="undirected">' + '<n>'.repeat(levels) + '</n>'.repeat(levels) + '</graph></graphml>';

  it('JSON nested 3 million levels and GraphML nested 1 million levels answer 400 naming the depth limit', async () => {
    const { client } = await signedInClient(server);
    const json = await upload(client, '/api/rooms/import?dryRun=true', { file: { name: 'deep.json', content: deepJson(3_000_000) } });
    assert.equal(json.status, 400, json.text.slice(0, 300));
    assert.equal(json.body.error.code, 'import_errors');
    assert.match(json.body.error.message, /nested more than 64 levels deep/);
    const xml = await upload(client, '/api/rooms/import?dryRun=true', { file: { name: 'deep.graphml', content: deepGraphml(1_000_000) } });
    assert.equal(xml.status, 400);
    assert.match(xml.body.error.message, /nested more than 64 levels deep/);
  });

  it('the health probe answers while four hostile uploads are read', async () => {
    const { client } = await signedInClient(server);
    const hostile = Array.from({ length: 4 }, () =>
      upload(client, '/api/rooms/import?dryRun=true', { file: { name: 'deep.json', content: deepJson(2_000_000) } }),
    );
    const health = await server.client().get('/api/health');
    assert.equal(health.status, 200);
    for (const reply of await Promise.all(hostile)) assert.ok([400, 429, 503].includes(reply.status), String(reply.status));
  });

  it('imports a room of 100,000 people from CSV, stored in batches', async () => {
    const { client } = await signedInClient(server);
    const n = 100_000;
    const people = ['id,name'];
    const ties = ['source,target'];
    for (let i = 0; i < n; i++) {
      people.push(`p${i},Person ${i}`);
      if (i > 0) ties.push(`p${i - 1},p${i}`);
    }
    const reply = await upload(
      client,
      '/api/rooms/import?dryRun=false',
      { file: { name: 'ties.csv', content: ties.join('\n') }, people: { name: 'people.csv', content: people.join('\n') } },
      { name: 'Large example room' },
    );
    assert.equal(reply.status, 201, reply.text.slice(0, 300));
    assert.equal(reply.body.counts.people, n);
    const listed = await client.get(`/api/rooms/${reply.body.roomId}/people?pageSize=1&page=99999`);
    assert.equal(listed.body.total, n);
    assert.equal(listed.body.items[0].key, 'p99999', 'stored in file order');
  });
});
