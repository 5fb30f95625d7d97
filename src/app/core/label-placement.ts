/**
 * Where each person's name goes so no two names overlap and no name covers a person: a
 * greedy candidate-position labeller (the fixed-position model of Christensen, Marks and
 * Shieber, "An empirical study of algorithms for point-feature label placement", 1995, taken
 * greedily). Each label tries a few spots around its person, nearest first, and takes the
 * first one that hits nothing already placed; a label that fits nowhere is left out (its
 * person keeps the name in the tooltip and the tables). A uniform grid keeps each test local,
 * so a room of a few hundred people is labelled in a few milliseconds.
 */
export interface LabelInput {
  x: number;
  y: number;
  width: number;
}

export interface LabelSpot {
  /** Offset of the text anchor from the person's centre. */
  dx: number;
  dy: number;
  anchor: 'start' | 'middle' | 'end';
  /** The text's box in map coordinates. */
  box: Box;
}

export interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

/** Height of a name's box for the map's 11px type; the replay passes its own. */
export const LABEL_HEIGHT = 13;

export interface PlaceOptions {
  /** Height of a label's box (about 1.2 times the font size). */
  height?: number;
  /** Labels must stay inside this box (the drawing's edges). */
  bounds?: Box;
}

/** Candidate spots, in order of preference: below, above, right, left, then the four corners, then farther out. */
function candidates(r: number, w: number, h: number): Omit<LabelSpot, 'box'>[] {
  const gap = 3;
  const below = r + gap + h - 3;
  const above = -(r + gap + 2);
  const side = r + gap;
  const base: Omit<LabelSpot, 'box'>[] = [
    { dx: 0, dy: below, anchor: 'middle' },
    { dx: 0, dy: above, anchor: 'middle' },
    { dx: side, dy: h / 3, anchor: 'start' },
    { dx: -side, dy: h / 3, anchor: 'end' },
    { dx: side - 2, dy: below - 2, anchor: 'start' },
    { dx: -(side - 2), dy: below - 2, anchor: 'end' },
    { dx: side - 2, dy: above + 2, anchor: 'start' },
    { dx: -(side - 2), dy: above + 2, anchor: 'end' },
  ];
  const far = h;
  return [
    ...base,
    { dx: 0, dy: below + far, anchor: 'middle' },
    { dx: 0, dy: above - far, anchor: 'middle' },
    { dx: side + w / 4, dy: below + far - 4, anchor: 'start' },
    { dx: -(side + w / 4), dy: below + far - 4, anchor: 'end' },
  ];
}

function boxOf(x: number, y: number, spot: Omit<LabelSpot, 'box'>, w: number, h: number): Box {
  const ax = x + spot.dx;
  const x0 = spot.anchor === 'start' ? ax : spot.anchor === 'end' ? ax - w : ax - w / 2;
  // The anchor is the text's baseline: most of the box lies above it.
  const baseline = y + spot.dy;
  const descent = Math.round(h * 0.23);
  return { x0, y0: baseline - h + descent, x1: x0 + w, y1: baseline + descent };
}

function inside(b: Box, bounds: Box | undefined): boolean {
  return !bounds || (b.x0 >= bounds.x0 && b.y0 >= bounds.y0 && b.x1 <= bounds.x1 && b.y1 <= bounds.y1);
}

export function overlaps(a: Box, b: Box): boolean {
  return a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
}

class Grid {
  private readonly cells = new Map<string, Box[]>();
  constructor(private readonly size: number) {}

  private keys(b: Box): string[] {
    const out: string[] = [];
    for (let i = Math.floor(b.x0 / this.size); i <= Math.floor(b.x1 / this.size); i++)
      for (let j = Math.floor(b.y0 / this.size); j <= Math.floor(b.y1 / this.size); j++) out.push(`${i},${j}`);
    return out;
  }

  add(b: Box): void {
    for (const k of this.keys(b)) {
      const list = this.cells.get(k);
      if (list) list.push(b);
      else this.cells.set(k, [b]);
    }
  }

  hits(b: Box): boolean {
    for (const k of this.keys(b)) for (const o of this.cells.get(k) ?? []) if (overlaps(o, b)) return true;
    return false;
  }
}

/**
 * One spot per label (or null when none is free). `r` is the radius of a person's shape;
 * every shape counts as an obstacle. People are labelled in input order, so the result is
 * the same on every run.
 */
export function placeLabels(items: readonly LabelInput[], r: number, options: PlaceOptions = {}): (LabelSpot | null)[] {
  const h = options.height ?? LABEL_HEIGHT;
  const grid = new Grid(Math.max(64, h * 5));
  const pad = 1.5;
  for (const it of items) grid.add({ x0: it.x - r - pad, y0: it.y - r - pad, x1: it.x + r + pad, y1: it.y + r + pad });
  return items.map((it) => {
    for (const c of candidates(r, it.width, h)) {
      const box = boxOf(it.x, it.y, c, it.width, h);
      if (!inside(box, options.bounds) || grid.hits(box)) continue;
      grid.add(box);
      return { ...c, box };
    }
    return null;
  });
}
