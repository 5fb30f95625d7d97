import { drag } from 'd3-drag';
import { select } from 'd3-selection';
import type { RoomEditor } from '../editor/room-editor';
import type { Move } from '../editor/room-model';
import type { MapGraph } from './map-graph';
import type { MapLink, MapNode } from './map-layout';
import type { MapRenderer } from './map-renderer';
import type { MapZoom } from './map-zoom';

export type MapTool = 'select' | 'tie';
export interface Band {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Arrow keys move the selection this far (with Shift, five times as far). */
export const KEY_STEP = 10;
/** A press that moves less than this many pixels is a click, not a drag. */
const CLICK_DISTANCE = 3;
/** How near (in screen pixels) a click must come to a tie to select it. */
const TIE_TOLERANCE = 6;

/** What the gestures act on: the map component hands these over. */
export interface MapGestureHost {
  readonly editor: RoomEditor;
  readonly graph: MapGraph;
  readonly renderer: MapRenderer;
  readonly zoom: MapZoom;
  tool(): MapTool;
  /** Stops a running layout (a person moved by hand stays where they were put). */
  haltLayout(): void;
  placeNames(): void;
  showBand(band: Band | null): void;
}

/** One press on a person, from pointer down to pointer up. */
interface Press {
  subject: MapNode;
  /** Drawing a tie (the tie tool, or Alt held) rather than moving people. */
  tie: boolean;
  moving: MapNode[];
  lifted: MapLink[];
  moved: boolean;
}

interface DragEvent {
  x: number;
  y: number;
  dx: number;
  dy: number;
  subject: MapNode;
  sourceEvent: MouseEvent;
}

/**
 * What the pointer and the keyboard do on the map: click and Shift-click select, a drag moves the
 * selection (or draws a tie with the tie tool or Alt), Shift-drag on the background is a rubber
 * band, a click near a tie selects it; Enter or Space selects the focused person, arrow keys move.
 */
export class MapGestures {
  private press: Press | null = null;

  constructor(private readonly host: MapGestureHost) {}

  /** Listens on the map for the rubber band, the keyboard and clicks on the background. */
  listen(svg: SVGSVGElement): void {
    svg.addEventListener('pointerdown', (e) => this.startBand(svg, e));
    svg.addEventListener('keydown', (e) => this.personKey(e));
    svg.addEventListener('click', (e) => this.backgroundClick(e));
  }

  /** Binds the drawn people to their nodes: drag (editors) or click (viewers). */
  bindPeople(layer: SVGGElement, nodes: readonly MapNode[], editable: boolean): void {
    const sel = select(layer).selectAll<SVGGElement, MapNode>('g.person').data(nodes);
    if (!editable) {
      sel.on('click', (e: MouseEvent, d) => this.clickPerson(e, d));
      return;
    }
    const behaviour = drag<SVGGElement, MapNode>()
      .clickDistance(CLICK_DISTANCE)
      .on('start', (e: DragEvent) => this.dragStart(e))
      .on('drag', (e: DragEvent) => this.dragMove(e))
      .on('end', (e: DragEvent) => this.dragEnd(e));
    sel.call(behaviour);
  }

  private dragStart(e: DragEvent): void {
    const { editor, graph, renderer } = this.host;
    const d = e.subject;
    const tie = this.host.tool() === 'tie' || e.sourceEvent.altKey;
    if (tie) {
      this.press = { subject: d, tie, moving: [], lifted: [], moved: false };
      renderer.startDraft(d.x ?? 0, d.y ?? 0);
      return;
    }
    const s = editor.selection;
    if (e.sourceEvent.shiftKey) s.toggle(d.lid);
    else if (!s.has(d.lid)) s.only(d.lid);
    editor.selectionChanged();
    const moving = s.has(d.lid) ? s.ids().flatMap((lid) => graph.node(lid) ?? []) : [d];
    const lifted = graph.tiesAround(moving);
    renderer.lift(moving, lifted);
    this.press = { subject: d, tie, moving, lifted, moved: false };
    this.host.haltLayout();
  }

  private dragMove(e: DragEvent): void {
    const press = this.press;
    if (!press) return;
    if (press.tie) {
      this.host.renderer.stretchDraft(e.x, e.y);
      return;
    }
    press.moved = true;
    for (const n of press.moving) {
      n.x = (n.x ?? 0) + e.dx;
      n.y = (n.y ?? 0) + e.dy;
      if (n.pinned) {
        n.fx = n.x;
        n.fy = n.y;
      }
    }
    this.host.renderer.placeSome(this.host.graph, press.moving);
  }

