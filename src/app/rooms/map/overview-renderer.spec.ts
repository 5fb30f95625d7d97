import type { EditorPerson, EditorTie } from '../editor/room-model';
import { Selection } from '../editor/selection';
import { groupStyles } from './group-style';
import { MapGraph, PERSON_RADIUS } from './map-graph';
import { layoutMode, STATIC_FROM } from './map-layout';
import {
  labelledPeople,
  OVERVIEW_FROM,
  OVERVIEW_LABEL_ZOOM,
  OVERVIEW_LABELS_MAX,
  OverviewRenderer,
  personScale,
  usesOverview,
  type View,
} from './overview-renderer';

const person = (lid: string, x: number, y: number, group: string | null = null): EditorPerson => ({
  lid,
  key: lid,
  name: `Person ${lid}`,
  group,
  email: null,
  x,
  y,
  pinned: false,
});

/** A seeded generator (mulberry32, T. Ettinger, 2017), so the random places are the same every run. */
function seeded(seed: number): () => number {
  let a = seed;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('OverviewRenderer', () => {
  let canvas: HTMLCanvasElement;
  let graph: MapGraph;
  let renderer: OverviewRenderer;

  function show(people: EditorPerson[], ties: EditorTie[], view: View): void {
    graph.update(people, ties, new Set());
    renderer.setRoom(graph, people, groupStyles(['Sales', 'Ops']), false);
    renderer.setView(view);
  }

  beforeEach(() => {
    canvas = document.createElement('canvas');
    canvas.style.width = '400px';
    canvas.style.height = '300px';
    document.body.append(canvas);
    graph = new MapGraph();
    renderer = new OverviewRenderer(canvas);
  });
  afterEach(() => canvas.remove());

  it('picks the person under a click, through the pan and zoom, and nobody beside everyone', () => {
    show([person('a', 0, 0), person('b', 100, 0)], [], { k: 2, x: 50, y: 40, width: 400, height: 300 });
    // b sits at screen (50 + 2 * 100, 40) = (250, 40); its shape reaches 2 * 11 = 22 px.
    expect(renderer.personAt(250, 40)?.lid).toBe('b');
    expect(renderer.personAt(250 + 20, 40 + 5)?.lid)
      .withContext('inside the shape')
      .toBe('b');
    expect(renderer.personAt(50, 40)?.lid).toBe('a');
    expect(renderer.personAt(150, 40)).withContext('half-way between, 100 px from each').toBeNull();
  });

  it('zoomed far out, still picks within a few pixels of the drawn dot (people keep a minimum size)', () => {
    const k = 0.05;
    show([person('a', 0, 0), person('b', 2000, 0)], [], { k, x: 10, y: 10, width: 400, height: 300 });
    const drawnRadius = PERSON_RADIUS * k * personScale(k);
    expect(drawnRadius).toBeCloseTo(1.8, 5);
    expect(renderer.personAt(10 + 100 + 4, 10)?.lid).toBe('b');
    expect(renderer.personAt(10 + 100 + 12, 10)).toBeNull();
  });

  it('agrees with a search of everyone (brute force) on 300 random clicks in a room of 2,000', () => {
    const random = seeded(7);
    const people = Array.from({ length: 2000 }, (_, i) => person(`p${i}`, random() * 3000, random() * 2000));
    const view: View = { k: 0.4, x: 20, y: 10, width: 1200, height: 800 };
    show(people, [], view);
    const reach = (PERSON_RADIUS * view.k * personScale(view.k) + 4) / view.k;
    for (let i = 0; i < 300; i++) {
      const [sx, sy] = [random() * view.width, random() * view.height];
      const [gx, gy] = [(sx - view.x) / view.k, (sy - view.y) / view.k];
      let best: string | null = null;
      let bestD = reach;
      for (const p of people) {
        const d = Math.hypot(p.x! - gx, p.y! - gy);
        if (d < bestD) [best, bestD] = [p.lid, d];
      }
      expect(renderer.personAt(sx, sy)?.lid ?? null)
        .withContext(`click ${i} at ${sx.toFixed(0)},${sy.toFixed(0)}`)
        .toBe(best);
    }
  });

  it('moves with the room: after a layout step the pick finds people at their new places', () => {
    show([person('a', 0, 0)], [], { k: 1, x: 0, y: 0, width: 400, height: 300 });
    expect(renderer.personAt(0, 0)?.lid).toBe('a');
    const a = graph.node('a')!;
    [a.x, a.y] = [200, 100];
    renderer.placesChanged();
    expect(renderer.personAt(0, 0)).toBeNull();
    expect(renderer.personAt(200, 100)?.lid).toBe('a');
  });

  it('draws each person in their group colour from group-style', () => {
    show([person('a', 100, 100, 'Sales'), person('b', 200, 100, 'Ops')], [], { k: 1, x: 0, y: 0, width: 400, height: 300 });
    renderer.drawNow();
    const ctx = canvas.getContext('2d')!;
    const dpr = window.devicePixelRatio || 1;
    const rgb = (x: number, y: number) => Array.from(ctx.getImageData(x * dpr, y * dpr, 1, 1).data.slice(0, 3));
    const hex = (h: string) => [1, 3, 5].map((i) => parseInt(h.slice(i, i + 2), 16));
    const styles = groupStyles(['Sales', 'Ops']);
    // The order given fixes the styles: 'Sales' gets the first colour, 'Ops' the second.
    expect(rgb(100, 100)).toEqual(hex(styles.get('Sales')!.fill));
    expect(rgb(200, 100)).toEqual(hex(styles.get('Ops')!.fill));
    expect(rgb(300, 250)).withContext('background left clear').toEqual([0, 0, 0]);
  });

  it('marks the selected person with a clay outline', () => {
    show([person('a', 100, 100, 'Sales')], [], { k: 1, x: 0, y: 0, width: 400, height: 300 });
    const s = new Selection();
    s.only('a');
    renderer.setSelection(s);
    renderer.drawNow();
    const ctx = canvas.getContext('2d')!;
    const dpr = window.devicePixelRatio || 1;
    // The circle's edge, 11 units right of its centre, is stroked 3.5 wide in clay (#c2603a).
    const [r, g, b] = ctx.getImageData((100 + PERSON_RADIUS) * dpr, 100 * dpr, 1, 1).data;
    expect([r, g, b]).toEqual([0xc2, 0x60, 0x3a]);
  });
});

describe('labelledPeople (which names the overview writes)', () => {
  const node = (lid: string, x: number, y: number) => ({ lid, group: '', pinned: false, x, y });
  const nameOf = (lid: string) => `Person ${lid}`;
  const view = (k: number): View => ({ k, x: 0, y: 0, width: 800, height: 600 });

  it('writes no names below the label zoom, except for the selected or found person', () => {
    const nodes = [node('a', 100, 100), node('b', 300, 100)];
    expect(labelledPeople(nodes, view(OVERVIEW_LABEL_ZOOM - 0.1), new Set(), nameOf)).toEqual([]);
    const few = labelledPeople(nodes, view(OVERVIEW_LABEL_ZOOM - 0.1), new Set(['b']), nameOf);
    expect(few.map((l) => l.node.lid)).toEqual(['b']);
  });

  it('from the label zoom on, names everyone on screen and nobody off screen', () => {
    const nodes = [node('a', 100, 100), node('b', 400, 100), node('c', 1200, 100), node('d', 100, -50)];
    const labels = labelledPeople(nodes, view(1), new Set(), nameOf);
    expect(labels.map((l) => l.node.lid)).toEqual(['a', 'b']);
    // The name sits centred under the shape.
    const a = labels[0]!;
    expect(a.x + a.width / 2).toBeCloseTo(100, 5);
    expect(a.y).toBeGreaterThan(100 + PERSON_RADIUS);
  });

  it('skips a name that would overlap one already written, but never the selected person’s', () => {
    const nodes = [node('a', 100, 100), node('b', 110, 100), node('c', 300, 100)];
    expect(labelledPeople(nodes, view(1), new Set(), nameOf).map((l) => l.node.lid)).toEqual(['a', 'c']);
    // The selected person goes first: their neighbour's name gives way.
    expect(labelledPeople(nodes, view(1), new Set(['b']), nameOf).map((l) => l.node.lid)).toEqual(['b', 'c']);
  });

  it('with more people on screen than it can name, names only the selected one', () => {
    // Everyone on screen: 40 to a row, 15 apart, at zoom 1 on an 800 x 600 view.
    const crowd = Array.from({ length: OVERVIEW_LABELS_MAX + 1 }, (_, i) =>
      node(`n${i}`, 10 + (i % 40) * 15, 10 + Math.floor(i / 40) * 15),
    );
    expect(labelledPeople(crowd, view(1), new Set(), nameOf)).toEqual([]);
    expect(labelledPeople(crowd, view(1), new Set(['n3']), nameOf).map((l) => l.node.lid)).toEqual(['n3']);
    expect(labelledPeople(crowd.slice(0, OVERVIEW_LABELS_MAX), view(1), new Set(), nameOf).length).toBeGreaterThan(0);
  });
});

describe('when the map becomes the overview', () => {
  it(`is the overview from ${OVERVIEW_FROM} people on, and every room too large for a running layout is one`, () => {
    expect(usesOverview(OVERVIEW_FROM - 1)).toBeFalse();
    expect(usesOverview(OVERVIEW_FROM)).toBeTrue();
    // A room with no layout at all (the fixed layout) is never drawn one SVG element at a time.
    expect(OVERVIEW_FROM).toBeLessThanOrEqual(STATIC_FROM);
    expect(layoutMode(OVERVIEW_FROM - 1)).not.toBe('static');
  });
});
