import {
  ChangeDetectionStrategy,
  Component,
  effect,
  ViewEncapsulation,
  type ElementRef,
  inject,
  input,
  type OnDestroy,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { drag } from 'd3-drag';
import type { Simulation } from 'd3-force';
import { select, type Selection as D3Selection } from 'd3-selection';
import { zoom, type ZoomBehavior, zoomIdentity, type ZoomTransform } from 'd3-zoom';
import { RoomEditor } from '../editor/room-editor';
import type { Move } from '../editor/room-model';
import { groupStyles, NO_GROUP_STYLE, shapePath, tieWidth } from './group-style';
import { LABEL_FONT, labelWidth } from './label-font';
import { placeLabels } from '../../core/label-placement';
import { createSimulation, layoutMode, type LayoutMode, type MapLink, type MapNode, placeUnplaced } from './map-layout';

export type MapTool = 'select' | 'tie';

const R = 11;
const INK = '#16324a';
const CLAY = '#c2603a';
const TIE = '#8a96a3';
const SVG_NS = 'http://www.w3.org/2000/svg';
/** Above this many people names are not placed one by one (they are hidden until zoomed in). */
const LABEL_PLACEMENT_MAX = 400;
/** Up to this many people each is a Tab stop; above, the keyboard path is "Find a person". */
const KEYBOARD_STOPS_MAX = 400;
/** Arrow keys move the selection this far (with Shift, five times as far). */
const KEY_STEP = 10;

/**
 * The communication map: d3-force layout, drawn in SVG with presentation attributes (so the
 * PNG export looks the same). Per frame it touches only what moved: a drag updates the dragged
 * people and their own ties; a layout tick updates positions and nothing else.
 */
@Component({
  selector: 'app-room-map',
  templateUrl: './room-map.html',
  styleUrl: './room-map.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // The drawing is built with DOM calls, so its styles cannot be scoped by Angular.
  encapsulation: ViewEncapsulation.None,
  host: { class: 'rh-room-map' },
})
export class RoomMap implements OnDestroy {
  private readonly editor = inject(RoomEditor);
  readonly tool = input<MapTool>('select');
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly overlayRef = viewChild.required<ElementRef<SVGSVGElement>>('overlay');

  readonly mode = signal<LayoutMode>('full');
  protected readonly band = signal<{ x: number; y: number; w: number; h: number } | null>(null);
  protected readonly layoutRunning = signal(false);

  private nodes = new Map<string, MapNode>();
  private links: MapLink[] = [];
  private adjacency = new Map<string, MapLink[]>();
  private sim: Simulation<MapNode, MapLink> | null = null;
  private zoomer!: ZoomBehavior<SVGSVGElement, unknown>;
  private transform: ZoomTransform = zoomIdentity;
  private viewport!: SVGGElement;
  private tieLayer!: SVGGElement;
  private peopleLayer!: SVGGElement;
  private draft!: SVGLineElement;
  private overlayViewport!: SVGGElement;
  private overlayTies!: SVGGElement;
  private overlayPeople!: SVGGElement;
  private highlight!: SVGCircleElement;
  private highlighted: string | null = null;
  private ready = false;
  private gestureBase: ZoomTransform | null = null;
  private signature = '';
  private elements = new Map<string, SVGGElement>();
  private tieElements = new Map<string, SVGLineElement>();
  private fitted = false;
  private labelsShown = true;
  /** People the running layout must not move (it only places newcomers). */
  private held = new Set<string>();

  constructor() {
    effect(() => {
      this.editor.revision();
      this.editor.room();
      untracked(() => this.sync());
    });
    effect(() => {
      this.editor.selectionRevision();
      untracked(() => this.paintSelection());
    });
  }

  ngOnDestroy(): void {
    this.sim?.stop();
  }

  // ---- building the drawing ----

  private setup(): void {
    const svg = this.svgRef().nativeElement;
    svg.replaceChildren();
    this.viewport = el('g', { class: 'viewport' });
    this.tieLayer = el('g', { class: 'ties' });
    this.peopleLayer = el('g', { class: 'people' });
    this.draft = el('line', { stroke: CLAY, 'stroke-width': 2.5, 'stroke-dasharray': '6 4', visibility: 'hidden' });
    this.highlight = el('circle', { r: R + 9, fill: 'none', stroke: CLAY, 'stroke-width': 3, visibility: 'hidden', class: 'rh-find-ring' });
    this.viewport.append(this.tieLayer, this.draft, this.peopleLayer, this.highlight);
    svg.append(this.viewport);
    // People being dragged (and their ties) move to a composited layer of their own, so a drag
    // frame repaints a few shapes instead of the whole map.
    const overlay = this.overlayRef().nativeElement;
    this.overlayViewport = el('g', {});
    this.overlayTies = el('g', {});
    this.overlayPeople = el('g', {});
    this.overlayViewport.append(this.overlayTies, this.overlayPeople);
    overlay.replaceChildren(this.overlayViewport);
    this.zoomer = zoom<SVGSVGElement, unknown>()
      .scaleExtent([0.05, 6])
      // Shift + drag on the background is the rubber band, not a pan.
      .filter((e: MouseEvent & WheelEvent) => (!e.ctrlKey || e.type === 'wheel') && !e.button && !e.shiftKey)
      // During a pan or wheel gesture the drawing is moved as one composited layer (a CSS
      // transform relative to where the gesture began); the SVG itself is redrawn once, at the end.
      .on('start', (e: { sourceEvent: Event | null }) => {
        if (!e.sourceEvent) return;
        this.gestureBase = this.transform;
        svg.classList.add('rh-gesture');
        this.overlayRef().nativeElement.classList.add('rh-gesture');
      })
      .on('zoom', (e: { transform: ZoomTransform; sourceEvent: Event | null }) => {
        this.transform = e.transform;
        const base = this.gestureBase;
        if (base && e.sourceEvent) {
          const s = e.transform.k / base.k;
          const css = `translate(${e.transform.x - s * base.x}px, ${e.transform.y - s * base.y}px) scale(${s})`;
          svg.style.transform = css;
          this.overlayRef().nativeElement.style.transform = css;
          return;
        }
        this.applyTransform();
      })
      .on('end', () => {
        if (!this.gestureBase) return;
        this.gestureBase = null;
        const overlay = this.overlayRef().nativeElement;
        svg.style.transform = '';
        overlay.style.transform = '';
        svg.classList.remove('rh-gesture');
        overlay.classList.remove('rh-gesture');
        this.applyTransform();
      });
    select(svg).call(this.zoomer).on('dblclick.zoom', null);
    svg.addEventListener('pointerdown', (e) => this.startBand(e));
    svg.addEventListener('keydown', (e) => this.personKey(e));
    svg.addEventListener('click', (e) => this.backgroundClick(e));
    this.ready = true;
  }

  private sync(): void {
    const room = this.editor.room();
    if (!room) return;
    if (!this.ready) this.setup();
    const people = this.editor.people();
    const ties = this.editor.ties();
    const styles = groupStyles(this.editor.groups());
    const next = new Map<string, MapNode>();
    let newcomers = false;
    for (const p of people) {
      const old = this.nodes.get(p.lid);
      const n: MapNode = old ?? { lid: p.lid, group: p.group ?? '', pinned: p.pinned };
      n.group = p.group ?? '';
      n.pinned = p.pinned;
      if (p.x !== null && p.y !== null) {
        n.x = p.x;
        n.y = p.y;
      } else if (!old) newcomers = true;
      const fixed = p.pinned || this.held.has(p.lid);
      n.fx = fixed ? n.x : null;
      n.fy = fixed ? n.y : null;
      next.set(p.lid, n);
    }
    this.nodes = next;
    this.links = [];
    this.adjacency = new Map();
    for (const t of ties) {
      const s = next.get(t.source);
      const g = next.get(t.target);
      if (!s || !g) continue;
      const link: MapLink = { lid: t.lid, source: s, target: g, strength: t.strength };
      this.links.push(link);
      for (const end of [t.source, t.target]) {
        const list = this.adjacency.get(end) ?? [];
        list.push(link);
        this.adjacency.set(end, list);
      }
    }
    const nodes = [...next.values()];
    const signature = structureOf(people, ties, room.settings.directed);
    if (signature === this.signature && !newcomers) {
      // Only places changed (a move, an undo of a move): update positions, keep the elements.
      for (const n of nodes) n.el = this.elements.get(n.lid);
      for (const l of this.links) l.el = this.tieElements.get(l.lid);
      this.renderAll();
      this.paintPins(people);
      if (!this.layoutRunning()) this.placeNames();
      return;
    }
    this.signature = signature;
    const mode = layoutMode(nodes.length);
    this.mode.set(mode);
    const noneSaved = people.length > 0 && people.every((p) => p.x === null || p.y === null);
    // Newcomers to a drawn map start where the user is looking, not beside everyone else.
    if (!noneSaved && this.fitted && mode !== 'static')
      for (const n of nodes) if (n.x === undefined || n.y === undefined) [n.x, n.y] = this.freeSpotInView();
    placeUnplaced(nodes);
    this.drawTies(room.settings.directed);
    this.drawPeople(people, styles);
    this.elements = new Map(nodes.map((n) => [n.lid, n.el!]));
    this.tieElements = new Map(this.links.map((l) => [l.lid, l.el!]));
    this.labelsShown = nodes.length <= 150;
    this.updateLabelVisibility();
    this.placeNames();
    this.paintSelection();
    if (!this.fitted && nodes.length) {
      this.fit();
      this.fitted = true;
    }
    if (this.sim && this.layoutRunning()) {
      this.sim.nodes(nodes);
      this.sim.force<import('d3-force').ForceLink<MapNode, MapLink>>('link')?.links(this.links);
    }
    if (mode !== 'static' && newcomers && this.editor.canEdit()) this.runLayout(noneSaved);
    else if (newcomers) this.saveLayout(nodes.filter((n) => !n.pinned));
  }

  private drawTies(directed: boolean): void {
    const maxStrength = this.links.reduce((m, l) => Math.max(m, l.strength), 0);
    const frag = document.createDocumentFragment();
    for (const l of this.links) {
      const line = el('line', { stroke: TIE, 'stroke-width': tieWidth(l.strength, maxStrength).toFixed(2), 'stroke-linecap': 'round' });
      if (directed) line.setAttribute('marker-end', 'url(#rh-arrow)');
      l.el = line;
      this.placeTie(l);
      frag.append(line);
    }
    this.tieLayer.replaceChildren(frag);
    const svg = this.svgRef().nativeElement;
    if (directed && !svg.querySelector('#rh-arrow')) {
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
      svg.prepend(defs);
    }
  }

  private drawPeople(people: ReturnType<RoomEditor['people']>, styles: ReturnType<typeof groupStyles>): void {
    const frag = document.createDocumentFragment();
    const editable = this.editor.canEdit();
    const keyboard = people.length <= KEYBOARD_STOPS_MAX;
    for (const p of people) {
      const n = this.nodes.get(p.lid)!;
      const style = styles.get(p.group ?? '') ?? NO_GROUP_STYLE;
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
      const label = el('text', {
        y: R + 13,
        'text-anchor': 'middle',
        'font-size': 11,
        fill: INK,
        // Quoted: a family name with a digit in it is not a valid bare CSS identifier.
        'font-family': LABEL_FONT.family,
        class: 'label',
      });
      label.textContent = p.name;
      g.append(label);
      const title = el('title', {});
      title.textContent = p.group ? `${p.name} (${p.group})` : p.name;
      g.append(title);
      n.el = g;
      placeNode(n);
      frag.append(g);
    }
    this.peopleLayer.replaceChildren(frag);
    const sel = select(this.peopleLayer).selectAll<SVGGElement, unknown>('g.person');
    sel.data([...people.map((p) => this.nodes.get(p.lid)!)]);
    if (editable) this.attachDrag(sel as unknown as D3Selection<SVGGElement, MapNode, SVGGElement, unknown>);
    else sel.on('click', (e: MouseEvent, d) => this.clickPerson(e, d as MapNode));
  }

  private paintPins(people: ReturnType<RoomEditor['people']>): void {
    for (const p of people)
      this.elements
        .get(p.lid)
        ?.querySelector('.pin')
        ?.setAttribute('visibility', p.pinned ? 'visible' : 'hidden');
  }

  private placeTie(l: MapLink): void {
    const line = l.el!;
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
    line.setAttribute('x1', x1.toFixed(1));
    line.setAttribute('y1', y1.toFixed(1));
    line.setAttribute('x2', x2.toFixed(1));
    line.setAttribute('y2', y2.toFixed(1));
  }

  private renderAll(): void {
    for (const n of this.nodes.values()) placeNode(n);
    for (const l of this.links) this.placeTie(l);
    if (this.highlighted) this.placeHighlight();
  }

  /** Puts every name where it overlaps no other name and no person (label-placement.ts). */
  private placeNames(): void {
    const nodes = [...this.nodes.values()];
    if (!this.ready || nodes.length > LABEL_PLACEMENT_MAX) return;
    const spots = placeLabels(
      nodes.map((n) => ({ x: n.x ?? 0, y: n.y ?? 0, width: labelWidth(this.editor.model.people.get(n.lid)?.name ?? '') })),
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

  /** A free place near the middle of what the map shows now, for a new person. */
  freeSpotInView(): [number, number] {
    const svg = this.svgRef().nativeElement;
    const [cx, cy] = this.transform.invert([svg.clientWidth / 2 || 300, svg.clientHeight / 2 || 200]);
    const clear = (x: number, y: number) =>
      [...this.nodes.values()].every((n) => n.x === undefined || Math.hypot(n.x - x, (n.y ?? 0) - y) > R * 5);
    // Vogel's spiral outwards from the middle until a spot is clear of everyone.
    for (let i = 0; i < 400; i++) {
      const r = 18 * Math.sqrt(i);
      const x = Math.round(cx + r * Math.cos(i * 2.39996));
      const y = Math.round(cy + r * Math.sin(i * 2.39996));
      if (clear(x, y)) return [x, y];
    }
    return [Math.round(cx), Math.round(cy)];
  }

  // ---- layout ----

  /** Runs the force layout. With `all`, everyone not pinned moves; else only people new to the map. */
  runLayout(all = true): void {
    const nodes = [...this.nodes.values()];
    if (!nodes.length || this.mode() === 'static') return;
    this.sim?.stop();
    const held = new Set<MapNode>();
    this.held.clear();
    if (!all) {
      for (const n of nodes) {
        const p = this.editor.model.people.get(n.lid);
        if (p && p.x !== null && !n.pinned) {
          n.fx = n.x;
          n.fy = n.y;
          held.add(n);
          this.held.add(n.lid);
        }
      }
    }
    const sim = createSimulation(nodes, this.links, this.mode());
    this.sim = sim;
    this.layoutRunning.set(true);
    sim
      .alpha(all ? 1 : 0.5)
      .on('tick', () => this.renderAll())
      .on('end', () => {
        for (const n of held) {
          n.fx = null;
          n.fy = null;
        }
        this.held.clear();
        this.layoutRunning.set(false);
        this.renderAll();
        this.placeNames();
        this.saveLayout(nodes.filter((n) => !n.pinned && !held.has(n)));
        if (all) this.fit();
      })
      .restart();
  }

  stopLayout(): void {
    if (!this.sim) return;
    this.sim.stop();
    this.sim.on('end')?.call(this.sim);
  }

  private saveLayout(nodes: MapNode[]): void {
    const moves: Move[] = nodes.map((n) => ({ lid: n.lid, x: Math.round(n.x ?? 0), y: Math.round(n.y ?? 0), pinned: n.pinned }));
    this.editor.recordLayout(moves);
  }

  // ---- pointer interaction ----

  private attachDrag(sel: D3Selection<SVGGElement, MapNode, SVGGElement, unknown>): void {
    let moving: MapNode[] = [];
    let moved = false;
    let tieMode = false;
    let lifted: MapLink[] = [];
    const behaviour = drag<SVGGElement, MapNode>()
      .clickDistance(3)
      .on('start', (e: { sourceEvent: MouseEvent; subject: MapNode }) => {
        const d = e.subject;
        moved = false;
        tieMode = this.tool() === 'tie' || e.sourceEvent.altKey;
        if (tieMode) {
          attrs(this.draft, { x1: d.x!, y1: d.y!, x2: d.x!, y2: d.y!, visibility: 'visible' });
          return;
        }
        const s = this.editor.selection;
        if (e.sourceEvent.shiftKey) s.toggle(d.lid);
        else if (!s.has(d.lid)) s.only(d.lid);
        this.editor.selectionChanged();
        moving = s.has(d.lid)
          ? s
              .ids()
              .map((lid) => this.nodes.get(lid)!)
              .filter(Boolean)
          : [d];
        lifted = this.lift(moving);
        this.sim?.stop();
        this.layoutRunning.set(false);
      })
      .on('drag', (e: { x: number; y: number; dx: number; dy: number; subject: MapNode }) => {
        if (tieMode) {
          attrs(this.draft, { x2: e.x, y2: e.y });
          return;
        }
        moved = true;
        const touched = new Set<MapLink>();
        for (const n of moving) {
          n.x! += e.dx;
          n.y! += e.dy;
          if (n.pinned) {
            n.fx = n.x;
            n.fy = n.y;
          }
          placeNode(n);
          for (const l of this.adjacency.get(n.lid) ?? []) touched.add(l);
        }
        for (const l of touched) this.placeTie(l);
        if (this.highlighted) this.placeHighlight();
      })
      .on('end', (e: { x: number; y: number; subject: MapNode }) => {
        if (tieMode) {
          this.draft.setAttribute('visibility', 'hidden');
          const target = this.personAt(e.x, e.y, e.subject.lid);
          if (target) {
            const { lid } = this.editor.addTie(e.subject.lid, target.lid);
            this.editor.selection.selectTie(lid);
            this.editor.selectionChanged();
          }
          return;
        }
        this.drop(moving, lifted);
        if (!moved) return;
        this.placeNames();
        this.editor.movePeople(
          moving.map((n) => ({ lid: n.lid, x: Math.round(n.x!), y: Math.round(n.y!), pinned: n.pinned })),
          moving.length === 1 ? 'Move person' : `Move ${moving.length} people`,
        );
      });
    sel.call(behaviour);
  }

  private lift(nodes: MapNode[]): MapLink[] {
    const links = new Set<MapLink>();
    for (const n of nodes) for (const l of this.adjacency.get(n.lid) ?? []) links.add(l);
    for (const l of links) if (l.el) this.overlayTies.append(l.el);
    for (const n of nodes) if (n.el) this.overlayPeople.append(n.el);
    return [...links];
  }

  private drop(nodes: MapNode[], links: MapLink[]): void {
    for (const l of links) if (l.el) this.tieLayer.append(l.el);
    for (const n of nodes) if (n.el) this.peopleLayer.append(n.el);
  }

  private clickPerson(e: MouseEvent, d: MapNode): void {
    e.stopPropagation();
    if (e.shiftKey) this.editor.selection.toggle(d.lid);
    else this.editor.selection.only(d.lid);
    this.editor.selectionChanged();
  }

  private personAt(x: number, y: number, except: string): MapNode | null {
    let best: MapNode | null = null;
    let bestD = (R + 8) ** 2;
    for (const n of this.nodes.values()) {
      if (n.lid === except) continue;
      const d = (n.x! - x) ** 2 + (n.y! - y) ** 2;
      if (d < bestD) {
        bestD = d;
        best = n;
      }
    }
    return best;
  }

  /** Enter or Space selects the focused person (Shift adds to the selection); arrow keys move the selection. */
  private personKey(e: KeyboardEvent): void {
    const g = (e.target as Element).closest?.('g.person');
    const lid = g?.getAttribute('data-lid');
    if (!lid || !this.nodes.has(lid)) return;
    const s = this.editor.selection;
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      if (e.shiftKey) s.toggle(lid);
      else s.only(lid);
      this.editor.selectionChanged();
      return;
    }
    const step = KEY_STEP * (e.shiftKey ? 5 : 1);
    const delta: Record<string, [number, number]> = {
      ArrowLeft: [-step, 0],
      ArrowRight: [step, 0],
      ArrowUp: [0, -step],
      ArrowDown: [0, step],
    };
    const d = delta[e.key];
    if (!d || !this.editor.canEdit()) return;
    e.preventDefault();
    if (!s.has(lid)) {
      s.only(lid);
      this.editor.selectionChanged();
    }
    const moves = s
      .ids()
      .map((id) => this.nodes.get(id))
      .filter((n): n is MapNode => !!n)
      .map((n) => ({ lid: n.lid, x: Math.round((n.x ?? 0) + d[0]), y: Math.round((n.y ?? 0) + d[1]), pinned: n.pinned }));
    this.sim?.stop();
    this.layoutRunning.set(false);
    // The nodes take their new places now: a second key pressed before the redraw moves on from
    // here, not from where the person was before the first key.
    for (const m of moves) {
      const n = this.nodes.get(m.lid);
      if (!n) continue;
      n.x = m.x;
      n.y = m.y;
      if (n.fx != null) n.fx = m.x;
      if (n.fy != null) n.fy = m.y;
    }
    this.editor.movePeople(moves);
  }

  private toGraph(e: MouseEvent): [number, number] {
    const rect = this.svgRef().nativeElement.getBoundingClientRect();
    return this.transform.invert([e.clientX - rect.left, e.clientY - rect.top]);
  }

  private backgroundClick(e: MouseEvent): void {
    if ((e.target as Element).closest('g.person')) return;
    if (e.shiftKey) return; // end of a rubber band
    const [x, y] = this.toGraph(e);
    const tol = 6 / this.transform.k;
    let hit: MapLink | null = null;
    let best = tol;
    for (const l of this.links) {
      const d = segmentDistance(x, y, l.source.x!, l.source.y!, l.target.x!, l.target.y!);
      if (d < best) {
        best = d;
        hit = l;
      }
    }
    if (hit) this.editor.selection.selectTie(hit.lid);
    else this.editor.selection.clear();
    this.editor.selectionChanged();
  }

  private startBand(e: PointerEvent): void {
    if (!e.shiftKey || e.button !== 0 || (e.target as Element).closest('g.person')) return;
    const svg = this.svgRef().nativeElement;
    const rect = svg.getBoundingClientRect();
    const x0 = e.clientX - rect.left;
    const y0 = e.clientY - rect.top;
    svg.setPointerCapture(e.pointerId);
    const move = (m: PointerEvent) => {
      const x = m.clientX - rect.left;
      const y = m.clientY - rect.top;
      this.band.set({ x: Math.min(x0, x), y: Math.min(y0, y), w: Math.abs(x - x0), h: Math.abs(y - y0) });
    };
    const up = (u: PointerEvent) => {
      svg.removeEventListener('pointermove', move);
      svg.removeEventListener('pointerup', up);
      this.band.set(null);
      const [gx0, gy0] = this.transform.invert([x0, y0]);
      const [gx1, gy1] = this.transform.invert([u.clientX - rect.left, u.clientY - rect.top]);
      const pts = [...this.nodes.values()].map((n) => ({ lid: n.lid, x: n.x!, y: n.y! }));
      this.editor.selection.box(pts, gx0, gy0, gx1, gy1, true);
      this.editor.selectionChanged();
    };
    svg.addEventListener('pointermove', move);
    svg.addEventListener('pointerup', up);
  }

  private paintSelection(): void {
    if (!this.ready) return;
    const s = this.editor.selection;
    for (const n of this.nodes.values()) {
      const shape = n.el?.querySelector('.shape');
      if (!shape) continue;
      const on = s.has(n.lid);
      shape.setAttribute('stroke', on ? CLAY : INK);
      shape.setAttribute('stroke-width', on ? '3.5' : '1.4');
      n.el!.classList.toggle('selected', on);
      n.el!.setAttribute('aria-pressed', String(on));
    }
    const maxStrength = this.links.reduce((m, l) => Math.max(m, l.strength), 0);
    for (const l of this.links) {
      const on = s.tie === l.lid;
      l.el?.setAttribute('stroke', on ? CLAY : TIE);
      l.el?.setAttribute('stroke-width', (tieWidth(l.strength, maxStrength) + (on ? 2 : 0)).toFixed(2));
    }
  }

  private applyTransform(): void {
    this.viewport.setAttribute('transform', this.transform.toString());
    this.overlayViewport.setAttribute('transform', this.transform.toString());
    this.updateLabelVisibility();
  }

  private updateLabelVisibility(): void {
    if (!this.ready) return;
    const show = this.labelsShown || this.transform.k >= 1.4;
    this.peopleLayer.setAttribute('class', show ? 'people' : 'people no-labels');
  }

  // ---- view commands (toolbar) ----

  zoomBy(factor: number): void {
    select(this.svgRef().nativeElement).call(this.zoomer.scaleBy, factor);
  }

  fit(): void {
    const nodes = [...this.nodes.values()];
    const svg = this.svgRef().nativeElement;
    if (!nodes.length || !svg.clientWidth) return;
    const xs = nodes.map((n) => n.x!);
    const ys = nodes.map((n) => n.y!);
    const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
    const pad = 48;
    const k = Math.min(1.6, (svg.clientWidth - pad * 2) / Math.max(x1 - x0, 1), (svg.clientHeight - pad * 2) / Math.max(y1 - y0, 1));
    const t = zoomIdentity
      .translate(svg.clientWidth / 2, svg.clientHeight / 2)
      .scale(k)
      .translate(-(x0 + x1) / 2, -(y0 + y1) / 2);
    select(svg).call(this.zoomer.transform, t);
  }

  /** Centres the map on a person and rings them. */
  find(lid: string): void {
    const n = this.nodes.get(lid);
    const svg = this.svgRef().nativeElement;
    if (!n) return;
    const k = Math.max(this.transform.k, 1.5);
    const t = zoomIdentity
      .translate(svg.clientWidth / 2, svg.clientHeight / 2)
      .scale(k)
      .translate(-n.x!, -n.y!);
    select(svg).call(this.zoomer.transform, t);
    this.highlighted = lid;
    this.placeHighlight();
    this.highlight.setAttribute('visibility', 'visible');
  }

  private placeHighlight(): void {
    const n = this.highlighted ? this.nodes.get(this.highlighted) : undefined;
    if (!n) {
      this.highlight.setAttribute('visibility', 'hidden');
      return;
    }
    attrs(this.highlight, { cx: n.x!, cy: n.y! });
  }

  /** The map as a stand-alone SVG document (for the PNG export), framed around everyone. */
  svgForExport(): { svg: string; width: number; height: number } | null {
    const nodes = [...this.nodes.values()];
    if (!nodes.length) return null;
    // The frame is the drawn content's own box (names included, so none is cut at the edge),
    // in the viewport group's coordinates, i.e. before the pan and zoom.
    const pad = 24;
    // The hidden helpers (the tie draft line, the find ring) are left out of the frame.
    const boxes = [this.peopleLayer.getBBox(), this.tieLayer.getBBox()].filter((b) => b.width > 0 || b.height > 0);
    const xs = nodes.map((n) => n.x!);
    const ys = nodes.map((n) => n.y!);
    const x0 = Math.min(...boxes.map((b) => b.x), ...xs) - pad;
    const y0 = Math.min(...boxes.map((b) => b.y), ...ys) - pad;
    const width = Math.max(...boxes.map((b) => b.x + b.width), ...xs) - x0 + pad;
    const height = Math.max(...boxes.map((b) => b.y + b.height), ...ys) - y0 + pad;
    const clone = this.svgRef().nativeElement.cloneNode(true) as SVGSVGElement;
    clone.setAttribute('xmlns', SVG_NS);
    clone.setAttribute('viewBox', `${x0} ${y0} ${width} ${height}`);
    clone.setAttribute('width', String(Math.round(width)));
    clone.setAttribute('height', String(Math.round(height)));
    clone.querySelector('.viewport')?.removeAttribute('transform');
    clone.querySelector('.rh-find-ring')?.remove();
    clone.querySelector('.people')?.setAttribute('class', 'people');
    const bg = document.createElementNS(SVG_NS, 'rect');
    attrs(bg, { x: x0, y: y0, width, height, fill: '#ffffff' });
    clone.prepend(bg);
    return { svg: new XMLSerializer().serializeToString(clone), width, height };
  }
}

/** What needs a redraw when it changes (positions and pins do not). */
function structureOf(people: ReturnType<RoomEditor['people']>, ties: ReturnType<RoomEditor['ties']>, directed: boolean): string {
  let s = directed ? 'd' : 'u';
  for (const p of people) s += `|${p.lid}\u0001${p.name}\u0001${p.group ?? ''}`;
  s += '#';
  for (const t of ties) s += `|${t.lid}\u0001${t.source}\u0001${t.target}\u0001${t.strength}`;
  return s;
}

function el<K extends keyof SVGElementTagNameMap>(tag: K, a: Record<string, string | number>): SVGElementTagNameMap[K] {
  const node = document.createElementNS(SVG_NS, tag);
  attrs(node, a);
  return node;
}

function attrs(node: Element, a: Record<string, string | number>): void {
  for (const [k, v] of Object.entries(a)) node.setAttribute(k, String(v));
}

function placeNode(n: MapNode): void {
  n.el?.setAttribute('transform', `translate(${(n.x ?? 0).toFixed(1)},${(n.y ?? 0).toFixed(1)})`);
}

function segmentDistance(px: number, py: number, x1: number, y1: number, x2: number, y2: number): number {
  const dx = x2 - x1;
  const dy = y2 - y1;
  const len2 = dx * dx + dy * dy;
  const t = len2 ? Math.max(0, Math.min(1, ((px - x1) * dx + (py - y1) * dy) / len2)) : 0;
  return Math.hypot(px - (x1 + t * dx), py - (y1 + t * dy));
}
