import { quadtree, type Quadtree } from 'd3-quadtree';
import type { EditorPerson } from '../editor/room-model';
import type { Selection } from '../editor/selection';
import { shapeCorners, traceShape } from './canvas-shapes';
import { type GroupStyle, NO_GROUP_STYLE, tieWidth } from './group-style';
import { LABEL_FONT, labelWidth } from './label-font';
import { type MapGraph, PERSON_RADIUS as R } from './map-graph';
import type { MapLink, MapNode } from './map-layout';
import { CLAY, INK } from './map-renderer';
import {
  drawArrows,
  drawGroup,
  drawHollows,
  drawPins,
  drawTies,
  fitCanvas,
  ring,
  strokeSegments,
  type StyledGroup,
  type TieBatch,
  type View,
  visibleBox,
} from './overview-paint';

export type { View } from './overview-paint';

/**
 * From this many people the map is one picture on a canvas (the overview) instead of one SVG
 * element per person and tie. Measured with tests/bench/large-map.ts in Chromium on the shared
 * 2-core box (medians of 5, SVG against canvas): one "Zoom in" step takes 164 against 46 ms at
 * 1,500 people, 349 against 37 ms at 3,000 and about 1.9 s against 75 ms at 20,000; past about
 * 100 ms a zoom no longer feels immediate. Below this the SVG map stays, with dragging and tie
 * drawing on the map.
 */
export const OVERVIEW_FROM = 1500;

export function usesOverview(people: number): boolean {
  return people >= OVERVIEW_FROM;
}

/** Names show from this zoom on, for the people on screen. */
export const OVERVIEW_LABEL_ZOOM = 0.9;
/** With more people than this on screen no names are written (only the selected and found ones). */
export const OVERVIEW_LABELS_MAX = 250;
/** A person is never drawn smaller than this radius on screen (px), so a zoomed-out room still reads. */
const MIN_SCREEN_RADIUS = 1.8;
/** How far (screen px) beyond a person's shape a click still picks them. */
const PICK_SLOP = 4;
/** From this zoom on, pins, hollow centres and arrow heads are drawn. */
const DETAIL_ZOOM = 0.6;
const PAPER = '#fffdf9';

/** A name to write: its person and the box it takes on screen. */
export interface Label {
  node: MapNode;
  x: number;
  y: number;
  width: number;
}

/**
 * Draws a large room on one canvas: ties batched into one path per width, people into one path
 * per group, names only when zoomed in and only for people on screen. It redraws at most once
 * per animation frame, and finds the person under the pointer with a quadtree.
 */
export class OverviewRenderer {
  private readonly ctx: CanvasRenderingContext2D;
  private groups: StyledGroup[] = [];
  private batches: TieBatch[] = [];
  private names = new Map<string, string>();
  private pinned = new Set<string>();
  private directed = false;
  private graph: MapGraph | null = null;
  private tree: Quadtree<MapNode> | null = null;
  private view: View = { k: 1, x: 0, y: 0, width: 0, height: 0 };
  private marks: Marks = NO_MARKS;
  private frame = 0;
  /** Called after each frame drawn with people in it (the map says it is ready). */
  onDrawn: (() => void) | null = null;

  constructor(readonly canvas: HTMLCanvasElement) {
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('This browser cannot draw the map overview (no 2D canvas).');
    this.ctx = ctx;
  }

  /** Takes the room anew (its structure changed): groups, tie widths, names, pins. */
  setRoom(graph: MapGraph, people: readonly EditorPerson[], styles: ReadonlyMap<string, GroupStyle>, directed: boolean): void {
    this.graph = graph;
    this.directed = directed;
    this.names = new Map(people.map((p) => [p.lid, p.name]));
    this.setPins(people);
    this.groups = groupNodes(graph, styles);
    this.batches = batchTies(graph);
    this.placesChanged();
  }

  setPins(people: readonly EditorPerson[]): void {
    this.pinned = new Set(people.filter((p) => p.pinned).map((p) => p.lid));
    this.requestDraw();
  }

  /** People moved (a layout step, an undo): the next pick rebuilds the quadtree. */
  placesChanged(): void {
    this.tree = null;
    this.requestDraw();
  }

  setView(view: View): void {
    this.view = view;
    this.requestDraw();
  }

  setSelection(s: Selection): void {
    this.mark({ selected: new Set(s.ids()), tie: s.tie });
  }

  ringPerson(lid: string): void {
    this.mark({ ringed: lid });
  }

  /** The person under the pointer: their name is written at any zoom. */
  setHovered(lid: string | null): void {
    if (lid !== this.marks.hovered) this.mark({ hovered: lid });
  }

  /** The canvas has the keyboard focus: the selected person gets the focus ring. */
  setFocused(focused: boolean): void {
    this.mark({ focused });
  }

