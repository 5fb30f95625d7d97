import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { signedInSuite } from '../support/test-server';
import { createPathRoom, personOf, tieOf } from './rooms-helpers';

describe('rooms: batch edits and tables', () => {
  const suite = signedInSuite();

  it('applies adds, ties by tempId, updates and moves in one batch and bumps the version', async () => {
    const room = await createPathRoom(suite.client, 3);
    const [a, b, c] = [personOf(room, 0), personOf(room, 1), personOf(room, 2)];
    const reply = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      version: 1,
      ops: [
        { op: 'addPerson', tempId: 'n1', name: 'New one', group: 'Blue', x: 10, y: 20 },
        { op: 'addPerson', tempId: 'n2', name: 'New two', key: 'nx2' },
        { op: 'addTie', tempId: 't1', source: 'n1', target: a.id, strength: 2 },
        { op: 'addTie', source: 'n1', target: 'n2', strength: 0.5 },
        { op: 'updatePerson', id: b.id, name: 'Renamed B', email: 'b@example.org' },
        { op: 'updateTie', id: tieOf(room, 0).id, strength: 4 },
        {
          op: 'movePeople',
          moves: [
            { id: c.id, x: 5, y: 6, pinned: true },
            { id: 'n2', x: 1, y: 1 },
          ],
        },
      ],
    });
    assert.equal(reply.status, 200, reply.text);
    assert.equal(reply.body.version, 2);
    assert.equal(reply.body.layoutOnly, false);
    const got = (await suite.client.get(`/api/rooms/${room.id}`)).body;
    assert.equal(got.people.length, 5);
    const n1 = got.people.find((p: { id: number }) => p.id === reply.body.people.n1);
    assert.equal(n1.name, 'New one');
    assert.equal(n1.group, 'Blue');
    assert.equal(got.people[4].key, 'nx2', 'new people go to the end of the stable order');
    assert.ok(got.ties.some((t: { id: number; strength: number }) => t.id === reply.body.ties.t1 && t.strength === 2));
    assert.equal(got.ties.find((t: { id: number }) => t.id === tieOf(room, 0).id).strength, 4);
    const movedC = got.people.find((p: { id: number }) => p.id === c.id);
    assert.deepEqual([movedC.x, movedC.y, movedC.pinned], [5, 6, true]);
    assert.equal(got.people.find((p: { id: number }) => p.id === b.id).email, 'b@example.org');
  });

  it('is atomic: one bad op leaves the room exactly as it was', async () => {
    const room = await createPathRoom(suite.client, 3);
    const before = (await suite.client.get(`/api/rooms/${room.id}`)).body;
    const reply = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      version: 1,
      ops: [
        { op: 'addPerson', tempId: 'n1', name: 'Would be added' },
        { op: 'deleteTie', id: tieOf(room, 0).id },
        { op: 'addTie', source: 'n1', target: 999999, strength: 1 },
      ],
    });
    assert.equal(reply.status, 400);
    assert.deepEqual(
      reply.body.error.details.fields.map((f: { field: string }) => f.field),
      ['ops.2.target'],
    );
    assert.match(reply.body.error.message, /nothing was saved/);
    const afterRoom = (await suite.client.get(`/api/rooms/${room.id}`)).body;
    assert.deepEqual(afterRoom, before);
  });

  it('names every bad op: self-tie, duplicate tie, bad strength, unknown tie, deleted person, duplicate key', async () => {
    const room = await createPathRoom(suite.client, 3);
    const [a, b, c] = [personOf(room, 0), personOf(room, 1), personOf(room, 2)];
    const reply = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      version: 1,
      ops: [
        { op: 'addTie', source: a.id, target: a.id, strength: 1 },
        { op: 'addTie', source: b.id, target: a.id, strength: 1 },
        { op: 'deletePerson', id: c.id },
        { op: 'addTie', source: a.id, target: c.id, strength: 1 },
        { op: 'updateTie', id: 123456789, strength: 2 },
        { op: 'addPerson', tempId: 'x', name: 'X', key: 'k0' },
      ],
    });
    assert.equal(reply.status, 400);
    const fields = reply.body.error.details.fields.map((f: { field: string }) => f.field);
    assert.deepEqual(fields, ['ops.0.target', 'ops.1', 'ops.3.target', 'ops.4.id', 'ops.5.key']);
    const strength = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      version: 1,
      ops: [{ op: 'updateTie', id: tieOf(room, 0).id, strength: 0 }],
    });
    assert.equal(strength.status, 400);
    assert.equal(strength.body.error.details.fields[0].field, 'ops.0.strength');
    // The room editor shows these very words under its fields (shared/api/room-rules.ts).
    assert.equal(strength.body.error.details.fields[0].message, 'A tie needs a strength above 0 (delete the tie if there is none).');
    const mail = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      version: 1,
      ops: [{ op: 'updatePerson', id: personOf(room, 0).id, email: 'ana@' }],
    });
    assert.deepEqual(mail.body.error.details.fields, [
      { field: 'ops.0.email', message: 'This does not look like an e-mail address (name@example.org); leave it empty if there is none.' },
    ]);
    const unknownOp = await suite.client.post(`/api/rooms/${room.id}/edits`, { version: 1, ops: [{ op: 'explode' }] });
    assert.equal(unknownOp.status, 400);
    assert.match(unknownOp.body.error.message, /addPerson, updatePerson/);
  });

  it('deleting a person deletes their ties', async () => {
    const room = await createPathRoom(suite.client, 3);
    const reply = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      version: 1,
      ops: [{ op: 'deletePerson', id: personOf(room, 1).id }],
    });
    assert.equal(reply.status, 200);
    const got = (await suite.client.get(`/api/rooms/${room.id}`)).body;
    assert.equal(got.people.length, 2);
    assert.equal(got.ties.length, 0);
  });

  it('layout moves need no version and bump none; content edits need the current one', async () => {
    const room = await createPathRoom(suite.client, 3);
    const move = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      ops: [{ op: 'movePeople', moves: room.people.map((p, i) => ({ id: p.id, x: i * 10, y: 0 })) }],
    });
    assert.equal(move.status, 200);
    assert.equal(move.body.layoutOnly, true);
    assert.equal(move.body.version, 1);
    // A colleague's drag did not make my version-1 edit stale.
    const edit = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      version: 1,
      ops: [{ op: 'updateTie', id: tieOf(room, 0).id, strength: 3 }],
    });
    assert.equal(edit.status, 200);
    assert.equal(edit.body.version, 2);
    const stale = await suite.client.post(`/api/rooms/${room.id}/edits`, { version: 1, ops: [{ op: 'deleteTie', id: tieOf(room, 0).id }] });
    assert.equal(stale.status, 409);
    assert.equal(stale.body.error.details.currentVersion, 2);
    const noVersion = await suite.client.post(`/api/rooms/${room.id}/edits`, { ops: [{ op: 'deleteTie', id: tieOf(room, 0).id }] });
    assert.equal(noVersion.status, 400);
    assert.equal(noVersion.body.error.details.fields[0].field, 'version');
    const badMove = await suite.client.post(`/api/rooms/${room.id}/edits`, {
      ops: [{ op: 'movePeople', moves: [{ id: personOf(room, 0).id, x: Infinity, y: 0 }] }],
    });
    assert.equal(badMove.status, 400);
  });

  it('serves people and ties pages with sorting and filtering', async () => {
    const reply = await suite.client.post('/api/rooms', {
      name: 'Table room',
      people: [
        { key: 'a', name: 'Olga North', group: 'Red', email: 'olga@example.org' },
        { key: 'b', name: 'Pim West', group: 'Blue' },
        { key: 'c', name: 'Ann East', group: 'Red' },
        { key: 'd', name: 'Bo South' },
      ],
      ties: [
        { source: 'a', target: 'b', strength: 2 },
        { source: 'b', target: 'c', strength: 5 },
        { source: 'c', target: 'd', strength: 1 },
      ],
    });
    const id = reply.body.id;
    const byName = await suite.client.get(`/api/rooms/${id}/people?sort=name&direction=asc&pageSize=2`);
    assert.equal(byName.body.total, 4);
    assert.deepEqual(
      byName.body.items.map((p: { name: string }) => p.name),
      ['Ann East', 'Bo South'],
    );
    const page2 = await suite.client.get(`/api/rooms/${id}/people?sort=name&pageSize=2&page=1`);
    assert.deepEqual(
      page2.body.items.map((p: { name: string }) => p.name),
      ['Olga North', 'Pim West'],
    );
    const red = await suite.client.get(`/api/rooms/${id}/people?group=Red`);
    assert.equal(red.body.total, 2);
    const none = await suite.client.get(`/api/rooms/${id}/people?group=`);
    assert.equal(none.body.total, 1);
    const search = await suite.client.get(`/api/rooms/${id}/people?q=olga%40`);
    assert.equal(search.body.total, 1);
    const wildcard = await suite.client.get(`/api/rooms/${id}/people?q=%25`);
    assert.equal(wildcard.body.total, 0, 'a % in the filter is a character, not a wildcard');
    const strongest = await suite.client.get(`/api/rooms/${id}/ties?sort=strength&direction=desc&pageSize=1`);
    assert.equal(strongest.body.items[0].strength, 5);
    assert.equal(strongest.body.items[0].sourceName, 'Pim West');
    assert.equal(strongest.body.total, 3);
    const touching = await suite.client.get(`/api/rooms/${id}/ties?personId=${reply.body.people[2].id}`);
    assert.equal(touching.body.total, 2);
    const q = await suite.client.get(`/api/rooms/${id}/ties?q=south`);
    assert.equal(q.body.total, 1);
    const badPage = await suite.client.get(`/api/rooms/${id}/people?pageSize=100000`);
    assert.equal(badPage.status, 400);
    assert.match(badPage.body.error.message, /pageSize/);
  });
});
