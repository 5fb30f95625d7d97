import { placeLabels } from '../../core/label-placement';
import type { EditorPerson } from '../editor/room-model';
import type { Selection } from '../editor/selection';
import { type GroupStyle, NO_GROUP_STYLE, shapePath, tieWidth } from './group-style';
import { LABEL_FONT, labelWidth } from './label-font';
import { type MapGraph, PERSON_RADIUS as R } from './map-graph';
import type { MapLink, MapNode } from './map-layout';

export const INK = '#16324a';
export const CLAY = '#c2603a';
export const TIE = '#8a96a3';
export const SVG_NS = 'http://www.w3.org/2000/svg';
/** Above this many people names are not placed one by one (they are hidden until zoomed in). */
const LABEL_PLACEMENT_MAX = 400;
/** Up to this many people all names show at every zoom; above, from LABEL_ZOOM on. */
const LABELS_ALWAYS_MAX = 150;
const LABEL_ZOOM = 1.4;

/**
 * Draws the map in SVG with presentation attributes (so the PNG export looks the same) and
 * moves what it drew: people, ties, the draft line of a new tie and the ring of "Find a person".
 * People being dragged (and their ties) move to the overlay, a composited layer of their own,
 * so a drag frame repaints a few shapes instead of the whole map.
 */
export class MapRenderer {
  readonly viewport = el('g', { class: 'viewport' });
  readonly tieLayer = el('g', { class: 'ties' });
  readonly peopleLayer = el('g', { class: 'people' });
  private readonly draft = el('line', { stroke: CLAY, 'stroke-width': 2.5, 'stroke-dasharray': '6 4', visibility: 'hidden' });
  private readonly ring = el('circle', {
    r: R + 9,
    fill: 'none',
    stroke: CLAY,
    'stroke-width': 3,
    visibility: 'hidden',
    class: 'rh-find-ring',
  });
  private readonly overlayViewport = el('g', {});
  private readonly overlayTies = el('g', {});
  private readonly overlayPeople = el('g', {});
  /** The drawn elements by local id, to give the graph's fresh ties their lines back after a move. */
  private personEls = new Map<string, SVGGElement>();
  private tieEls = new Map<string, SVGLineElement>();
  private ringed: string | null = null;
  private allLabels = true;

  constructor(
    private readonly svg: SVGSVGElement,
    overlay: SVGSVGElement,
  ) {
    svg.replaceChildren();
    this.viewport.append(this.tieLayer, this.draft, this.peopleLayer, this.ring);
    svg.append(this.viewport);
    this.overlayViewport.append(this.overlayTies, this.overlayPeople);
    overlay.replaceChildren(this.overlayViewport);
  }

  /** Draws every person and tie anew (the room's structure changed). */
  draw(
    graph: MapGraph,
    people: readonly EditorPerson[],
    styles: ReadonlyMap<string, GroupStyle>,
    directed: boolean,
    keyboard: boolean,
  ): void {
    this.drawTies(graph, directed);
    this.drawPeople(graph, people, styles, keyboard);
    this.personEls = new Map(graph.nodeList().map((n) => [n.lid, n.el as SVGGElement]));
    this.tieEls = new Map(graph.links.map((l) => [l.lid, l.el as SVGLineElement]));
    this.allLabels = graph.size <= LABELS_ALWAYS_MAX;
  }

  /** Removes every person and tie drawn (the room is now shown as the overview). */
  clear(): void {
    this.tieLayer.replaceChildren();
    this.peopleLayer.replaceChildren();
    this.personEls = new Map();
    this.tieEls = new Map();
    this.ring.setAttribute('visibility', 'hidden');
    this.ringed = null;
  }

  /** Gives the graph's nodes and ties the elements drawn for them before (only places changed). */
  reattach(graph: MapGraph): void {
    for (const n of graph.nodes.values()) n.el = this.personEls.get(n.lid);
    for (const l of graph.links) l.el = this.tieEls.get(l.lid);
  }

  private drawTies(graph: MapGraph, directed: boolean): void {
    const maxStrength = graph.maxStrength();
    const frag = document.createDocumentFragment();
    for (const l of graph.links) {
      const line = el('line', { stroke: TIE, 'stroke-width': tieWidth(l.strength, maxStrength).toFixed(2), 'stroke-linecap': 'round' });
      if (directed) line.setAttribute('marker-end', 'url(#rh-arrow)');
      l.el = line;
      placeTie(l);
      frag.append(line);
    }
    this.tieLayer.replaceChildren(frag);
    if (directed && !this.svg.querySelector('#rh-arrow')) this.svg.prepend(arrowDefs());
  }

