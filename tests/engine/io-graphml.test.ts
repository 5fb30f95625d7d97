import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import Graph from 'graphology';
import { parse as graphologyParse } from 'graphology-graphml';
import { parseGraphml, writeGraphml } from '../../shared/engine/io/index';
import type { RoomGraph } from '../../shared/engine/graph';

// The weighted example of the GraphML Primer (Brandes, Eiglsperger, Lerner: "GraphML Primer",
// graphdrawing.org), reproduced from memory: six nodes, seven edges, a node colour key with a
// default and an edge weight key without one.
const PRIMER = `<?xml version="1.0" encoding="UTF-8"?>
<graphml xmlns="http://graphml.graphdrawing.org/xmlns"
    xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance"
    xsi:schemaLocation="http://graphml.graphdrawing.org/xmlns http://graphml.graphdrawing.org/xmlns/1.0/graphml.xsd">
  <key id="d0" for="node" attr.name="color" attr.type="string"><default>yellow</default></key>
  <key id="d1" for="edge" attr.name="weight" attr.type="double"/>
  <graph id="G" edgedefault="undirected">
    <node id="n0"><data key="d0">green</data></node>
    <node id="n1"/>
    <node id="n2"><data key="d0">blue</data></node>
    <node id="n3"><data key="d0">red</data></node>
    <node id="n4"/>
    <node id="n5"><data key="d0">turquoise</data></node>
    <edge id="e0" source="n0" target="n2"><data key="d1">1.0</data></edge>
    <edge id="e1" source="n0" target="n1"><data key="d1">1.0</data></edge>
    <edge id="e2" source="n1" target="n3"><data key="d1">2.0</data></edge>
    <edge id="e3" source="n3" target="n2"/>
    <edge id="e4" source="n2" target="n4"/>
    <edge id="e5" source="n3" target="n5"/>
    <edge id="e6" source="n5" target="n4"><data key="d1">1.1</data></edge>
  </graph>
</graphml>`;

const doc = (body: string, head = '') => `<?xml version="1.0"?><graphml>${head}<graph edgedefault="undirected">${body}</graph></graphml>`;

