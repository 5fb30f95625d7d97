import { MOVES_PER_BATCH, Outbox } from './outbox';
import type { PersonFields } from './room-model';

const f = (name: string): PersonFields => ({ key: name, name, group: null, email: null, x: 1, y: 2, pinned: false });

describe('autosave outbox', () => {
  it('names people added in the same batch by tempId, and known people by server id', () => {
    const box = new Outbox();
    box.personIds.set('p7', 7);
    box.push([
      { op: 'addPerson', lid: 'n1', fields: f('Ana') },
      { op: 'addTie', lid: 'm2', source: 'n1', target: 'p7', strength: 2 },
      { op: 'move', moves: [{ lid: 'n1', x: 5, y: 6, pinned: false }] },
      {
        op: 'move',
        moves: [
          { lid: 'n1', x: 8, y: 9, pinned: true },
          { lid: 'p7', x: 0, y: 0, pinned: false },
        ],
      },
    ]);
    const batch = box.next()!;
    expect(batch.count).toBe(4);
    expect(batch.layoutOnly).toBeFalse();
    expect(batch.ops).toEqual([
      { op: 'addPerson', tempId: 'n1', ...f('Ana') },
      { op: 'addTie', tempId: 'm2', source: 'n1', target: 7, strength: 2 },
      // Consecutive moves are merged; the last position of each person wins.
      {
        op: 'movePeople',
        moves: [
          { id: 'n1', x: 8, y: 9, pinned: true },
          { id: 7, x: 0, y: 0, pinned: false },
        ],
      },
    ]);
    box.acknowledge(batch.count, { people: { n1: 31 }, ties: { m2: 90 } });
    expect(box.pending).toBe(0);
    expect(box.personIds.get('n1')).toBe(31);
  });

  it('starts a new batch when an op needs the server id of something added in this batch', () => {
    const box = new Outbox();
    box.push([
      { op: 'addPerson', lid: 'n1', fields: f('Ana') },
      { op: 'updatePerson', lid: 'n1', changes: { name: 'Ana L' } },
    ]);
    const first = box.next()!;
    expect(first.count).toBe(1);
    box.acknowledge(first.count, { people: { n1: 40 }, ties: {} });
    const second = box.next()!;
    expect(second.ops).toEqual([{ op: 'updatePerson', id: 40, name: 'Ana L' }]);
  });

  it('undo of a delete re-adds the person under the same local id and a new server id', () => {
    const box = new Outbox();
    box.personIds.set('p3', 3);
    box.push([{ op: 'deletePerson', lid: 'p3' }]);
    const del = box.next()!;
    expect(del.ops).toEqual([{ op: 'deletePerson', id: 3 }]);
    box.acknowledge(del.count, { people: {}, ties: {} });
    expect(box.personIds.has('p3')).toBeFalse();
    box.push([{ op: 'addPerson', lid: 'p3', fields: f('Cy') }]);
    const add = box.next()!;
    expect(add.ops[0]).toEqual({ op: 'addPerson', tempId: 'p3', ...f('Cy') });
    box.acknowledge(add.count, { people: { p3: 12 }, ties: {} });
    expect(box.personIds.get('p3')).toBe(12);
  });

  it('a batch of only moves is layout-only; nothing is left after discard', () => {
    const box = new Outbox();
    box.personIds.set('p1', 1);
    box.push([{ op: 'move', moves: [{ lid: 'p1', x: 1, y: 1, pinned: false }] }]);
    expect(box.next()!.layoutOnly).toBeTrue();
    box.discard();
    expect(box.next()).toBeNull();
  });

  it('starts again from a room read from the server: nothing queued, its ids known', () => {
    const box = new Outbox();
    box.personIds.set('n5', 50);
    box.push([{ op: 'deletePerson', lid: 'n5' }]);
    box.restart([{ id: 4 }, { id: 9 }], [{ id: 2 }]);
    expect(box.pending).toBe(0);
    expect([...box.personIds]).toEqual([
      ['p4', 4],
      ['p9', 9],
    ]);
    expect([...box.tieIds]).toEqual([['t2', 2]]);
  });

  it('sends the layout of a very large room in ops the server takes (3,000 moves each) and bodies of at most MOVES_PER_BATCH moves', () => {
    const box = new Outbox();
    const n = 20_000;
    for (let i = 0; i < n; i++) box.personIds.set(`p${i}`, i + 1);
    box.push([{ op: 'move', moves: Array.from({ length: n }, (_, i) => ({ lid: `p${i}`, x: i, y: -i, pinned: false })) }]);
    const sent: number[] = [];
    let batches = 0;
    for (let batch = box.next(); batch; batch = box.next()) {
      batches++;
      expect(batch.layoutOnly).toBeTrue();
      let inBatch = 0;
      for (const op of batch.ops) {
        if (op.op !== 'movePeople') throw new Error('only moves were queued');
        expect(op.moves.length).toBeLessThanOrEqual(3000);
        inBatch += op.moves.length;
        sent.push(...op.moves.map((m) => Number(m.id)));
      }
      expect(inBatch).toBeLessThanOrEqual(MOVES_PER_BATCH);
      box.acknowledge(batch.count, { people: {}, ties: {} });
    }
    expect(batches).toBe(Math.ceil(n / MOVES_PER_BATCH));
    // Everyone's place goes out exactly once.
    expect(new Set(sent).size).toBe(n);
    expect(sent.length).toBe(n);
  });
});