  private drawPeople(graph: MapGraph, people: readonly EditorPerson[], styles: ReadonlyMap<string, GroupStyle>, keyboard: boolean): void {
    const frag = document.createDocumentFragment();
    for (const p of people) {
      const n = graph.node(p.lid);
      if (!n) continue;
      n.el = personElement(p, styles.get(p.group ?? '') ?? NO_GROUP_STYLE, keyboard);
      placeNode(n);
      frag.append(n.el);
    }
    this.peopleLayer.replaceChildren(frag);
  }

  /** Puts every person, tie and the find ring where the graph has them. */
  placeAll(graph: MapGraph): void {
    for (const n of graph.nodes.values()) placeNode(n);
    for (const l of graph.links) placeTie(l);
    this.placeRing(graph);
  }

  /** Moves these people and their ties (a drag frame). */
  placeSome(graph: MapGraph, nodes: readonly MapNode[]): void {
    for (const n of nodes) placeNode(n);
    for (const l of graph.tiesAround(nodes)) placeTie(l);
    this.placeRing(graph);
  }

  paintPins(graph: MapGraph, people: readonly EditorPerson[]): void {
    for (const p of people)
      graph
        .node(p.lid)
        ?.el?.querySelector('.pin')
        ?.setAttribute('visibility', p.pinned ? 'visible' : 'hidden');
  }

  paintSelection(graph: MapGraph, s: Selection): void {
    for (const n of graph.nodes.values()) {
      const shape = n.el?.querySelector('.shape');
      if (!n.el || !shape) continue;
      const on = s.has(n.lid);
      shape.setAttribute('stroke', on ? CLAY : INK);
      shape.setAttribute('stroke-width', on ? '3.5' : '1.4');
      n.el.classList.toggle('selected', on);
      n.el.setAttribute('aria-pressed', String(on));
    }
    const maxStrength = graph.maxStrength();
    for (const l of graph.links) {
      const on = s.tie === l.lid;
      l.el?.setAttribute('stroke', on ? CLAY : TIE);
      l.el?.setAttribute('stroke-width', (tieWidth(l.strength, maxStrength) + (on ? 2 : 0)).toFixed(2));
    }
  }

  /** Puts every name where it overlaps no other name and no person (label-placement.ts). */
  placeNames(graph: MapGraph, nameOf: (lid: string) => string): void {
    const nodes = graph.nodeList();
    if (nodes.length > LABEL_PLACEMENT_MAX) return;
    const spots = placeLabels(
      nodes.map((n) => ({ x: n.x ?? 0, y: n.y ?? 0, width: labelWidth(nameOf(n.lid)) })),
      // The largest shapes (star, triangle) reach about 1.35 R from the centre.
      R * 1.4,
      { height: 15 },
    );
    nodes.forEach((n, i) => {
      const label = n.el?.querySelector('.label');
      if (!label) return;
      const spot = spots[i];
      label.setAttribute('visibility', spot ? 'visible' : 'hidden');
      if (spot) attrs(label, { x: spot.dx, y: spot.dy, 'text-anchor': spot.anchor });
    });
  }

  /** The pan and zoom (a d3 transform's `toString()`), and the names that zoom level shows. */
  setTransform(transform: string, k: number): void {
    this.viewport.setAttribute('transform', transform);
    this.overlayViewport.setAttribute('transform', transform);
    this.showLabels(k);
  }

  showLabels(k: number): void {
    const show = this.allLabels || k >= LABEL_ZOOM;
    this.peopleLayer.setAttribute('class', show ? 'people' : 'people no-labels');
  }

  /** Moves people (and their ties) to the drag layer. */
  lift(nodes: readonly MapNode[], links: readonly MapLink[]): void {
    for (const l of links) if (l.el) this.overlayTies.append(l.el);
    for (const n of nodes) if (n.el) this.overlayPeople.append(n.el);
  }

  /** Puts lifted people and ties back into the map. */
  drop(nodes: readonly MapNode[], links: readonly MapLink[]): void {
    for (const l of links) if (l.el) this.tieLayer.append(l.el);
    for (const n of nodes) if (n.el) this.peopleLayer.append(n.el);
  }

  /** The dashed line of a tie being drawn, from (x, y). */
  startDraft(x: number, y: number): void {
    attrs(this.draft, { x1: x, y1: y, x2: x, y2: y, visibility: 'visible' });
  }

