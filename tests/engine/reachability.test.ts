/** Closed classes and unreachable people (Tarjan's strongly connected components, 1972). */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { classStructure, prepareRoom, unreachablePeople } from '../../shared/engine/index';
import { room } from './engine-fixtures';

describe('reachability', () => {
  it('closed classes of a directed room', () => {
    // 0 -> 1 -> 2 -> 1 (closed {1,2}); 3 <-> 4 closed; 5 -> 3, 5 -> 0 transient; 6 asks nobody (closed {6}).
    const r = prepareRoom(
      room(
        7,
        [
          [0, 1],
          [1, 2],
          [2, 1],
          [3, 4],
          [4, 3],
          [5, 3],
          [5, 0],
        ],
        true,
      ),
    );
    const cs = classStructure(r);
    assert.deepEqual(cs.closedClasses, [[1, 2], [3, 4], [6]]);
    assert.equal(cs.closedOf[0], -1);
    assert.equal(cs.closedOf[5], -1);
    const un = unreachablePeople(r, [1]);
    assert.deepEqual(
      un.map((u) => [u.index, u.reason]),
      [
        [3, 'no-path'],
        [4, 'no-path'],
        [5, 'may-get-stuck'],
        [6, 'no-path'],
      ],
    );
    assert.deepEqual(unreachablePeople(r, [1, 3, 6]), []);
  });
  it('undirected components are the closed classes; mixing joins them', () => {
    const g = room(5, [
      [0, 1],
      [2, 3],
      [3, 4],
    ]);
    assert.deepEqual(classStructure(prepareRoom(g)).closedClasses, [
      [0, 1],
      [2, 3, 4],
    ]);
    assert.equal(classStructure(prepareRoom(g, { mixing: 0.01 })).closedClasses.length, 1);
    assert.deepEqual(unreachablePeople(prepareRoom(g, { mixing: 0.01 }), [0]), []);
  });
  it('a long chain does not overflow the stack (iterative search)', () => {
    const n = 200_000;
    const g = room(
      n,
      Array.from({ length: n - 1 }, (_, i) => [i, i + 1] as [number, number]),
      true,
    );
    const cs = classStructure(prepareRoom(g));
    assert.deepEqual(cs.closedClasses, [[n - 1]]);
  });
});