  private mark(changes: Partial<Marks>): void {
    this.marks = { ...this.marks, ...changes };
    this.requestDraw();
  }

  /** The person whose shape is under the screen point (sx, sy), if any. */
  personAt(sx: number, sy: number): MapNode | null {
    const { k, x, y } = this.view;
    this.tree ??= quadtree(this.graph?.nodeList() ?? [], nodeX, nodeY);
    const radius = (Math.max(R * k, MIN_SCREEN_RADIUS) + PICK_SLOP) / k;
    return this.tree.find((sx - x) / k, (sy - y) / k, radius) ?? null;
  }

  /** The names the current view writes. */
  labels(view = this.view, marks = this.marks): Label[] {
    const always = new Set([...marks.selected, ...[marks.ringed, marks.hovered].filter((lid) => lid !== null)]);
    return labelledPeople(this.graph?.nodes.values() ?? [], view, always, (lid) => this.names.get(lid) ?? '');
  }

  requestDraw(): void {
    if (this.frame) return;
    this.frame = requestAnimationFrame(() => {
      this.frame = 0;
      this.drawNow();
    });
  }

  /** Draws the whole view at once (the animation frame calls it; so can a test). */
  drawNow(): void {
    const { ctx, canvas, view } = this;
    const dpr = window.devicePixelRatio || 1;
    fitCanvas(canvas, view, dpr);
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.clearRect(0, 0, canvas.width, canvas.height);
    if (!this.graph || !view.width) return;
    ctx.setTransform(dpr * view.k, 0, 0, dpr * view.k, dpr * view.x, dpr * view.y);
    this.paint(ctx, view, this.marks);
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    this.writeNames(ctx, view, this.marks);
    if (this.graph.size) this.onDrawn?.();
  }

  /** Draws everyone, unselected, into another context framed by `view` at `scale` (the PNG export). */
  drawInto(ctx: CanvasRenderingContext2D, view: View, scale: number): void {
    ctx.setTransform(scale * view.k, 0, 0, scale * view.k, scale * view.x, scale * view.y);
    this.paint(ctx, view, NO_MARKS);
    ctx.setTransform(scale, 0, 0, scale, 0, 0);
    this.writeNames(ctx, view, NO_MARKS);
  }

  private paint(ctx: CanvasRenderingContext2D, view: View, marks: Marks): void {
    const box = visibleBox(view);
    const k = view.k;
    drawTies(ctx, this.batches, box, k);
    if (this.directed && k >= DETAIL_ZOOM) drawArrows(ctx, this.batches, box);
    this.paintSelectedTies(ctx, marks, k);
    const s = personScale(k);
    for (const g of this.groups) drawGroup(ctx, g, box, s, k);
    if (k >= DETAIL_ZOOM) {
      drawHollows(ctx, this.groups, box);
      drawPins(ctx, this.graph?.nodes.values() ?? [], this.pinned, box);
    }
    this.paintSelected(ctx, marks, s, k);
  }

  /** The selected tie and the selected people's ties in clay, above the other ties and below everyone. */
  private paintSelectedTies(ctx: CanvasRenderingContext2D, marks: Marks, k: number): void {
    const graph = this.graph;
    if (!graph || (!marks.tie && !marks.selected.size)) return;
    const max = graph.maxStrength();
    const ties = new Set(marks.tie ? graph.links.filter((l) => l.lid === marks.tie) : []);
    for (const lid of marks.selected) for (const l of graph.tiesOf(lid)) ties.add(l);
    for (const l of ties) strokeSegments(ctx, [l], CLAY, tieWidth(l.strength, max) + 2, k);
  }

  /** The selected people's outlines in clay on top of everyone, then the find and focus rings. */
  private paintSelected(ctx: CanvasRenderingContext2D, marks: Marks, s: number, k: number): void {
    const graph = this.graph;
    if (!graph) return;
    for (const g of this.groups) {
      const chosen = g.nodes.filter((n) => marks.selected.has(n.lid));
      if (!chosen.length) continue;
      ctx.beginPath();
      for (const n of chosen) traceShape(ctx, g.corners, R, n.x ?? 0, n.y ?? 0, s);
      ctx.fillStyle = g.style.fill;
      ctx.fill();
      ctx.strokeStyle = CLAY;
      ctx.lineWidth = Math.max(3.5, 2.5 / k);
      ctx.stroke();
    }
    const ringed = marks.ringed ? graph.node(marks.ringed) : undefined;
    if (ringed) ring(ctx, ringed, (R + 9) * s, CLAY, Math.max(3, 2 / k), []);
    const focus = marks.focused ? graph.node([...marks.selected].at(-1) ?? '') : undefined;
    if (focus) ring(ctx, focus, (R + 6) * s, INK, Math.max(2, 1.5 / k), [4 / Math.min(k, 1), 3 / Math.min(k, 1)]);
  }

