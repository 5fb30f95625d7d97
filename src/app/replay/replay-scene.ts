import { forceCollide, forceSimulation, forceX, forceY, type SimulationNodeDatum } from 'd3-force';
import { type Box, type LabelSpot, placeLabels } from '../core/label-placement';
import { itemAt } from '../../../shared/checked';

/** Per-person arrays here all have one entry per name; a miss is a bug and throws. */
const at = (values: ArrayLike<number>, i: number): number => itemAt(values, i, 'replay scene value');

/**
 * Where everyone sits on the projector, in canvas pixels, and where each name goes. Computed
 * once per canvas size, not per frame. Names are the point of the replay ("did Mira hear
 * yet?"), so the people are first spread apart just enough for a name beside each (a
 * collision pass that keeps the room's own shape), then every name gets a spot that overlaps
 * no other name and no person. When a size cannot hold every full name, the type steps down;
 * below the smallest size a projector can carry, the names that still do not fit are shown
 * as initials, listed in the side legend.
 */
export interface ReplayScene {
  x: Float64Array;
  y: Float64Array;
  /** Radius of a person's disc. */
  r: number;
  /** Type size of the names, in pixels (0: no names for a room this large). */
  font: number;
  /** One per person: the text drawn and its spot (null only when names are off). */
  labels: ({ text: string; initials: boolean; spot: LabelSpot } | null)[];
}

/** Rooms larger than this get no names on the projector: they would be too small to read. */
export const NAMED_UP_TO = 120;
/** The smallest type that still reads from the back of a room at 1080 lines (common practice: 18-24 px). */
const MIN_FONT = 17;

export type Measure = (text: string, font: number) => number;

export function replayScene(
  layout: { x: Float64Array; y: Float64Array },
  names: readonly string[],
  width: number,
  height: number,
  measure: Measure,
): ReplayScene {
  const n = names.length;
  const r = Math.max(5, Math.min(14, (Math.min(width, height) / Math.sqrt(n + 1)) * 0.16));
  const pad = Math.max(16, r * 2);
  const bounds: Box = { x0: 4, y0: 4, x1: width - 4, y1: height - 4 };
  if (n === 0 || n > NAMED_UP_TO || width < 50 || height < 50) {
    const { x, y } = fit(layout.x, layout.y, pad, width, height);
    return { x, y, r, font: 0, labels: names.map(() => null) };
  }
  let best: ReplayScene | null = null;
  let bestMissing = Infinity;
  for (let font = Math.max(MIN_FONT, Math.min(28, Math.round(height / 40))); font >= MIN_FONT; font -= 2) {
    const widths = names.map((s) => measure(s, font));
    const h = Math.round(font * 1.25);
    const margin = Math.max(...widths) / 2 + r;
    const start = fit(layout.x, layout.y, margin, width, height, h + r);
    const { x, y } = spread(start.x, start.y, widths, h, r, margin, width, height);
    const spots = placeLabels(
      names.map((_, i) => ({ x: at(x, i), y: at(y, i), width: at(widths, i) })),
      r + 2,
      { height: h, bounds },
    );
    const missing = spots.filter((s) => s === null).length;
    if (missing < bestMissing) {
      bestMissing = missing;
      best = { x, y, r, font, labels: finish(names, spots, x, y, r, font, h, measure, bounds) };
    }
    if (missing === 0) break;
  }
  return best!;
}

/** Scales positions given on 0..1 into the canvas, leaving `margin` at the sides (and `bottom` below). */
function fit(nx: Float64Array, ny: Float64Array, margin: number, width: number, height: number, bottom = margin) {
  const x = new Float64Array(nx.length);
  const y = new Float64Array(ny.length);
  const top = Math.min(margin, height / 4);
  nx.forEach((v, i) => {
    x[i] = margin + v * Math.max(1, width - 2 * margin);
    y[i] = top + at(ny, i) * Math.max(1, height - top - bottom);
  });
  return { x, y };
}

/**
 * Pushes people apart until each name has room (a collision radius from the name's width,
 * squashed vertically since names are wide and short), pulled back towards where the room
 * put them, then clamped into the canvas.
 */
function spread(x0: Float64Array, y0: Float64Array, widths: number[], h: number, r: number, margin: number, width: number, height: number) {
  // Work in a space where y is stretched, so round collision discs act as wide ellipses.
  const squash = 2.2;
  const nodes: (SimulationNodeDatum & { i: number })[] = widths.map((_, i) => ({ i, x: at(x0, i), y: at(y0, i) * squash }));
  const sim = forceSimulation(nodes)
    .force('collide', forceCollide<SimulationNodeDatum & { i: number }>((d) => at(widths, d.i) / 2 + r + 4).iterations(3))
    .force('x', forceX<SimulationNodeDatum & { i: number }>((d) => at(x0, d.i)).strength(0.08))
    .force('y', forceY<SimulationNodeDatum & { i: number }>((d) => at(y0, d.i) * squash).strength(0.08))
    .stop();
  sim.tick(160);
  const x = new Float64Array(widths.length);
  const y = new Float64Array(widths.length);
  nodes.forEach((d, i) => {
    x[i] = d.x ?? at(x0, i);
    y[i] = (d.y ?? at(y0, i) * squash) / squash;
  });
  // Back into the canvas, keeping the spread's proportions.
  const scaled = normalise(x, y);
  return fit(scaled.x, scaled.y, margin, width, height, h + r);
}

function normalise(x: Float64Array, y: Float64Array) {
  const span = (a: Float64Array) => {
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of a) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    return { lo, d: hi - lo || 1 };
  };
  const sx = span(x);
  const sy = span(y);
  return { x: x.map((v) => (v - sx.lo) / sx.d), y: y.map((v) => (v - sy.lo) / sy.d) };
}

/** Full names where they fit; initials for the rest (placed again, now that they are short). */
function finish(
  names: readonly string[],
  spots: (LabelSpot | null)[],
  x: Float64Array,
  y: Float64Array,
  r: number,
  font: number,
  h: number,
  measure: Measure,
  bounds: Box,
): ReplayScene['labels'] {
  const out: ReplayScene['labels'] = names.map((text, i) => (spots[i] ? { text, initials: false, spot: spots[i] } : null));
  const missing = out.map((l, i) => (l ? -1 : i)).filter((i) => i >= 0);
  if (!missing.length) return out;
  // Everything placed so far stays an obstacle: place all again, full names first in the same order.
  const items = names.map((s, i) => ({ x: at(x, i), y: at(y, i), width: measure(out[i] ? s : initialsOf(s), font) }));
  const again = placeLabels(items, r + 2, { height: h, bounds });
  return names.map((s, i) => {
    const spot = again[i] ?? spots[i];
    const initials = !out[i];
    // Last resort: initials on the disc itself.
    return { text: initials ? initialsOf(s) : s, initials, spot: spot ?? centred(at(x, i), at(y, i), measure(initialsOf(s), font), h) };
  });
}

export function initialsOf(name: string): string {
  const parts = name.trim().split(/\s+/).filter(Boolean);
  return (
    parts
      .slice(0, 3)
      .map((p) => p[0]!.toUpperCase())
      .join('') || '?'
  );
}

function centred(x: number, y: number, w: number, h: number): LabelSpot {
  return { dx: 0, dy: h / 3, anchor: 'middle', box: { x0: x - w / 2, y0: y - h / 2, x1: x + w / 2, y1: y + h / 2 } };
}
