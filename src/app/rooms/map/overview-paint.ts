import { PERSON_RADIUS as R } from './map-graph';
import type { MapLink, MapNode } from './map-layout';
import { INK, TIE } from './map-renderer';
import { traceShape } from './canvas-shapes';
import type { GroupStyle } from './group-style';

/**
 * The overview's drawing steps, each one path: ties by width, arrow heads, people by group,
 * hollow centres, pins and rings. Coordinates are the drawing's; the caller sets the transform.
 */

/** The pan and zoom (as d3-zoom gives it) and the canvas size in CSS pixels. */
export interface View {
  k: number;
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface StyledGroup {
  style: GroupStyle;
  corners: number[] | null;
  nodes: MapNode[];
}

/** Ties of one drawn width, stroked as one path. */
export interface TieBatch {
  width: number;
  links: MapLink[];
}

/** The drawing-space box a view shows, with a margin of one person. */
export interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export function visibleBox(view: View): Box {
  const m = R * 2;
  return {
    x0: -view.x / view.k - m,
    y0: -view.y / view.k - m,
    x1: (view.width - view.x) / view.k + m,
    y1: (view.height - view.y) / view.k + m,
  };
}

const inBox = (b: Box, x: number, y: number) => x >= b.x0 && x <= b.x1 && y >= b.y0 && y <= b.y1;

/** Ties touching the box (a tie across the view with both ends outside is drawn too). */
function tieInBox(l: MapLink, b: Box): boolean {
  const x1 = l.source.x ?? 0;
  const y1 = l.source.y ?? 0;
  const x2 = l.target.x ?? 0;
  const y2 = l.target.y ?? 0;
  return Math.max(x1, x2) >= b.x0 && Math.min(x1, x2) <= b.x1 && Math.max(y1, y2) >= b.y0 && Math.min(y1, y2) <= b.y1;
}

export function drawTies(ctx: CanvasRenderingContext2D, batches: readonly TieBatch[], box: Box, k: number): void {
  // Zoomed far out, thousands of ties would merge into one grey cloud: lighter lines keep the people readable.
  ctx.globalAlpha = k < 0.35 ? 0.35 : 0.55;
  for (const b of batches)
    strokeSegments(
      ctx,
      b.links.filter((l) => tieInBox(l, box)),
      TIE,
      b.width,
      k,
    );
  ctx.globalAlpha = 1;
}

export function strokeSegments(ctx: CanvasRenderingContext2D, links: readonly MapLink[], colour: string, width: number, k: number): void {
  if (!links.length) return;
  ctx.beginPath();
  for (const l of links) {
    ctx.moveTo(l.source.x ?? 0, l.source.y ?? 0);
    ctx.lineTo(l.target.x ?? 0, l.target.y ?? 0);
  }
  ctx.strokeStyle = colour;
  ctx.lineCap = 'round';
  // Never thinner than half a screen pixel.
  ctx.lineWidth = Math.max(width, 0.5 / k);
  ctx.stroke();
}

/** Arrow heads at the target's edge ("source asks target"), all in one path. */
export function drawArrows(ctx: CanvasRenderingContext2D, batches: readonly TieBatch[], box: Box): void {
  ctx.beginPath();
  for (const b of batches)
    for (const l of b.links) {
      const tx = l.target.x ?? 0;
      const ty = l.target.y ?? 0;
      if (!inBox(box, tx, ty)) continue;
      const dx = tx - (l.source.x ?? 0);
      const dy = ty - (l.source.y ?? 0);
      const len = Math.hypot(dx, dy) || 1;
      const [ux, uy] = [dx / len, dy / len];
      const [px, py] = [tx - ux * (R + 2), ty - uy * (R + 2)];
      ctx.moveTo(px, py);
      ctx.lineTo(px - ux * 7 - uy * 3.5, py - uy * 7 + ux * 3.5);
      ctx.lineTo(px - ux * 7 + uy * 3.5, py - uy * 7 - ux * 3.5);
      ctx.closePath();
    }
  ctx.fillStyle = TIE;
  ctx.fill();
}

export function drawGroup(ctx: CanvasRenderingContext2D, g: StyledGroup, box: Box, s: number, k: number): void {
  ctx.beginPath();
  let any = false;
  for (const n of g.nodes) {
    const x = n.x ?? 0;
    const y = n.y ?? 0;
    if (!inBox(box, x, y)) continue;
    traceShape(ctx, g.corners, R, x, y, s);
    any = true;
  }
  if (!any) return;
  ctx.fillStyle = g.style.fill;
  ctx.fill();
  ctx.strokeStyle = INK;
  // The outline thins with the zoom but stays a visible hairline.
  ctx.lineWidth = Math.max(1.4, 0.6 / k);
  ctx.lineJoin = 'round';
  ctx.stroke();
}

export function drawHollows(ctx: CanvasRenderingContext2D, groups: readonly StyledGroup[], box: Box): void {
  ctx.beginPath();
  for (const g of groups) {
    if (!g.style.hollow) continue;
    for (const n of g.nodes) {
      if (!inBox(box, n.x ?? 0, n.y ?? 0)) continue;
      ctx.moveTo((n.x ?? 0) + R * 0.38, n.y ?? 0);
      ctx.arc(n.x ?? 0, n.y ?? 0, R * 0.38, 0, 2 * Math.PI);
    }
  }
  ctx.fillStyle = '#ffffff';
  ctx.fill();
  ctx.strokeStyle = INK;
  ctx.lineWidth = 1;
  ctx.stroke();
}

/** The pin flag of the small map (a small ink pennant above the shape's right shoulder). */
export function drawPins(ctx: CanvasRenderingContext2D, nodes: Iterable<MapNode>, pinned: ReadonlySet<string>, box: Box): void {
  if (!pinned.size) return;
  ctx.beginPath();
  for (const n of nodes) {
    if (!pinned.has(n.lid) || !inBox(box, n.x ?? 0, n.y ?? 0)) continue;
    const [x, y] = [n.x ?? 0, n.y ?? 0];
    ctx.moveTo(x + 5, y - 17);
    ctx.lineTo(x + 12, y - 17);
    ctx.lineTo(x + 8.5, y - 11);
    ctx.closePath();
  }
  ctx.fillStyle = INK;
  ctx.fill();
}

export function ring(ctx: CanvasRenderingContext2D, n: MapNode, r: number, colour: string, width: number, dash: number[]): void {
  ctx.beginPath();
  ctx.arc(n.x ?? 0, n.y ?? 0, r, 0, 2 * Math.PI);
  ctx.setLineDash(dash);
  ctx.strokeStyle = colour;
  ctx.lineWidth = width;
  ctx.stroke();
  ctx.setLineDash([]);
}

/** Gives the canvas as many device pixels as it shows CSS pixels times the pixel ratio. */
export function fitCanvas(canvas: HTMLCanvasElement, view: View, dpr: number): void {
  const w = Math.round(view.width * dpr);
  const h = Math.round(view.height * dpr);
  if (canvas.width !== w) canvas.width = w;
  if (canvas.height !== h) canvas.height = h;
}