  private writeNames(ctx: CanvasRenderingContext2D, view: View, marks: Marks): void {
    const labels = this.labels(view, marks);
    if (!labels.length) return;
    const size = labelSize(view.k);
    ctx.textAlign = 'center';
    ctx.textBaseline = 'top';
    ctx.lineJoin = 'round';
    for (const l of labels) {
      const strong = marks.selected.has(l.node.lid) || l.node.lid === marks.ringed;
      ctx.font = `${strong ? 600 : 400} ${size}px ${LABEL_FONT.family}`;
      const text = this.names.get(l.node.lid) ?? '';
      ctx.lineWidth = 3;
      ctx.strokeStyle = PAPER;
      ctx.strokeText(text, l.x + l.width / 2, l.y);
      ctx.fillStyle = strong ? CLAY : INK;
      ctx.fillText(text, l.x + l.width / 2, l.y);
    }
  }
}

/** What is marked on the map beside the room itself: selection, find ring, pointer, focus. */
interface Marks {
  selected: ReadonlySet<string>;
  tie: string | null;
  ringed: string | null;
  hovered: string | null;
  focused: boolean;
}

const NO_MARKS: Marks = { selected: new Set(), tie: null, ringed: null, hovered: null, focused: false };

const nodeX = (n: MapNode) => n.x ?? 0;
const nodeY = (n: MapNode) => n.y ?? 0;

/** How much larger than life a person is drawn at zoom k, so they keep MIN_SCREEN_RADIUS. */
export function personScale(k: number): number {
  return Math.max(1, MIN_SCREEN_RADIUS / (R * k));
}

function labelSize(k: number): number {
  return Math.round(Math.min(14, Math.max(11, LABEL_FONT.size * k)));
}

/**
 * Which people get their name written in this view: none below OVERVIEW_LABEL_ZOOM, none when
 * more than OVERVIEW_LABELS_MAX people are on screen; else each on-screen person whose name,
 * centred under their shape, overlaps no name placed before it. The `always` people (selected,
 * found) come first and are written at any zoom when on screen.
 */
export function labelledPeople(
  nodes: Iterable<MapNode>,
  view: View,
  always: ReadonlySet<string>,
  nameOf: (lid: string) => string,
): Label[] {
  const onScreen: MapNode[] = [];
  for (const n of nodes) {
    const sx = view.x + (n.x ?? 0) * view.k;
    const sy = view.y + (n.y ?? 0) * view.k;
    if (sx >= 0 && sx <= view.width && sy >= 0 && sy <= view.height) onScreen.push(n);
  }
  const first = onScreen.filter((n) => always.has(n.lid));
  const crowded = view.k < OVERVIEW_LABEL_ZOOM || onScreen.length > OVERVIEW_LABELS_MAX;
  const rest = crowded ? [] : onScreen.filter((n) => !always.has(n.lid));
  const size = labelSize(view.k);
  const placed: Label[] = [];
  for (const n of [...first, ...rest]) {
    const width = (labelWidth(nameOf(n.lid)) * size) / LABEL_FONT.size;
    const x = view.x + (n.x ?? 0) * view.k - width / 2;
    const y = view.y + (n.y ?? 0) * view.k + R * view.k * personScale(view.k) + 3;
    const box = { node: n, x, y, width };
    if (always.has(n.lid) || !placed.some((p) => overlaps(p, box, size + 2))) placed.push(box);
  }
  return placed;
}

function overlaps(a: Label, b: Label, height: number): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && Math.abs(a.y - b.y) < height;
}

function groupNodes(graph: MapGraph, styles: ReadonlyMap<string, GroupStyle>): StyledGroup[] {
  const byGroup = new Map<string, StyledGroup>();
  for (const n of graph.nodes.values()) {
    let g = byGroup.get(n.group);
    if (!g) {
      const style = styles.get(n.group) ?? NO_GROUP_STYLE;
      g = { style, corners: shapeCorners(style.shape, R), nodes: [] };
      byGroup.set(n.group, g);
    }
    g.nodes.push(n);
  }
  return [...byGroup.values()];
}

/** Ties grouped by drawn width (to a quarter unit), thinnest first. */
function batchTies(graph: MapGraph): TieBatch[] {
  const max = graph.maxStrength();
  const byWidth = new Map<number, MapLink[]>();
  for (const l of graph.links) {
    const w = Math.round(tieWidth(l.strength, max) * 4) / 4;
    const list = byWidth.get(w) ?? [];
    list.push(l);
    byWidth.set(w, list);
  }
  return [...byWidth.entries()].sort((a, b) => a[0] - b[0]).map(([width, links]) => ({ width, links }));
}