  private dragEnd(e: DragEvent): void {
    const press = this.press;
    this.press = null;
    if (!press) return;
    const { editor, graph, renderer } = this.host;
    if (press.tie) {
      renderer.endDraft();
      const target = graph.personAt(e.x, e.y, e.subject.lid);
      if (!target) return;
      const { lid } = editor.addTie(e.subject.lid, target.lid);
      editor.selection.selectTie(lid);
      editor.selectionChanged();
      return;
    }
    renderer.drop(press.moving, press.lifted);
    if (!press.moved) return;
    this.host.placeNames();
    const moves = press.moving.map((n) => ({ lid: n.lid, x: Math.round(n.x ?? 0), y: Math.round(n.y ?? 0), pinned: n.pinned }));
    editor.movePeople(moves, moves.length === 1 ? 'Move person' : `Move ${moves.length} people`);
  }

  private clickPerson(e: MouseEvent, d: MapNode): void {
    e.stopPropagation();
    const { editor } = this.host;
    if (e.shiftKey) editor.selection.toggle(d.lid);
    else editor.selection.only(d.lid);
    editor.selectionChanged();
  }

  /** Enter or Space selects the focused person (Shift adds to the selection); arrow keys move the selection. */
  personKey(e: KeyboardEvent): void {
    const { editor, graph } = this.host;
    const lid = (e.target as Element).closest?.('g.person')?.getAttribute('data-lid');
    if (!lid || !graph.node(lid)) return;
    const s = editor.selection;
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      if (e.shiftKey) s.toggle(lid);
      else s.only(lid);
      editor.selectionChanged();
      return;
    }
    const d = keyDelta(e.key, e.shiftKey);
    if (!d || !editor.canEdit()) return;
    e.preventDefault();
    if (!s.has(lid)) {
      s.only(lid);
      editor.selectionChanged();
    }
    nudgeSelection(this.host, d);
  }

  /** A click beside everyone selects the tie under it, or clears the selection. */
  backgroundClick(e: MouseEvent): void {
    if ((e.target as Element).closest('g.person')) return;
    if (e.shiftKey) return; // end of a rubber band
    const { editor, graph, zoom } = this.host;
    const [x, y] = zoom.toGraph(e);
    const hit = graph.tieAt(x, y, TIE_TOLERANCE / zoom.transform.k);
    if (hit) editor.selection.selectTie(hit.lid);
    else editor.selection.clear();
    editor.selectionChanged();
  }

  /** Shift + drag on the background: everyone inside the box joins the selection. */
  private startBand(svg: SVGSVGElement, e: PointerEvent): void {
    if (!e.shiftKey || e.button !== 0 || (e.target as Element).closest('g.person')) return;
    const rect = svg.getBoundingClientRect();
    const x0 = e.clientX - rect.left;
    const y0 = e.clientY - rect.top;
    svg.setPointerCapture(e.pointerId);
    const move = (m: PointerEvent) => {
      const x = m.clientX - rect.left;
      const y = m.clientY - rect.top;
      this.host.showBand({ x: Math.min(x0, x), y: Math.min(y0, y), w: Math.abs(x - x0), h: Math.abs(y - y0) });
    };
    const up = (u: PointerEvent) => {
      svg.removeEventListener('pointermove', move);
      svg.removeEventListener('pointerup', up);
      this.host.showBand(null);
      const { editor, graph, zoom } = this.host;
      const [gx0, gy0] = zoom.invert([x0, y0]);
      const [gx1, gy1] = zoom.invert([u.clientX - rect.left, u.clientY - rect.top]);
      editor.selection.box(graph.points(), gx0, gy0, gx1, gy1, true);
      editor.selectionChanged();
    };
    svg.addEventListener('pointermove', move);
    svg.addEventListener('pointerup', up);
  }
}

/** Moves everyone selected by d (an arrow key), halting a running layout. */
export function nudgeSelection(host: Pick<MapGestureHost, 'editor' | 'graph' | 'haltLayout'>, d: [number, number]): void {
  const { editor, graph } = host;
  const moves = editor.selection.ids().flatMap((id): Move[] => {
    const n = graph.node(id);
    return n ? [{ lid: n.lid, x: Math.round((n.x ?? 0) + d[0]), y: Math.round((n.y ?? 0) + d[1]), pinned: n.pinned }] : [];
  });
  if (!moves.length) return;
  host.haltLayout();
  // The nodes take their new places now: a second key pressed before the redraw moves on from
  // here, not from where the person was before the first key.
  for (const m of moves) {
    const n = graph.node(m.lid);
    if (!n) continue;
    n.x = m.x;
    n.y = m.y;
    if (n.fx != null) n.fx = m.x;
    if (n.fy != null) n.fy = m.y;
  }
  editor.movePeople(moves);
}

/** How far an arrow key moves the selection ([dx, dy]), or null for any other key. */
export function keyDelta(key: string, shift: boolean): [number, number] | null {
  const step = KEY_STEP * (shift ? 5 : 1);
  switch (key) {
    case 'ArrowLeft':
      return [-step, 0];
    case 'ArrowRight':
      return [step, 0];
    case 'ArrowUp':
      return [0, -step];
    case 'ArrowDown':
      return [0, step];
    default:
      return null;
  }
}
