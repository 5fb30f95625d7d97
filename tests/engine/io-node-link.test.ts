import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { parseNodeLink, type Issue } from '../../shared/engine/io/index';

const j = (o: unknown) => JSON.stringify(o);
function codes(issues: Issue[]): string[] {
  return issues.map((i) => i.code);
}

describe('node-link JSON', () => {
  it('reads nodes and links, numeric ids as their text, label or name, group, weight or strength', () => {
    const r = parseNodeLink(
      j({
        directed: true,
        nodes: [{ id: 1, name: 'One', group: 'x' }, { id: 'b', label: 'Bee' }, { id: 2.5 }],
        links: [
          { source: 1, target: 'b', weight: 2 },
          { source: 'b', target: 2.5, strength: 3 },
          { source: 2.5, target: 1 },
        ],
      }),
    );
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph.ids, ['1', 'b', '2.5']);
    assert.deepEqual(r.graph.labels, ['One', 'Bee', '2.5']);
    assert.deepEqual(r.graph.groups, ['x', null, null]);
    assert.equal(r.graph.directed, true);
    assert.deepEqual(
      r.graph.ties.map((t) => t.strength),
      [2, 3, 1],
    );
  });

  it('accepts "edges" instead of "links", and endpoints given as objects with an id', () => {
    const r = parseNodeLink(j({ nodes: [{ id: 'a' }, { id: 'b' }], edges: [{ source: { id: 'a' }, target: { id: 'b' } }] }));
    assert.deepEqual(r.errors, []);
    assert.equal(r.graph.directed, false);
    assert.equal(r.graph.ties.length, 1);
  });

  it('names the JSON element of each problem', () => {
    const r = parseNodeLink(
      j({
        nodes: [{ id: 'a' }, { id: 'b' }, { id: 'a' }, { name: 'no id' }, 7],
        links: [
          { source: 'a', target: 'zz' },
          { source: 'a', target: 'a' },
          { source: 'a', target: 'b', weight: 0 },
          { source: 'a', target: 'b', weight: '1e999' },
          { source: 'a', target: 'b', weight: 'heavy' },
          { target: 'b' },
        ],
      }),
    );
    const at = Object.fromEntries(r.errors.map((e) => [e.element, e.code]));
    assert.deepEqual(at, {
      'nodes[2]': 'duplicate-person',
      'nodes[3]': 'bad-id',
      'nodes[4]': 'syntax',
      'links[0]': 'unknown-id',
      'links[1]': 'self-tie',
      'links[2]': 'bad-strength',
      'links[3]': 'bad-strength',
      'links[4]': 'bad-strength',
      'links[5]': 'missing-field',
    });
    assert.equal(r.errors.find((e) => e.element === 'links[0]')!.field, 'target');
    assert.equal(r.errors.find((e) => e.element === 'links[2]')!.field, 'weight');
  });

  it('merges duplicate ties with a warning', () => {
    const r = parseNodeLink(
      j({
        nodes: [{ id: 'a' }, { id: 'b' }],
        links: [
          { source: 'a', target: 'b', weight: 1 },
          { source: 'b', target: 'a', weight: 2 },
        ],
      }),
    );
    assert.deepEqual(r.graph.ties, [{ source: 0, target: 1, strength: 3 }]);
    assert.deepEqual(codes(r.warnings), ['duplicate-tie']);
    assert.equal(r.warnings[0].element, 'links[1]');
  });

  it('reports malformed JSON with its line, and wrong shapes', () => {
    const bad = parseNodeLink('{\n "nodes": [\n  {"id": 1},,\n ]\n}');
    assert.equal(bad.errors[0].code, 'syntax');
    assert.equal(bad.errors[0].line, 3);
    assert.equal(parseNodeLink('[1,2]').errors[0].code, 'syntax');
    assert.equal(parseNodeLink(j({ links: [] })).errors[0].code, 'missing-field');
    assert.equal(parseNodeLink(j({ directed: 'yes', nodes: [{ id: 1 }] })).errors[0].element, 'directed');
  });

  it('empty rooms and size limits', () => {
    assert.deepEqual(codes(parseNodeLink(j({ nodes: [], links: [] })).errors), ['empty-room']);
    const big = j({ nodes: Array.from({ length: 4 }, (_, i) => ({ id: i })), links: [] });
    const e = parseNodeLink(big, { maxPeople: 3 }).errors;
    assert.deepEqual(codes(e), ['room-too-large']);
    assert.equal(e[0].element, 'nodes[3]');
  });

  it('stops reading a huge bad file after the first 50 errors', () => {
    const r = parseNodeLink(j({ nodes: [{ id: 'a' }], links: Array.from({ length: 5000 }, () => ({ source: 'a', target: 'nobody' })) }));
    assert.equal(r.errors.length, 51);
    assert.equal(r.errors[49].element, 'links[49]');
    assert.equal(r.errors[50].code, 'too-many-issues');
    assert.match(r.errors[50].message, /reading stopped after 50 errors/);
  });
});
