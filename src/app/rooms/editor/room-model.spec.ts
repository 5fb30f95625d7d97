import { CommandStack } from './command-stack';
import { type EditorOp, type PersonFields, RoomModel } from './room-model';

function fields(name: string, x = 0, y = 0): PersonFields {
  return { key: name, name, group: null, email: null, x, y, pinned: false };
}

/** Undo and redo: applying a command, then its inverse, must give back exactly the room before. */
describe('room model with undo and redo', () => {
  let model: RoomModel;
  let stack: CommandStack;

  function run(label: string, ops: EditorOp[]) {
    const undo = model.applyAll(ops);
    stack.push({ label, redo: ops, undo });
  }
  function snapshot() {
    return JSON.stringify({ p: [...model.people.values()], t: [...model.ties.values()] });
  }

  beforeEach(() => {
    model = new RoomModel();
    stack = new CommandStack();
    run('seed', [
      { op: 'addPerson', lid: 'a', fields: fields('Ana', 10, 10) },
      { op: 'addPerson', lid: 'b', fields: fields('Bo', 50, 10) },
      { op: 'addTie', lid: 't1', source: 'a', target: 'b', strength: 2 },
    ]);
  });

  it('undoes and redoes a delete of a person with its ties', () => {
    const before = snapshot();
    run('Delete Bo', [
      { op: 'deleteTie', lid: 't1' },
      { op: 'deletePerson', lid: 'b' },
    ]);
    expect(model.people.has('b')).toBeFalse();
    expect(model.ties.size).toBe(0);
    model.applyAll(stack.undo()!.undo);
    expect(snapshot()).toBe(before);
    model.applyAll(stack.redo()!.redo);
    expect(model.people.has('b')).toBeFalse();
    expect(stack.canRedo).toBeFalse();
  });

  it('restores only the fields an update changed', () => {
    run('Rename', [{ op: 'updatePerson', lid: 'a', changes: { name: 'Ana Lima', group: 'Blue' } }]);
    expect(model.person('a').name).toBe('Ana Lima');
    model.applyAll(stack.undo()!.undo);
    expect(model.person('a')).toEqual({ lid: 'a', ...fields('Ana', 10, 10) });
  });

  it('undoes a move of several people and a strength change, last first', () => {
    const before = snapshot();
    run('Move', [
      {
        op: 'move',
        moves: [
          { lid: 'a', x: 1, y: 2, pinned: true },
          { lid: 'b', x: 3, y: 4, pinned: false },
        ],
      },
    ]);
    run('Strength', [{ op: 'updateTie', lid: 't1', strength: 5 }]);
    expect(stack.undoLabel).toBe('Strength');
    model.applyAll(stack.undo()!.undo);
    expect(model.tie('t1').strength).toBe(2);
    model.applyAll(stack.undo()!.undo);
    expect(snapshot()).toBe(before);
  });

  it('a new command after undo clears the redo side', () => {
    run('Strength', [{ op: 'updateTie', lid: 't1', strength: 5 }]);
    model.applyAll(stack.undo()!.undo);
    expect(stack.canRedo).toBeTrue();
    run('Rename', [{ op: 'updatePerson', lid: 'a', changes: { name: 'X' } }]);
    expect(stack.canRedo).toBeFalse();
    expect(stack.redo()).toBeNull();
  });

  it('refuses ops that do not fit the room', () => {
    expect(() => model.apply({ op: 'deletePerson', lid: 'a' })).toThrowError(/ties of a person/);
    expect(() => model.apply({ op: 'addTie', lid: 't2', source: 'a', target: 'zz', strength: 1 })).toThrowError(/not in the room/);
    expect(() => model.apply({ op: 'addPerson', lid: 'a', fields: fields('Dup') })).toThrowError(/already/);
  });

  it('finds a tie either way round only when undirected', () => {
    expect(model.findTie('b', 'a', false)?.lid).toBe('t1');
    expect(model.findTie('b', 'a', true)).toBeUndefined();
  });

  it('keeps at most the given number of commands', () => {
    const small = new CommandStack(2);
    for (const label of ['1', '2', '3']) small.push({ label, redo: [], undo: [] });
    expect(small.undo()?.label).toBe('3');
    expect(small.undo()?.label).toBe('2');
    expect(small.undo()).toBeNull();
  });

  it('takes a room from the server under local ids p<id> and t<id>, dropping what it held before', () => {
    const fresh = new RoomModel();
    fresh.people.set('n1', { lid: 'n1', key: 'X', name: 'Old', group: null, email: null, x: null, y: null, pinned: false });
    fresh.replaceWith(
      [
        { id: 4, key: 'A', name: 'Ana', group: 'North', email: 'ana@example.test', x: 3, y: 4, pinned: true },
        { id: 9, key: 'B', name: 'Bo', group: null, email: null, x: null, y: null, pinned: false },
      ],
      [{ id: 2, sourceId: 9, targetId: 4, strength: 3 }],
    );
    expect([...fresh.people.keys()]).toEqual(['p4', 'p9']);
    expect(fresh.person('p4')).toEqual({
      lid: 'p4',
      key: 'A',
      name: 'Ana',
      group: 'North',
      email: 'ana@example.test',
      x: 3,
      y: 4,
      pinned: true,
    });
    expect([...fresh.ties.values()]).toEqual([{ lid: 't2', source: 'p9', target: 'p4', strength: 3 }]);
  });
});
