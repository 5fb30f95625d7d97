/**
 * The web import on the same probe files as the command line: ids stored exactly as written,
 * seeds that mean the same on the web and on the command line, and every refused file answered
 * 400 with the same one line (at most 300 characters), dry run or commit, with nothing stored.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { closePools } from '../../server/jobs/pools';
import { simulate } from '../../shared/engine/index';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { waitForJob } from './plans-support';
import { upload } from './rooms-helpers';

const IDS_JSON =
  '{"nodes":[{"id":12345678901234567891},{"id":12345678901234567892},{"id":1.0},{"id":1e3},{"id":"__proto__"},{"id":"constructor"}],' +
  '"links":[{"source":12345678901234567891,"target":12345678901234567892},{"source":12345678901234567892,"target":1.0},' +
  '{"source":1.0,"target":1e3},{"source":1e3,"target":"__proto__"},{"source":"__proto__","target":"constructor"}]}';
const IDS = ['12345678901234567891', '12345678901234567892', '1.0', '1e3', '__proto__', 'constructor'];

const nested = (depth: number) => '<graphml><graph>' + '<node id="a">'.repeat(depth) + '</node>'.repeat(depth) + '</graph></graphml>';

/** Probe files and the one line each must be refused with (the command line prints the same after the file name). */
const REFUSED: [string, string, string | RegExp][] = [
  [
    'tiny.csv',
    'source,target,strength\na,b,1\nb,c,1e-15\n',
    'ties line 3, strength: 1e-15 is 1.0e-15 times the strongest tie (1, line 2); below 1e-12 times, double precision cannot carry it: drop the weak tie or narrow the strengths',
  ],
  [
    'tiny.json',
    '{"nodes":[{"id":"a"},{"id":"b"},{"id":"c"}],"links":[{"source":"a","target":"b"},{"source":"b","target":"c","strength":1e-16}]}',
    /^json links\[1\], strength: 1e-16 is 1\.0e-16 times the strongest tie \(1, links\[0\]\)/,
  ],
  [
    'subnormal.graphml',
    '<graphml><key id="w" for="edge" attr.name="weight"/><graph><node id="a"/><node id="b"/><edge source="a" target="b"><data key="w">1e-320</data></edge></graph></graphml>',
    'graphml <edge> #1, weight: 1e-320 is too small to compute with (the least strength accepted is 1e-100); rescale the strengths',
  ],
  [
    'deep100.graphml',
    nested(100),
    'graphml line 1: not accepted: elements nested more than 64 levels deep; GraphML needs only a few (column 823, byte 823)',
  ],
  [
    'deep1m.graphml',
    '<graphml><graph>' + '<g>'.repeat(1_000_000) + '</g>'.repeat(1_000_000) + '</graph></graphml>',
    'graphml line 1: not accepted: elements nested more than 64 levels deep; GraphML needs only a few (column 203, byte 203)',
  ],
  [
    'unclosed.graphml',
    `<graphml>\n<graph>\n<node id="a"><data key="${'k'.repeat(20_000)}">\n</graph>\n`,
    'graphml line 4: not well-formed XML: </graph> does not match <data> opened at line 3, column 14 (column 1, byte 20046)',
  ],
  [
    'deep.json',
    '['.repeat(1_000_000),
    'json line 1: not accepted: the JSON is nested more than 64 levels deep; a room file needs only a few levels (column 65, byte 65)',
  ],
  [
    'deep-node.json',
    '{"nodes":[{"id":"a","extra":' + '{"k":'.repeat(1_000_000) + '0' + '}'.repeat(1_000_000) + '}],"links":[]}',
    'json line 1: not accepted: the JSON is nested more than 64 levels deep; a room file needs only a few levels (column 334, byte 334)',
  ],
  [
    'null.json',
    '{"nodes":[{"id":"a"},{"id":"b"}],"links":[{"source":"a","target":"b","strength":null}]}',
    'json links[0], strength: the strength is null; write a positive number, or leave the field out (a missing strength means 1)',
  ],
  [
    'empty-text.json',
    '{"nodes":[{"id":"a"},{"id":"b"}],"links":[{"source":"a","target":"b","weight":""}]}',
    'json links[0], weight: the strength is empty text (""); write a positive number, or leave the field out (a missing strength means 1)',
  ],
  [
    'second-line.csv',
    'source,target,strength\na,b,-1\n' + Array.from({ length: 100_000 }, (_, i) => `p${i},q${i},1\n`).join(''),
    // 200,000 people are also more than a web room holds: the one line counts that second problem
    'ties line 2, strength: -1 is not positive; a tie needs a strength above 0 (leave the tie out if there is none) (and 1 more problem)',
  ],
  [
    'open-quote.csv',
    'source,target\na,"b\n' + 'c,d\n'.repeat(10),
    'ties line 2: a quoted cell starts here but its closing quote (") is missing',
  ],
];

