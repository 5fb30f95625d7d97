import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { signedInSuite } from '../support/test-server';
import { createPathRoom, personOf } from './rooms-helpers';

describe('rooms: summary', () => {
  const suite = signedInSuite();

  const summary = async (id: number) => {
    const reply = await suite.client.get(`/api/rooms/${id}/summary`);
    assert.equal(reply.status, 200, reply.text);
    return reply.body;
  };

  it('a path of five: the middle person is the best single starter, room average 3.5', async () => {
    // Walk on a path absorbed at the centre: h(1) = 1 + h(2)/2, h(2) = 1 + h(1), so h(1) = 3, h(2) = 4
    // (the gambler's-ruin recurrence with a reflecting end, solved by hand; Lovász 1993, "Random walks
    // on graphs: a survey", gives the same path hitting times). Average over four people: 3.5.
    const room = await createPathRoom(suite.client, 5);
    const s = await summary(room.id);
    assert.equal(s.people, 5);
    assert.equal(s.ties, 4);
    assert.equal(s.connectedParts, 1);
    assert.equal(s.density, 4 / 10);
    assert.equal(s.minStarters, 1);
    assert.equal(s.hint.starter.id, personOf(room, 2).id);
    assert.ok(Math.abs(s.hint.average - 3.5) < 1e-9, String(s.hint.average));
    assert.ok(Math.abs(s.hint.minutes - 17.5) < 1e-9, 'minutes per hop 5');
    assert.match(s.hint.message, /not what they are worth/);
  });

  it('names isolated people and separate parts, and gives no single-starter hint', async () => {
    const reply = await suite.client.post('/api/rooms', {
      name: 'Split room',
      people: ['a', 'b', 'c', 'd', 'e'].map((k) => ({ key: k, name: `Person ${k.toUpperCase()}` })),
      ties: [
        { source: 'a', target: 'b' },
        { source: 'c', target: 'd' },
      ],
    });
    const s = await summary(reply.body.id);
    assert.equal(s.connectedParts, 3);
    assert.deepEqual(
      s.isolated.map((p: { name: string }) => p.name),
      ['Person E'],
    );
    assert.equal(s.minStarters, 3);
    assert.equal(s.hint, null);
    assert.equal(s.problems.length, 2);
    assert.ok(
      s.problems.every((p: { kind: string; message: string }) => p.kind === 'separate-part' && /no tie to the rest/.test(p.message)),
    );
    assert.ok(s.notes.some((n: string) => /at least 3 people/.test(n)));
  });

  it('directed: a group that asks only itself (cannot enter) and people nobody asks (cannot leave)', async () => {
    // x -> y -> z -> y: {y, z} only ask each other; nobody asks x.
    const reply = await suite.client.post('/api/rooms', {
      name: 'Directed room',
      settings: { directed: true },
      people: [
        { key: 'x', name: 'Xavi' },
        { key: 'y', name: 'Yara' },
        { key: 'z', name: 'Zeno' },
      ],
      ties: [
        { source: 'x', target: 'y' },
        { source: 'y', target: 'z' },
        { source: 'z', target: 'y' },
      ],
    });
    const s = await summary(reply.body.id);
    assert.equal(s.minStarters, 1);
    assert.equal(s.density, 3 / 6);
    const leave = s.problems.find((p: { kind: string }) => p.kind === 'cannot-leave');
    assert.deepEqual(
      leave.people.map((p: { name: string }) => p.name),
      ['Xavi'],
    );
    assert.ok(['Yara', 'Zeno'].includes(s.hint.starter.name), 'the best starter is in the group everyone ends up asking');
    const two = await suite.client.post('/api/rooms', {
      name: 'Two closed groups',
      settings: { directed: true },
      people: ['a', 'b', 'c', 'd'].map((k) => ({ key: k, name: k })),
      ties: [
        { source: 'a', target: 'b' },
        { source: 'b', target: 'a' },
        { source: 'c', target: 'd' },
        { source: 'd', target: 'c' },
      ],
    });
    const t = await summary(two.body.id);
    assert.equal(t.minStarters, 2);
    assert.equal(t.problems.filter((p: { kind: string }) => p.kind === 'cannot-enter').length, 2);
  });

  it('background mixing joins the parts and a hint is given', async () => {
    const reply = await suite.client.post('/api/rooms', {
      name: 'Mixing room',
      settings: { mixing: 0.1 },
      people: ['a', 'b', 'c', 'd'].map((k) => ({ key: k, name: k })),
      ties: [
        { source: 'a', target: 'b' },
        { source: 'c', target: 'd' },
      ],
    });
    const s = await summary(reply.body.id);
    assert.equal(s.minStarters, 1);
    assert.ok(s.hint && Number.isFinite(s.hint.average));
    assert.ok(s.notes.some((n: string) => /Background mixing/.test(n)));
  });

  it('an empty room and a room without ties say what to add', async () => {
    const empty = await suite.client.post('/api/rooms', { name: 'Empty' });
    const s = await summary(empty.body.id);
    assert.equal(s.people, 0);
    assert.match(s.notes[0], /empty/);
    const lonely = await suite.client.post('/api/rooms', { name: 'No ties', people: [{ name: 'A' }, { name: 'B' }] });
    const t = await summary(lonely.body.id);
    assert.equal(t.hint, null);
    assert.equal(t.isolated.length, 2);
  });

  it('a room of 3,000 people is summarised quickly (work capped by lazy greedy)', async () => {
    const n = 3000;
    const people = Array.from({ length: n }, (_, i) => ({ key: `p${i}`, name: `Person ${i}` }));
    const ties = people.map((p, i) => ({ source: p.key, target: `p${(i + 1) % n}`, strength: 1 + (i % 3) }));
    for (let i = 0; i < n; i += 7) ties.push({ source: `p${i}`, target: `p${(i * 13 + 500) % n}`, strength: 1 });
    const seen = new Set<string>();
    const unique = ties.filter((t) => {
      const k = [t.source, t.target].sort().join('|');
      if (t.source === t.target || seen.has(k)) return false;
      seen.add(k);
      return true;
    });
    const made = await suite.client.post('/api/rooms', { name: 'Big room', people, ties: unique });
    assert.equal(made.status, 201, made.text.slice(0, 300));
    const started = performance.now();
    const s = await summary(made.body.id);
    const ms = performance.now() - started;
    assert.equal(s.people, n);
    assert.ok(s.hint, JSON.stringify(s.notes));
    console.log(`# summary of ${n} people, ${unique.length} ties: ${ms.toFixed(0)} ms`);
  });
});
