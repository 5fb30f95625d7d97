import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { signedInSuite } from '../support/test-server';
import { upload } from './rooms-helpers';

/** An invented company: a head, two leads, four staff; headers the way an HR export might name them. */
const CHART = [
  'Staff No,Full Name,Reports To,Dept',
  'e1,Oda Quill,,Board',
  'e2,Pim Larch,e1,Sales',
  'e3,Rue Tamsin,e1,Support',
  'e4,Sef Orrin,e2,Sales',
  'e5,Tal Vireo,e2,Sales',
  'e6,Ula Brisk,e2,Sales',
  'e7,Vik Sorrel,e3,Support',
  '',
].join('\r\n');

const COLUMNS = { personColumn: 'Staff No', managerColumn: 'Reports To', nameColumn: 'Full Name', departmentColumn: 'Dept' };

describe('rooms: import from an org chart', () => {
  const suite = signedInSuite();

  const dry = (content: string, fields: Record<string, string> = COLUMNS) =>
    upload(suite.client, '/api/rooms/import/org-chart?dryRun=true', { file: { name: 'chart.csv', content } }, fields);

  it('suggests columns from the header and previews the first rows', async () => {
    const reply = await dry(CHART, {});
    assert.equal(reply.status, 200, reply.text);
    assert.deepEqual(reply.body.preview.columns, ['Staff No', 'Full Name', 'Reports To', 'Dept']);
    assert.deepEqual(reply.body.preview.rows[0], ['e1', 'Oda Quill', '', 'Board']);
    assert.deepEqual(reply.body.columns, { person: 'Staff No', manager: 'Reports To', name: 'Full Name', department: 'Dept' });
    assert.deepEqual(reply.body.strengths, { reportsTo: 3, sameManager: 1 });
  });

  it('builds manager-report ties and ties among people sharing a manager, with the strengths given', async () => {
    const reply = await dry(CHART, { ...COLUMNS, reportsTo: '4', sameManager: '0.5' });
    assert.deepEqual(reply.body.errors, []);
    // 6 reporting lines; peers: {e2,e3} 1 pair, {e4,e5,e6} 3 pairs, {e7} none.
    assert.deepEqual(reply.body.counts, { people: 7, ties: 10, groups: 3 });
    const done = await upload(
      suite.client,
      '/api/rooms/import/org-chart?dryRun=false',
      { file: { name: 'chart.csv', content: CHART } },
      { ...COLUMNS, reportsTo: '4', sameManager: '0.5', roomName: 'Org chart room' },
    );
    assert.equal(done.status, 201, done.text);
    const room = (await suite.client.get(`/api/rooms/${done.body.roomId}`)).body;
    assert.equal(room.version, 1);
    const key = new Map<number, string>(room.people.map((p: { id: number; key: string }) => [p.id, p.key]));
    const ties = new Map<string, number>(
      room.ties.map((t: { sourceId: number; targetId: number; strength: number }) => [
        [key.get(t.sourceId), key.get(t.targetId)].sort().join('-'),
        t.strength,
      ]),
    );
    assert.equal(ties.get('e1-e2'), 4);
    assert.equal(ties.get('e4-e5'), 0.5);
    assert.equal(ties.get('e2-e3'), 0.5);
    assert.equal(ties.has('e4-e7'), false, 'different managers: no tie');
    assert.equal(room.people.find((p: { key: string }) => p.key === 'e4').group, 'Sales');
  });

  it('names each bad row: a reporting loop, an unknown manager, a person listed twice', async () => {
    const bad = [
      'id,name,manager',
      'a,Ann,', // line 2: the top
      'b,Bo,c', // line 3: loop b -> c -> d -> b
      'c,Cy,d',
      'd,Di,b',
      'e,Ed,zz', // line 6: unknown manager
      'a,Ann again,', // line 7: duplicate
      'f,Fay,f', // line 8: own manager
      '',
    ].join('\n');
    const reply = await dry(bad, { personColumn: 'id', managerColumn: 'manager', nameColumn: 'name' });
    assert.equal(reply.status, 200, reply.text);
    const errors = reply.body.errors as { code: string; line: number; message: string; field?: string }[];
    const byLine = (line: number) => errors.filter((e) => e.line === line);
    for (const line of [3, 4, 5]) {
      assert.equal(byLine(line)[0]?.code, 'reporting-cycle', `line ${line}: ${JSON.stringify(errors)}`);
      assert.match(byLine(line)[0]?.message ?? '', /"b" → "c" → "d" → "b"/);
    }
    assert.equal(byLine(6)[0]?.code, 'unknown-id');
    assert.match(byLine(6)[0]?.message ?? '', /manager "zz" of "e" is not a person/);
    assert.equal(byLine(7)[0]?.code, 'duplicate-person');
    assert.match(byLine(7)[0]?.message ?? '', /first on line 2/);
    assert.equal(byLine(8)[0]?.code, 'reporting-cycle');
    assert.equal(byLine(2).length, 0, 'the good row has no error');

    const refused = await upload(
      suite.client,
      '/api/rooms/import/org-chart?dryRun=false',
      { file: { name: 'bad.csv', content: bad } },
      {
        personColumn: 'id',
        managerColumn: 'manager',
      },
    );
    assert.equal(refused.status, 422);
    assert.equal(refused.body.error.details.errors.length, errors.length);
  });

  it('refuses a column that is not in the header, and a strength that is not a positive number', async () => {
    const missing = await dry(CHART, { personColumn: 'Staff No', managerColumn: 'Boss' });
    assert.equal(missing.body.errors[0].code, 'missing-column');
    assert.match(missing.body.errors[0].message, /no column "Boss"/);
    const weak = await dry(CHART, { ...COLUMNS, sameManager: '-1' });
    assert.equal(weak.status, 400, weak.text);
    assert.match(weak.body.error.message, /sameManager: A tie needs a strength above 0/);
    const word = await dry(CHART, { ...COLUMNS, reportsTo: 'often' });
    assert.equal(word.status, 400, word.text);
    assert.match(word.body.error.message, /reportsTo: Give a number/);
  });

  it('exports the same CSV back (headers, order, rows), and replaces a room content with a version', async () => {
    const made = await upload(
      suite.client,
      '/api/rooms/import/org-chart?dryRun=false',
      { file: { name: 'chart.csv', content: CHART } },
      COLUMNS,
    );
    assert.equal(made.status, 201, made.text);
    const exported = await suite.client.get(`/api/rooms/${made.body.roomId}/export?format=org-chart-csv`);
    assert.equal(exported.status, 200);
    assert.equal(exported.text.replace(/^\uFEFF/, ''), CHART);
    // The exported file imports again into the same room, replacing what is there.
    const room = (await suite.client.get(`/api/rooms/${made.body.roomId}`)).body;
    const again = await upload(
      suite.client,
      `/api/rooms/${room.id}/import/org-chart?dryRun=false`,
      { file: { name: 'back.csv', content: exported.text } },
      { ...COLUMNS, version: String(room.version) },
    );
    assert.equal(again.status, 200, again.text);
    assert.equal(again.body.version, room.version + 1);
    const stale = await upload(
      suite.client,
      `/api/rooms/${room.id}/import/org-chart?dryRun=false`,
      { file: { name: 'back.csv', content: exported.text } },
      { ...COLUMNS, version: String(room.version) },
    );
    assert.equal(stale.status, 409);
  });
});
