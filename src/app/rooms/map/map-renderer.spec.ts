import type { EditorPerson, EditorTie } from '../editor/room-model';
import { Selection } from '../editor/selection';
import { groupStyles } from './group-style';
import { MapGraph } from './map-graph';
import { CLAY, INK, MapRenderer, SVG_NS } from './map-renderer';

const asha: EditorPerson = { lid: 'a', key: 'A', name: 'Asha', group: 'Sales', email: null, x: 0, y: 0, pinned: true };
const dara: EditorPerson = { lid: 'b', key: 'B', name: 'Dara', group: null, email: null, x: 100, y: 0, pinned: false };
const people = [asha, dara];
const ties: EditorTie[] = [{ lid: 't', source: 'a', target: 'b', strength: 2 }];

describe('MapRenderer', () => {
  let svg: SVGSVGElement;
  let overlay: SVGSVGElement;
  let graph: MapGraph;
  let renderer: MapRenderer;

  function draw(directed = false, room = people): void {
    graph.update(room, ties, new Set());
    renderer.draw(graph, room, groupStyles(['Sales']), directed, true);
  }

  beforeEach(() => {
    svg = document.createElementNS(SVG_NS, 'svg');
    overlay = document.createElementNS(SVG_NS, 'svg');
    document.body.append(svg, overlay);
    graph = new MapGraph();
    renderer = new MapRenderer(svg, overlay);
  });
  afterEach(() => {
    svg.remove();
    overlay.remove();
  });

  it('draws each person as a labelled keyboard stop at their place, with a pin only when pinned', () => {
    draw();
    const drawn = [...svg.querySelectorAll('g.person')];
    expect(drawn.map((g) => g.getAttribute('aria-label'))).toEqual(['Asha, Sales', 'Dara']);
    expect(drawn.map((g) => g.getAttribute('tabindex'))).toEqual(['0', '0']);
    expect(drawn[1]?.getAttribute('transform')).toBe('translate(100.0,0.0)');
    expect(drawn.map((g) => g.querySelector('.pin')?.getAttribute('visibility'))).toEqual(['visible', 'hidden']);
    expect(drawn[0]?.querySelector('title')?.textContent).toBe('Asha (Sales)');
  });

  it('draws ties centre to centre, and edge to edge with an arrow head in a directed room', () => {
    draw();
    const line = () => svg.querySelector('g.ties line');
    expect(['x1', 'x2'].map((a) => line()?.getAttribute(a))).toEqual(['0.0', '100.0']);
    expect(svg.querySelector('#rh-arrow')).toBeNull();
    draw(true);
    // The line leaves the source's edge (radius 11) and stops short of the target's edge (radius + 3).
    expect(['x1', 'x2'].map((a) => line()?.getAttribute(a))).toEqual(['11.0', '86.0']);
    expect(line()?.getAttribute('marker-end')).toBe('url(#rh-arrow)');
    expect(svg.querySelectorAll('#rh-arrow').length).toBe(1);
  });

  it('paints the selection on people and on the selected tie', () => {
    draw();
    const s = new Selection();
    s.only('b');
    renderer.paintSelection(graph, s);
    const shapes = [...svg.querySelectorAll('g.person .shape')];
    expect(shapes.map((e) => e.getAttribute('stroke'))).toEqual([INK, CLAY]);
    expect(svg.querySelector('g.person[data-lid="b"]')?.getAttribute('aria-pressed')).toBe('true');
    s.selectTie('t');
    renderer.paintSelection(graph, s);
    expect(svg.querySelector('g.ties line')?.getAttribute('stroke')).toBe(CLAY);
    expect(shapes.map((e) => e.getAttribute('stroke'))).toEqual([INK, INK]);
  });

  it('after a move re-places the same elements; a lifted person sits in the overlay until dropped', () => {
    draw();
    const before = svg.querySelector('g.person[data-lid="b"]');
    graph.update([asha, { ...dara, x: 40, y: 30 }], ties, new Set());
    renderer.reattach(graph);
    renderer.placeAll(graph);
    expect(svg.querySelector('g.person[data-lid="b"]')).toBe(before);
    expect(before?.getAttribute('transform')).toBe('translate(40.0,30.0)');
    expect(svg.querySelector('g.ties line')?.getAttribute('x2')).toBe('40.0');
    const b = graph.node('b');
    if (!b) throw new Error('b is on the map');
    const links = graph.tiesAround([b]);
    renderer.lift([b], links);
    expect(overlay.querySelector('g.person')).toBe(before);
    expect(overlay.querySelectorAll('line').length).toBe(1);
    renderer.drop([b], links);
    expect(overlay.querySelector('g.person')).toBeNull();
    expect(svg.querySelector('g.people g.person[data-lid="b"]')).toBe(before);
  });

  it('rings a found person and keeps the ring on them as they move', () => {
    draw();
    const ring = svg.querySelector('.rh-find-ring');
    expect(ring?.getAttribute('visibility')).toBe('hidden');
    renderer.ringPerson(graph, 'b');
    expect(ring?.getAttribute('visibility')).toBe('visible');
    expect(ring?.getAttribute('cx')).toBe('100');
    const b = graph.node('b');
    if (!b) throw new Error('b is on the map');
    b.x = 70;
    renderer.placeSome(graph, [b]);
    expect(ring?.getAttribute('cx')).toBe('70');
  });

  it('hides names of a crowded room until zoomed in', () => {
    const crowd: EditorPerson[] = Array.from({ length: 151 }, (_, i) => ({ ...dara, lid: `p${i}`, x: i * 40 }));
    draw(false, crowd);
    renderer.setTransform('translate(0,0) scale(1)', 1);
    expect(renderer.peopleLayer.getAttribute('class')).toBe('people no-labels');
    renderer.setTransform('translate(0,0) scale(1.5)', 1.5);
    expect(renderer.peopleLayer.getAttribute('class')).toBe('people');
    expect(renderer.viewport.getAttribute('transform')).toBe('translate(0,0) scale(1.5)');
  });
});