  stretchDraft(x: number, y: number): void {
    attrs(this.draft, { x2: x, y2: y });
  }

  endDraft(): void {
    this.draft.setAttribute('visibility', 'hidden');
  }

  /** Rings a person (Find); the ring follows them until someone else is found. */
  ringPerson(graph: MapGraph, lid: string): void {
    this.ringed = lid;
    this.placeRing(graph);
    this.ring.setAttribute('visibility', 'visible');
  }

  private placeRing(graph: MapGraph): void {
    if (!this.ringed) return;
    const n = graph.node(this.ringed);
    if (!n) {
      this.ring.setAttribute('visibility', 'hidden');
      return;
    }
    attrs(this.ring, { cx: n.x ?? 0, cy: n.y ?? 0 });
  }
}

function personElement(p: EditorPerson, style: GroupStyle, keyboard: boolean): SVGGElement {
  const g = el('g', {
    class: 'person',
    'data-lid': p.lid,
    'data-name': p.name,
    // Keyboard: Tab reaches each person (up to KEYBOARD_STOPS_MAX; larger rooms use Find), Enter selects, arrows move.
    tabindex: keyboard ? 0 : -1,
    role: 'button',
    'aria-label': p.group ? `${p.name}, ${p.group}` : p.name,
    'aria-pressed': 'false',
  });
  g.append(
    el('circle', {
      r: R + 6,
      fill: 'none',
      stroke: INK,
      'stroke-width': 2,
      'stroke-dasharray': '4 3',
      class: 'focus-ring',
      visibility: 'hidden',
    }),
  );
  g.append(el('path', { d: shapePath(style.shape, R), fill: style.fill, stroke: INK, 'stroke-width': 1.4, class: 'shape' }));
  if (style.hollow) g.append(el('circle', { r: R * 0.38, fill: '#ffffff', stroke: INK, 'stroke-width': 1 }));
  g.append(el('path', { d: 'M5,-17h7l-3.5,6z', fill: INK, class: 'pin', visibility: p.pinned ? 'visible' : 'hidden' }));
  // Quoted family: a family name with a digit in it is not a valid bare CSS identifier.
  const label = el('text', {
    y: R + 13,
    'text-anchor': 'middle',
    'font-size': 11,
    fill: INK,
    'font-family': LABEL_FONT.family,
    class: 'label',
  });
  label.textContent = p.name;
  g.append(label);
  const title = el('title', {});
  title.textContent = p.group ? `${p.name} (${p.group})` : p.name;
  g.append(title);
  return g;
}

function arrowDefs(): SVGDefsElement {
  const defs = el('defs', {});
  const marker = el('marker', {
    id: 'rh-arrow',
    viewBox: '0 0 10 10',
    refX: 9,
    refY: 5,
    markerWidth: 5,
    markerHeight: 5,
    orient: 'auto-start-reverse',
  });
  marker.append(el('path', { d: 'M0,0L10,5L0,10Z', fill: TIE }));
  defs.append(marker);
  return defs;
}

/** A tie's line from centre to centre; with an arrow, from edge to edge so the arrow head shows. */
export function placeTie(l: MapLink): void {
  const line = l.el;
  if (!line) return;
  let { x: x1 = 0, y: y1 = 0 } = l.source;
  let { x: x2 = 0, y: y2 = 0 } = l.target;
  if (line.hasAttribute('marker-end')) {
    const dx = x2 - x1;
    const dy = y2 - y1;
    const len = Math.hypot(dx, dy) || 1;
    x2 -= (dx / len) * (R + 3);
    y2 -= (dy / len) * (R + 3);
    x1 += (dx / len) * R;
    y1 += (dy / len) * R;
  }
  attrs(line, { x1: x1.toFixed(1), y1: y1.toFixed(1), x2: x2.toFixed(1), y2: y2.toFixed(1) });
}

export function placeNode(n: MapNode): void {
  n.el?.setAttribute('transform', `translate(${(n.x ?? 0).toFixed(1)},${(n.y ?? 0).toFixed(1)})`);
}

export function el<K extends keyof SVGElementTagNameMap>(tag: K, a: Record<string, string | number>): SVGElementTagNameMap[K] {
  const node = document.createElementNS(SVG_NS, tag);
  attrs(node, a);
  return node;
}

export function attrs(node: Element, a: Record<string, string | number>): void {
  for (const [k, v] of Object.entries(a)) node.setAttribute(k, String(v));
}