describe('rooms: import of probe files', () => {
  let server: TestServer;
  let client: TestClient;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  const total = async () => (await client.get('/api/rooms')).body.total as number;

  for (const [name, content, expected] of REFUSED) {
    it(`${name}: 400 with the one line, dry run and commit, nothing stored`, async () => {
      const before = await total();
      for (const dryRun of ['true', 'false']) {
        const reply = await upload(client, `/api/rooms/import?dryRun=${dryRun}`, { file: { name, content } });
        assert.equal(reply.status, 400, reply.text.slice(0, 300));
        assert.equal(reply.body.error.code, 'import_errors');
        const line = reply.body.error.message as string;
        assert.ok(line.length <= 300 && !line.includes('\n'), line);
        if (typeof expected === 'string') assert.equal(line, expected);
        else assert.match(line, expected);
        assert.equal(reply.body.error.details.report.committed, false);
      }
      assert.equal(await total(), before);
    });
  }

  it('an empty CSV strength is read as 1 with a warning, the same rule as the command line', async () => {
    const reply = await upload(client, '/api/rooms/import?dryRun=true', {
      file: { name: 'empty.csv', content: 'source,target,strength\na,b,\nb,c,2\n' },
    });
    assert.equal(reply.status, 200, reply.text);
    assert.deepEqual(
      reply.body.warnings.map((w: { code: string; line: number }) => [w.code, w.line]),
      [['empty-strength', 2]],
    );
  });

  it('ids are stored and exported exactly as written: beyond 2^53, 1.0, 1e3, __proto__, constructor', async () => {
    const done = await upload(client, '/api/rooms/import?dryRun=false', { file: { name: 'ids.json', content: IDS_JSON } }, { name: 'Ids' });
    assert.equal(done.status, 201, done.text);
    const room = (await client.get(`/api/rooms/${done.body.roomId}`)).body;
    assert.deepEqual(
      room.people.map((p: { key: string }) => p.key),
      IDS,
    );
    const exported = await client.get(`/api/rooms/${done.body.roomId}/export?format=json`);
    assert.equal(exported.status, 200);
    const doc = JSON.parse(exported.text) as { nodes: { id: string }[] };
    assert.deepEqual(
      doc.nodes.map((n) => n.id),
      IDS,
    );
    const csv = await upload(client, '/api/rooms/import?dryRun=false', {
      file: { name: 't.csv', content: 'source,target\n" lead","a,b"\n"a,b",__proto__\n' },
    });
    assert.equal(csv.status, 201, csv.text);
    const people = (await client.get(`/api/rooms/${csv.body.roomId}`)).body.people.map((p: { key: string }) => p.key);
    assert.deepEqual(people, [' lead', 'a,b', '__proto__']);
  });

  it('a rehearsal seed is text on the web as on the command line: 07 is kept, reproduces, and is not 7', async () => {
    const content = 'source,target\na,b\nb,c\nc,d\nd,e\ne,a\nb,d\n';
    const made = await upload(client, '/api/rooms/import?dryRun=false', { file: { name: 'ring.csv', content } }, { name: 'Seeds' });
    const room = (await client.get(`/api/rooms/${made.body.roomId}`)).body;
    const a = room.people.find((p: { key: string }) => p.key === 'a');
    const planId = (await client.post(`/api/rooms/${room.id}/plans`, { starters: [a.id] })).body.id;
    const means = async (seed: string) => {
      const start = await client.post(`/api/plans/${planId}/rehearsals`, { runs: 500, seed });
      assert.equal(start.status, 202, start.text);
      await waitForJob(client, start.body.job.id);
      const d = (await client.get(`/api/rehearsals/${start.body.rehearsal.id}`)).body;
      assert.equal(d.seed, seed);
      return d.people.map((p: { mean: number }) => p.mean) as number[];
    };
    const zeroSeven = await means('07');
    const graph = {
      ids: ['a', 'b', 'c', 'd', 'e'],
      directed: false,
      ties: (
        [
          [0, 1],
          [1, 2],
          [2, 3],
          [3, 4],
          [4, 0],
          [1, 3],
        ] as const
      ).map(([source, target]) => ({ source, target, strength: 1 })),
    };
    // What the command line's `simulate --seed 07` runs: the engine with the seed text "07".
    assert.deepEqual(zeroSeven, Array.from(simulate(graph, [0], 500, '07').mean));
    assert.notDeepEqual(await means('7'), zeroSeven);
  });
});
