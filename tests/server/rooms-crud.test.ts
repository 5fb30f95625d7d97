import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { signedInSuite } from '../support/test-server';
import { pool } from '../../server/db';
import { createPathRoom } from './rooms-helpers';

const fieldsOf = (body: { error: { details?: { fields?: { field: string }[] } } }) =>
  (body.error.details?.fields ?? []).map((f) => f.field);

describe('rooms: create, read, change, delete', () => {
  const suite = signedInSuite();

  it('creates a room with people and ties and reads it back in order', async () => {
    const room = await createPathRoom(suite.client, 5);
    const got = await suite.client.get(`/api/rooms/${room.id}`);
    assert.equal(got.status, 200);
    assert.equal(got.body.access, 'owner');
    assert.equal(got.body.version, 1);
    assert.deepEqual(
      got.body.people.map((p: { key: string }) => p.key),
      ['k0', 'k1', 'k2', 'k3', 'k4'],
    );
    assert.equal(got.body.ties.length, 4);
    assert.deepEqual(got.body.settings, { directed: false, minutesPerHop: 5, laziness: 0, mixing: 0 });
  });

  it('generates person ids when none are given', async () => {
    const reply = await suite.client.post('/api/rooms', { name: 'No keys', people: [{ name: 'A' }, { name: 'B', key: 'p1' }] });
    assert.equal(reply.status, 201);
    const keys = reply.body.people.map((p: { key: string }) => p.key);
    assert.equal(new Set(keys).size, 2);
    assert.ok(keys.includes('p1'));
  });

  it('refuses bad content with one field-level message each, and saves nothing', async () => {
    const before = await suite.client.get('/api/rooms?pageSize=500');
    const cases: [string, object, string][] = [
      [
        'duplicate people keys',
        {
          people: [
            { key: 'a', name: 'A' },
            { key: 'a', name: 'A2' },
          ],
        },
        'people.1.key',
      ],
      ['unknown person in a tie', { people: [{ key: 'a', name: 'A' }], ties: [{ source: 'a', target: 'zz' }] }, 'ties.0.target'],
      ['self-tie', { people: [{ key: 'a', name: 'A' }], ties: [{ source: 'a', target: 'a' }] }, 'ties.0'],
      [
        'duplicate tie (either direction in an undirected room)',
        {
          people: [
            { key: 'a', name: 'A' },
            { key: 'b', name: 'B' },
          ],
          ties: [
            { source: 'a', target: 'b' },
            { source: 'b', target: 'a' },
          ],
        },
        'ties.1',
      ],
      [
        'zero strength',
        {
          people: [
            { key: 'a', name: 'A' },
            { key: 'b', name: 'B' },
          ],
          ties: [{ source: 'a', target: 'b', strength: 0 }],
        },
        'ties.0.strength',
      ],
      [
        'negative strength',
        {
          people: [
            { key: 'a', name: 'A' },
            { key: 'b', name: 'B' },
          ],
          ties: [{ source: 'a', target: 'b', strength: -2 }],
        },
        'ties.0.strength',
      ],
      [
        'enormous strength',
        {
          people: [
            { key: 'a', name: 'A' },
            { key: 'b', name: 'B' },
          ],
          ties: [{ source: 'a', target: 'b', strength: 1e12 }],
        },
        'ties.0.strength',
      ],
      ['name too long', { people: [{ key: 'a', name: 'x'.repeat(121) }] }, 'people.0.name'],
      ['unknown field', { people: [{ key: 'a', name: 'A', salary: 3 }] }, 'salary'],
    ];
    for (const [what, body, field] of cases) {
      const reply = await suite.client.post('/api/rooms', { name: 'Bad', ...body });
      assert.equal(reply.status, 400, what);
      assert.ok(fieldsOf(reply.body).includes(field), `${what}: ${JSON.stringify(reply.body.error)}`);
    }
    const tooLong = await suite.client.post('/api/rooms', { name: 'r'.repeat(121) });
    assert.equal(tooLong.status, 400);
    assert.match(tooLong.body.error.message, /at most 120 characters/);
    const afterList = await suite.client.get('/api/rooms?pageSize=500');
    assert.equal(afterList.body.total, before.body.total);
  });

  it('changes name and settings with the version; a stale version gets 409 with what is stored', async () => {
    const room = await createPathRoom(suite.client, 3, 'Settings room');
    const ok = await suite.client.patch(`/api/rooms/${room.id}`, {
      version: 1,
      name: 'Renamed',
      settings: { minutesPerHop: 3, laziness: 0.2 },
    });
    assert.equal(ok.status, 200);
    assert.equal(ok.body.version, 2);
    assert.equal(ok.body.name, 'Renamed');
    assert.equal(ok.body.settings.laziness, 0.2);
    const stale = await suite.client.patch(`/api/rooms/${room.id}`, { version: 1, name: 'Mine' });
    assert.equal(stale.status, 409);
    assert.equal(stale.body.error.code, 'stale_version');
    assert.match(stale.body.error.message, /changed elsewhere: reload or keep yours/);
    assert.equal(stale.body.error.details.currentVersion, 2);
    assert.equal(stale.body.error.details.current.name, 'Renamed');
    // Keeping mine: re-send with the current version.
    const kept = await suite.client.patch(`/api/rooms/${room.id}`, { version: 2, name: 'Mine' });
    assert.equal(kept.status, 200);
    assert.equal(kept.body.name, 'Mine');
  });

  it('checks settings limits field by field', async () => {
    const room = await createPathRoom(suite.client, 2, 'Limits');
    const bad = await suite.client.patch(`/api/rooms/${room.id}`, {
      version: 1,
      settings: { laziness: 1, mixing: -0.1, minutesPerHop: 0 },
    });
    assert.equal(bad.status, 400);
    assert.deepEqual(fieldsOf(bad.body).sort(), ['settings.laziness', 'settings.minutesPerHop', 'settings.mixing']);
    const nothing = await suite.client.patch(`/api/rooms/${room.id}`, { version: 1 });
    assert.equal(nothing.status, 400);
  });

  it('refuses to make a room undirected while pairs are tied both ways', async () => {
    const reply = await suite.client.post('/api/rooms', {
      name: 'Both ways',
      settings: { directed: true },
      people: [
        { key: 'a', name: 'Ann' },
        { key: 'b', name: 'Ben' },
      ],
      ties: [
        { source: 'a', target: 'b' },
        { source: 'b', target: 'a' },
      ],
    });
    assert.equal(reply.status, 201);
    const flip = await suite.client.patch(`/api/rooms/${reply.body.id}`, { version: 1, settings: { directed: false } });
    assert.equal(flip.status, 409);
    assert.match(flip.body.error.message, /Ann - Ben/);
  });

  it('lists my rooms with search, sort and paging', async () => {
    await createPathRoom(suite.client, 2, 'Zebra crossing team');
    await createPathRoom(suite.client, 6, 'Aardvark office');
    const search = await suite.client.get('/api/rooms?q=zebra');
    assert.equal(search.body.total, 1);
    assert.equal(search.body.items[0].name, 'Zebra crossing team');
    assert.equal(search.body.items[0].people, 2);
    assert.equal(search.body.items[0].ties, 1);
    const byName = await suite.client.get('/api/rooms?sort=name&direction=asc&pageSize=2&page=0');
    assert.equal(byName.body.items[0].name, 'Aardvark office');
    assert.equal(byName.body.items.length, 2);
    const byPeople = await suite.client.get('/api/rooms?sort=people&direction=desc&pageSize=1');
    assert.equal(byPeople.body.items[0].people, 6);
    // Every page keeps the order across pages and the same total, also a page past the end.
    const all = await suite.client.get('/api/rooms?sort=name&direction=desc&pageSize=100');
    const names = all.body.items.map((r: { name: string }) => r.name);
    assert.equal(names.length, all.body.total);
    assert.equal(typeof all.body.items[0].description, 'string');
    const pages = await Promise.all(
      [...names.keys()].map((page) => suite.client.get(`/api/rooms?sort=name&direction=desc&pageSize=1&page=${page}`)),
    );
    assert.deepEqual(
      pages.map((p) => p.body.items[0]?.name),
      names,
    );
    for (const p of pages) assert.equal(p.body.total, all.body.total);
    const past = await suite.client.get(`/api/rooms?pageSize=1&page=${all.body.total}`);
    assert.deepEqual([past.body.items, past.body.total], [[], all.body.total]);
    const badSort = await suite.client.get('/api/rooms?sort=salary');
    assert.equal(badSort.status, 400);
    assert.match(badSort.body.error.message, /sort must be one of/);
  });

  it('duplicates a room with its content and layout', async () => {
    const room = await createPathRoom(suite.client, 4, 'Original');
    const copy = await suite.client.post(`/api/rooms/${room.id}/duplicate`, {});
    assert.equal(copy.status, 201);
    assert.equal(copy.body.name, 'Original (copy)');
    assert.equal(copy.body.people.length, 4);
    assert.equal(copy.body.ties.length, 3);
    assert.notEqual(copy.body.id, room.id);
  });

  it('deletes a room and everything in it', async () => {
    const room = await createPathRoom(suite.client, 4, 'To delete');
    const del = await suite.client.delete(`/api/rooms/${room.id}`);
    assert.equal(del.status, 204);
    assert.equal((await suite.client.get(`/api/rooms/${room.id}`)).status, 404);
    const [[p]] = (await pool.query('SELECT COUNT(*) AS n FROM people WHERE room_id = ?', [room.id])) as unknown as [[{ n: number }]];
    const [[t]] = (await pool.query('SELECT COUNT(*) AS n FROM ties WHERE room_id = ?', [room.id])) as unknown as [[{ n: number }]];
    assert.equal(Number(p.n), 0);
    assert.equal(Number(t.n), 0);
  });

  it('answers 404 for ids that are not numbers', async () => {
    assert.equal((await suite.client.get('/api/rooms/abc')).status, 404);
    assert.equal((await suite.client.get('/api/rooms/0')).status, 404);
    assert.equal((await suite.client.get('/api/rooms/99999999')).status, 404);
  });
});
