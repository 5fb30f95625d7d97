import type { EditorPerson } from '../editor/room-model';
import { groupStyles } from './group-style';
import { mapSvgDocument, withFont } from './map-export';
import { MapGraph } from './map-graph';
import { MapRenderer, SVG_NS } from './map-renderer';

const people: EditorPerson[] = [
  { lid: 'a', key: 'A', name: 'Asha', group: null, email: null, x: -50, y: 10, pinned: false },
  { lid: 'b', key: 'B', name: 'Dara', group: null, email: null, x: 250, y: 90, pinned: false },
];

describe('mapSvgDocument', () => {
  let svg: SVGSVGElement;
  let overlay: SVGSVGElement;
  beforeEach(() => {
    svg = document.createElementNS(SVG_NS, 'svg');
    overlay = document.createElementNS(SVG_NS, 'svg');
    svg.setAttribute('style', 'width: 400px; height: 300px');
    document.body.append(svg, overlay);
  });
  afterEach(() => {
    svg.remove();
    overlay.remove();
  });

  it('frames everyone and their names on white, without the pan, the find ring or hidden names', () => {
    const graph = new MapGraph();
    const renderer = new MapRenderer(svg, overlay);
    graph.update(people, [{ lid: 't', source: 'a', target: 'b', strength: 1 }], new Set());
    renderer.draw(graph, people, groupStyles([]), false, true);
    renderer.setTransform('translate(30,40) scale(2)', 0.5);
    renderer.peopleLayer.setAttribute('class', 'people no-labels');
    renderer.ringPerson(graph, 'a');

    const doc = mapSvgDocument(svg, renderer, graph);
    if (!doc) throw new Error('a room with people has a picture');
    const out = new DOMParser().parseFromString(doc.svg, 'image/svg+xml').documentElement;
    const [x0, y0, w, h] = (out.getAttribute('viewBox') ?? '').split(' ').map(Number);
    // 24 units of padding beyond the shapes (radius 11) and the names below them.
    expect(x0).toBeLessThanOrEqual(-50 - 11 - 24);
    expect(y0).toBeLessThanOrEqual(10 - 11 - 24);
    expect((x0 ?? 0) + (w ?? 0)).toBeGreaterThanOrEqual(250 + 11 + 24);
    expect((y0 ?? 0) + (h ?? 0)).toBeGreaterThanOrEqual(90 + 11 + 24);
    expect([doc.width, doc.height]).toEqual([w ?? NaN, h ?? NaN]);
    expect(out.getAttribute('width')).toBe(String(Math.round(doc.width)));
    expect(out.firstElementChild?.tagName).toBe('rect');
    expect(out.firstElementChild?.getAttribute('fill')).toBe('#ffffff');
    expect(out.querySelector('.viewport')?.hasAttribute('transform')).toBeFalse();
    expect(out.querySelector('.rh-find-ring')).toBeNull();
    expect(out.querySelector('.people')?.getAttribute('class')).toBe('people');
    expect(out.querySelectorAll('g.person').length).toBe(2);
    expect(renderer.viewport.getAttribute('transform')).withContext('the page keeps its own view').toBe('translate(30,40) scale(2)');
  });

  it('answers nothing for an empty room', () => {
    expect(mapSvgDocument(svg, new MapRenderer(svg, overlay), new MapGraph())).toBeNull();
  });
});

describe('withFont', () => {
  it('puts the font face right after the opening svg tag and leaves a document without one as it was', () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="2"><g/></svg>';
    expect(withFont(svg, '')).toBe(svg);
    const out = withFont(svg, '@font-face{font-family:x}');
    expect(out.startsWith('<svg xmlns="http://www.w3.org/2000/svg" width="2"><style>@font-face{font-family:x}')).toBeTrue();
    expect(out.endsWith('</style><g/></svg>')).toBeTrue();
  });
});