describe('GraphML reading', () => {
  it('reads the GraphML Primer example; missing weights count as 1', () => {
    const r = parseGraphml(PRIMER);
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph.ids, ['n0', 'n1', 'n2', 'n3', 'n4', 'n5']);
    assert.equal(r.graph.directed, false);
    assert.deepEqual(
      r.graph.ties.map((t) => t.strength),
      [1, 1, 2, 1, 1, 1, 1.1],
    );
  });

  it('agrees with graphology-graphml on the Primer example (a general-purpose reader)', () => {
    const ours = parseGraphml(PRIMER).graph;
    const theirs = graphologyParse(Graph, PRIMER);
    assert.equal(theirs.type, 'undirected');
    assert.deepEqual(theirs.nodes(), [...ours.ids]);
    const edges = theirs.mapEdges((_e, a, s, t) => [s, t, (a['weight'] as number | undefined) ?? 1]);
    assert.deepEqual(
      edges,
      ours.ties.map((t) => [ours.ids[t.source], ours.ids[t.target], t.strength]),
    );
  });

  it('prefers a key named strength, reads labels, groups and key defaults', () => {
    const head =
      '<key id="w" for="edge" attr.name="weight"/><key id="s" for="edge" attr.name="strength"><default>4</default></key><key id="l" for="node" attr.name="label"/><key id="g" for="node" attr.name="group"/>';
    const r = parseGraphml(
      doc(
        '<node id="a"><data key="l">Ann &amp; co</data><data key="g">x</data></node><node id="b"/><edge source="a" target="b"><data key="w">9</data></edge><edge source="b" target="c"/><node id="c"/>',
        head,
      ),
    );
    // GraphML lets nodes follow the edges that use them
    assert.deepEqual(r.errors, []);
    assert.equal(r.graph.ties.length, 2);
    assert.deepEqual(r.graph.labels, ['Ann & co', 'b', 'c']);
    assert.deepEqual(r.graph.groups, ['x', null, null]);
    assert.equal(r.graph.ties[0].strength, 4);
  });

  it('edgedefault directed, and per-edge directed mixing both kinds', () => {
    const d = parseGraphml(
      '<graphml><graph edgedefault="directed"><node id="a"/><node id="b"/><edge source="a" target="b"/></graph></graphml>',
    );
    assert.equal(d.graph.directed, true);
    const mixed = parseGraphml(
      doc('<node id="a"/><node id="b"/><node id="c"/><edge source="a" target="b" directed="true"/><edge source="b" target="c"/>'),
    );
    assert.equal(mixed.graph.directed, true);
    assert.deepEqual(
      mixed.graph.ties.map((t) => [t.source, t.target]),
      [
        [0, 1],
        [1, 2],
        [2, 1],
      ],
    );
    assert.deepEqual(
      mixed.warnings.map((w) => w.code),
      ['mixed-direction'],
    );
  });

  it('rejects DOCTYPE and ENTITY declarations before parsing (no entity expansion)', () => {
    const bomb = `<?xml version="1.0"?>\n<!DOCTYPE lolz [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;">]>\n<graphml><graph><node id="&lol2;"/></graph></graphml>`;
    const r = parseGraphml(bomb);
    assert.deepEqual(
      r.errors.map((e) => e.code),
      ['unsafe-markup'],
    );
    assert.equal(r.errors[0].line, 2);
    assert.match(r.errors[0].message, /DOCTYPE/);
    assert.equal(parseGraphml('<graphml><!ENTITY x SYSTEM "file:///etc/passwd"></graphml>').errors[0].code, 'unsafe-markup');
  });

  it('caps the size', () => {
    const r = parseGraphml(doc('<node id="a"/>'.repeat(100)), { maxChars: 500 });
    assert.deepEqual(
      r.errors.map((e) => e.code),
      ['too-large'],
    );
  });

  it('names the element of each problem', () => {
    const head = '<key id="w" for="edge" attr.name="weight"/>';
    const r = parseGraphml(
      doc(
        '<node id="a"/><node id="b"/><node id="a"/><node/><edge id="x1" source="a" target="q"/><edge source="a" target="a"/><edge source="a" target="b"><data key="w">-1</data></edge><edge source="a" target="b"><data key="w">abc</data></edge><edge target="b"/>',
        head,
      ),
    );
    assert.deepEqual(
      r.errors.map((e) => [e.code, e.element, e.field]),
      [
        ['duplicate-person', '<node> #3', 'id'],
        ['bad-id', '<node> #4', 'id'],
        ['unknown-id', '<edge> #1 (id "x1")', 'target'],
        ['self-tie', '<edge> #2', undefined],
        ['bad-strength', '<edge> #3', 'weight'],
        ['bad-strength', '<edge> #4', 'weight'],
        ['missing-field', '<edge> #5', 'source'],
      ],
    );
  });

  it('reports malformed XML with its line, a wrong root, and a missing graph', () => {
    const bad = parseGraphml('<graphml>\n<graph>\n<node id="a">\n</graph></graphml>');
    assert.equal(bad.errors[0].code, 'syntax');
    assert.ok(bad.errors[0].line! >= 3);
    assert.equal(parseGraphml('<room/>').errors[0].element, '<graphml>');
    assert.equal(parseGraphml('<graphml></graphml>').errors[0].element, '<graph>');
    assert.equal(parseGraphml(doc('')).errors[0].code, 'empty-room');
  });

  it('merges duplicate edges with a warning', () => {
    const r = parseGraphml(doc('<node id="a"/><node id="b"/><edge source="a" target="b"/><edge source="b" target="a"/>'));
    assert.deepEqual(r.graph.ties, [{ source: 0, target: 1, strength: 2 }]);
    assert.equal(r.warnings[0].code, 'duplicate-tie');
    assert.equal(r.warnings[0].element, '<edge> #2');
  });
});

describe('GraphML writing', () => {
  const room: RoomGraph = {
    ids: ['a<1>', 'b "q"', "c&d'", 'e'],
    labels: ['Ann\nLee', 'b "q"', 'Cé', '  spaced  '],
    groups: ['g1', null, 'g&2', null],
    directed: true,
    ties: [
      { source: 0, target: 1, strength: 0.1 },
      { source: 1, target: 0, strength: 1e-6 },
      { source: 2, target: 3, strength: 123456.789 },
    ],
  };

  it('is read back by graphology-graphml with the same people, ties and weights', () => {
    const g = graphologyParse(Graph, writeGraphml(room));
    assert.equal(g.type, 'directed');
    assert.deepEqual(g.nodes(), [...room.ids]);
    assert.equal(g.getNodeAttribute('a<1>', 'label'), 'Ann\nLee');
    assert.deepEqual(
      g.mapEdges((_e, a, s, t) => [s, t, a['weight']]),
      room.ties.map((t) => [room.ids[t.source], room.ids[t.target], t.strength]),
    );
  });

  it('round-trips through our reader exactly', () => {
    const r = parseGraphml(writeGraphml(room));
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph, room);
  });
});
