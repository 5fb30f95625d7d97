import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import Graph from 'graphology';
import { parse as graphologyParse } from 'graphology-graphml';
import { startTestServer, signedInClient, type TestServer } from '../support/test-server';
import type { TestClient } from '../support/http-client';
import { upload } from './rooms-helpers';
import { itemAt } from '../../shared/checked';

interface Dto {
  id: number;
  settings: { directed: boolean; minutesPerHop: number; laziness: number; mixing: number };
  people: { id: number; key: string; name: string; group: string | null; x: number | null; y: number | null; pinned: boolean }[];
  ties: { sourceId: number; targetId: number; strength: number }[];
}

/** The room as a comparable value: people in order, ties by person keys. */
function shape(room: Dto, layout = false) {
  const keyOf = new Map(room.people.map((p) => [p.id, p.key]));
  return {
    directed: room.settings.directed,
    people: room.people.map((p) => (layout ? [p.key, p.name, p.group, p.x, p.y, p.pinned] : [p.key, p.name, p.group])),
    ties: room.ties.map((t) => [keyOf.get(t.sourceId), keyOf.get(t.targetId), t.strength]).sort(),
  };
}

describe('rooms: export, and export then import gives back the same room', () => {
  let server: TestServer;
  let client: TestClient;
  let room: Dto;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
    const reply = await client.post('/api/rooms', {
      name: 'Ünïcode & "quotes" room',
      settings: { directed: true, minutesPerHop: 7, laziness: 0.1, mixing: 0.05 },
      people: [
        { key: 'a', name: '=HYPERLINK("http://x.invalid","click")', group: 'Red', x: 1.5, y: -2, pinned: true },
        { key: 'b 2', name: 'Zoë, "Bee" Ng', group: '+Blue', x: 30, y: 40 },
        { key: 'c', name: 'Line\nbreak', group: null },
        { key: '-d', name: '@mention', group: 'Red' },
      ],
      ties: [
        { source: 'a', target: 'b 2', strength: 2.5 },
        { source: 'b 2', target: 'a', strength: 1 },
        { source: 'c', target: '-d', strength: 0.125 },
        { source: '-d', target: 'a', strength: 1e6 },
      ],
    });
    assert.equal(reply.status, 201, reply.text);
    room = reply.body;
  });
  after(async () => server.stop());

  const download = (format: string) => client.get(`/api/rooms/${room.id}/export?format=${format}`);

  it('sends files with a sensible name and type', async () => {
    const json = await download('json');
    assert.equal(json.status, 200);
    assert.match(json.headers.get('content-disposition') ?? '', /attachment; filename="?unicode-quotes-room\.json"?/);
    const csv = await download('people-csv');
    assert.match(csv.headers.get('content-type') ?? '', /text\/csv/);
    assert.match(csv.headers.get('content-disposition') ?? '', /unicode-quotes-room-people\.csv/);
    assert.equal((await download('pdf')).status, 400);
  });

  it('protects CSV cells against formula injection (OWASP, "CSV Injection")', async () => {
    const res = await fetch(`${server.url}/api/rooms/${room.id}/export?format=people-csv`, { headers: { cookie: client.cookieHeader() } });
    const bytes = new Uint8Array(await res.arrayBuffer());
    assert.deepEqual([...bytes.subarray(0, 3)], [0xef, 0xbb, 0xbf], 'a byte-order mark so spreadsheets read UTF-8');
    const lines = new TextDecoder().decode(bytes).split('\r\n');
    assert.ok(
      lines.some((l) => l.startsWith(`a,"'=HYPERLINK(`)),
      lines.join('\n'),
    );
    assert.ok(
      lines.some((l) => l.startsWith(`'-d,'@mention,Red`)),
      lines.join('\n'),
    );
    assert.ok(
      !/(^|,)[=+@-]/.test(
        lines
          .slice(1)
          .join('\n')
          .replace(/"[^"]*"/g, ''),
      ),
      'no cell starts with a formula character',
    );
  });

  it('JSON: a new room from the file equals the original, layout and settings included', async () => {
    const file = (await download('json')).text;
    const made = await upload(client, '/api/rooms/import?dryRun=false', { file: { name: 'room.json', content: file } });
    assert.equal(made.status, 201, made.text);
    const copy: Dto = (await client.get(`/api/rooms/${made.body.roomId}`)).body;
    assert.deepEqual(shape(copy, true), shape(room, true));
    assert.deepEqual(copy.settings, room.settings);
  });

  it('GraphML: imported into the same room gives the same people and ties', async () => {
    const file = (await download('graphml')).text;
    const v = (await client.get(`/api/rooms/${room.id}`)).body.version;
    const back = await upload(
      client,
      `/api/rooms/${room.id}/import?dryRun=false`,
      { file: { name: 'room.graphml', content: file } },
      { version: String(v) },
    );
    assert.equal(back.status, 200, back.text);
    assert.deepEqual(back.body.warnings, []);
    const after: Dto = (await client.get(`/api/rooms/${room.id}`)).body;
    assert.deepEqual(shape(after), shape(room));
    room = after;
  });

  it('GraphML export is read by a general-purpose library with the same people and weights', async () => {
    // graphology-graphml (G. Plique, graphology, 2021): an independent GraphML reader.
    const g = graphologyParse(Graph, (await download('graphml')).text);
    assert.equal(g.order, 4);
    assert.equal(g.size, 4);
    assert.equal(g.type, 'directed');
    assert.equal(g.getNodeAttribute('b 2', 'label'), 'Zoë, "Bee" Ng');
    const weights = g.mapEdges((_e, attrs, s, t) => `${s}>${t}:${attrs['weight']}`).sort();
    assert.deepEqual(weights, ['-d>a:1000000', 'a>b 2:2.5', 'b 2>a:1', 'c>-d:0.125']);
  });

  it('CSV: people and ties files read back (direction given on import) give the same room', async () => {
    const people = (await download('people-csv')).text;
    const ties = (await download('ties-csv')).text;
    const made = await upload(
      client,
      '/api/rooms/import?dryRun=false',
      { file: { name: 'ties.csv', content: ties }, people: { name: 'people.csv', content: people } },
      { directed: 'true', name: 'From CSV' },
    );
    assert.equal(made.status, 201, made.text);
    const copy: Dto = (await client.get(`/api/rooms/${made.body.roomId}`)).body;
    assert.deepEqual(shape(copy), shape(room));
    assert.equal(
      itemAt(copy.people, 0, 'first person').name,
      '=HYPERLINK("http://x.invalid","click")',
      'the protecting quote is removed again',
    );
  });
});
