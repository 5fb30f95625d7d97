import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { signedInSuite } from '../support/test-server';
import { createPathRoom, upload } from './rooms-helpers';

const PEOPLE = 'id,name,group\na,Ann Arbor,Red\nb,Ben Birch,Red\nc,Cai Cole,Blue\n';
const TIES = 'source,target,strength\na,b,2\nb,c,1\n';

describe('rooms: import', () => {
  const suite = signedInSuite();

  const dry = (files: Parameters<typeof upload>[2], fields: Record<string, string> = {}) =>
    upload(suite.client, '/api/rooms/import?dryRun=true', files, fields);
  const firstError = async (files: Parameters<typeof upload>[2]) => {
    const reply = await dry(files);
    assert.equal(reply.status, 400, reply.text);
    assert.equal(reply.body.error.code, 'import_errors');
    const errors = reply.body.error.details.report.errors;
    assert.ok(errors.length > 0, `expected errors: ${reply.text}`);
    return errors[0] as { code: string; line?: number; field?: string; message: string; file?: string };
  };

  it('dry run reports counts and warnings, saves nothing; commit creates the room', async () => {
    const before = (await suite.client.get('/api/rooms')).body.total;
    const report = await dry({ file: { name: 'ties.csv', content: TIES }, people: { name: 'people.csv', content: PEOPLE } });
    assert.equal(report.status, 200);
    assert.deepEqual(report.body.counts, { people: 3, ties: 2, groups: 2 });
    assert.equal(report.body.committed, false);
    assert.deepEqual(report.body.errors, []);
    assert.equal((await suite.client.get('/api/rooms')).body.total, before);
    const done = await upload(
      suite.client,
      '/api/rooms/import?dryRun=false',
      { file: { name: 'ties.csv', content: TIES }, people: { name: 'people.csv', content: PEOPLE } },
      { name: 'Roster room' },
    );
    assert.equal(done.status, 201, done.text);
    assert.equal(done.body.committed, true);
    const room = (await suite.client.get(`/api/rooms/${done.body.roomId}`)).body;
    assert.equal(room.name, 'Roster room');
    assert.deepEqual(
      room.people.map((p: { key: string; name: string; group: string }) => [p.key, p.name, p.group]),
      [
        ['a', 'Ann Arbor', 'Red'],
        ['b', 'Ben Birch', 'Red'],
        ['c', 'Cai Cole', 'Blue'],
      ],
    );
    assert.equal(room.ties.length, 2);
  });

  it('reads a byte-order mark and semicolons (with a warning) the way spreadsheets save them', async () => {
    const reply = await dry({ file: { name: 'ties.csv', content: '\uFEFFsource;target;strength\na;b;2,5\nb;c;1\n' } });
    assert.deepEqual(reply.body.errors, []);
    assert.equal(reply.body.counts.ties, 2);
    assert.ok(reply.body.warnings.some((w: { code: string }) => w.code === 'delimiter'));
  });

  it('names each bad CSV row with its line and field', async () => {
    const truncated = await firstError({ file: { name: 't.csv', content: 'source,target,strength\na,b,1\n"c,d,2\n' } });
    assert.equal(truncated.code, 'syntax');
    assert.equal(truncated.line, 3);
    const header = await firstError({ file: { name: 't.csv', content: 'from_person,to_person\na,b\n' } });
    assert.equal(header.code, 'missing-column');
    assert.match(header.message, /no source or target column/);
    // Header separated by semicolons, rows by commas: each row is one cell.
    const mixed = await firstError({ file: { name: 't.csv', content: 'source;target\na,b\n' } });
    assert.equal(mixed.code, 'missing-field');
    assert.equal(mixed.line, 2);
    const missingCell = await firstError({ file: { name: 't.csv', content: 'source,target\na\n' } });
    assert.equal(missingCell.code, 'missing-field');
    assert.equal(missingCell.line, 2);
    const unknown = await firstError({
      file: { name: 't.csv', content: 'source,target\na,zed\n' },
      people: { name: 'p.csv', content: 'id,name\na,Ann\n' },
    });
    assert.equal(unknown.code, 'unknown-id');
    assert.equal(unknown.field, 'target');
    for (const [value, pattern] of [
      ['0', /not positive/],
      ['-3', /not positive/],
      ['1e15', /too large/],
      ['lots', /not a number/],
    ] as const) {
      const e = await firstError({ file: { name: 't.csv', content: `source,target,strength\na,b,1\nb,c,${value}\n` } });
      assert.equal(e.code, 'bad-strength', value);
      assert.equal(e.line, 3);
      assert.match(e.message, pattern);
    }
    const dup = await firstError({
      file: { name: 't.csv', content: 'source,target\na,b\n' },
      people: { name: 'p.csv', content: 'id,name\na,Ann\nb,Ben\na,Ann again\n' },
    });
    assert.equal(dup.code, 'duplicate-person');
    assert.equal(dup.line, 4);
    assert.equal(dup.file, 'people');
    const self = await firstError({ file: { name: 't.csv', content: 'source,target\na,a\n' } });
    assert.equal(self.code, 'self-tie');
    const longName = await firstError({
      file: { name: 't.csv', content: 'source,target\na,b\n' },
      people: { name: 'p.csv', content: `id,name\na,${'n'.repeat(130)}\nb,B\n` },
    });
    assert.equal(longName.code, 'too-long');
  });

  it('refuses text that is not UTF-8, naming the line', async () => {
    const latin1 = Uint8Array.from([...Buffer.from('source,target\na,b\n'), ...[0x4a, 0xf6, 0x72, 0x67], ...Buffer.from(',a\n')]);
    const e = await firstError({ file: { name: 't.csv', content: latin1 } });
    assert.equal(e.code, 'encoding');
    assert.equal(e.line, 3);
    assert.match(e.message, /not valid UTF-8/);
  });

  it('rejects GraphML with a DTD or entities, and malformed XML', async () => {
    const bomb =
      '<?xml version="1.0"?><!DOCTYPE g [<!ENTITY a "aaaa"><!ENTITY b "&a;&a;&a;">]><graphml><graph><node id="&b;"/></graph></graphml>';
    const e = await firstError({ file: { name: 'x.graphml', content: bomb } });
    assert.equal(e.code, 'unsafe-markup');
    assert.match(e.message, /DOCTYPE/);
    const broken = await firstError({ file: { name: 'x.graphml', content: '<graphml><graph><node id="a"></graph></graphml>' } });
    assert.equal(broken.code, 'syntax');
  });

  it('reads node-link JSON and says where JSON is broken', async () => {
    const ok = await dry({
      file: {
        name: 'r.json',
        content: JSON.stringify({ directed: true, nodes: [{ id: 'a' }, { id: 'b' }], links: [{ source: 'a', target: 'b', weight: 2 }] }),
      },
    });
    assert.deepEqual(ok.body.errors, []);
    assert.equal(ok.body.directed, true);
    const bad = await firstError({ file: { name: 'r.json', content: '{\n "nodes": [\n {"id": "a"},\n ]\n}' } });
    assert.equal(bad.code, 'syntax');
    assert.equal(bad.line, 4);
  });

  it('answers 413 for a file over the limit and 415 for a type it does not read', async () => {
    const big = 'source,target\n' + 'a,b\n'.repeat(2_200_000);
    const tooBig = await dry({ file: { name: 'big.csv', content: big } });
    assert.equal(tooBig.status, 413);
    assert.match(tooBig.body.error.message, /larger than 8 MB/);
    const pdf = await dry({ file: { name: 'room.pdf', content: '%PDF-1.4' } });
    assert.equal(pdf.status, 415);
    assert.match(pdf.body.error.message, /\.csv.*\.graphml.*\.json/);
    const xlsx = await dry({ file: { name: 'room.csv', content: Uint8Array.from([0x50, 0x4b, 3, 4, 0, 0, 1]) } });
    assert.equal(xlsx.status, 415);
    assert.match(xlsx.body.error.message, /CSV UTF-8/);
    const cut = await suite.client.request('POST', '/api/rooms/import', undefined, {
      headers: { 'content-type': 'multipart/form-data; boundary=xyz' },
      raw: '--xyz\r\nContent-Disposition: form-data; name="file"; filename="t.csv"\r\n\r\nsource,target\na,b',
    });
    assert.equal(cut.status, 400);
    assert.match(cut.body.error.message, /incomplete or malformed/);
    const none = await upload(suite.client, '/api/rooms/import', {});
    assert.equal(none.status, 400);
    assert.match(none.body.error.message, /Choose a file/);
  });

  it('a commit with one bad row leaves the room unchanged (400, nothing saved)', async () => {
    const room = await createPathRoom(suite.client, 4, 'Keep me');
    const before = (await suite.client.get(`/api/rooms/${room.id}`)).body;
    const reply = await upload(
      suite.client,
      `/api/rooms/${room.id}/import?dryRun=false`,
      { file: { name: 't.csv', content: 'source,target,strength\nx,y,1\ny,z,2\nz,w,-1\n' } },
      { version: '1' },
    );
    assert.equal(reply.status, 400);
    assert.equal(reply.body.error.code, 'import_errors');
    assert.equal(reply.body.error.details.report.errors[0].line, 4);
    assert.match(reply.body.error.message, /^ties line 4, strength: -1 is not positive/);
    assert.deepEqual((await suite.client.get(`/api/rooms/${room.id}`)).body, before);
  });

  it("replaces a room's content with the version checked", async () => {
    const room = await createPathRoom(suite.client, 4, 'Replace me');
    const dryRun = await upload(suite.client, `/api/rooms/${room.id}/import`, {
      file: { name: 't.csv', content: TIES },
      people: { name: 'p.csv', content: PEOPLE },
    });
    assert.deepEqual(dryRun.body.replaces, { people: 4, ties: 3 });
    const noVersion = await upload(suite.client, `/api/rooms/${room.id}/import?dryRun=false`, { file: { name: 't.csv', content: TIES } });
    assert.equal(noVersion.status, 400);
    await suite.client.patch(`/api/rooms/${room.id}`, { version: 1, description: 'edited elsewhere' });
    const stale = await upload(
      suite.client,
      `/api/rooms/${room.id}/import?dryRun=false`,
      { file: { name: 't.csv', content: TIES } },
      { version: '1' },
    );
    assert.equal(stale.status, 409);
    const done = await upload(
      suite.client,
      `/api/rooms/${room.id}/import?dryRun=false`,
      { file: { name: 't.csv', content: TIES }, people: { name: 'p.csv', content: PEOPLE } },
      { version: '2' },
    );
    assert.equal(done.status, 200, done.text);
    assert.equal(done.body.version, 3);
    const got = (await suite.client.get(`/api/rooms/${room.id}`)).body;
    assert.equal(got.people.length, 3);
    assert.equal(got.ties.length, 2);
    assert.equal(got.description, 'edited elsewhere');
  });
});
