import type { EditorPerson, EditorTie } from '../editor/room-model';
import type { MapLink, MapNode } from './map-layout';

/** The radius of a person's shape on the map. */
export const PERSON_RADIUS = 11;

/**
 * The map's view of the room: one node per person (kept between redraws, so the layout and the
 * drawn elements stay attached to it), the ties between them, and each person's own ties.
 */
export class MapGraph {
  private byLid = new Map<string, MapNode>();
  private tieList: MapLink[] = [];
  private adjacency = new Map<string, MapLink[]>();

  get nodes(): ReadonlyMap<string, MapNode> {
    return this.byLid;
  }

  get links(): readonly MapLink[] {
    return this.tieList;
  }

  get size(): number {
    return this.byLid.size;
  }

  node(lid: string): MapNode | undefined {
    return this.byLid.get(lid);
  }

  nodeList(): MapNode[] {
    return [...this.byLid.values()];
  }

  /**
   * Takes the room's people and ties. A person keeps their node (and place) from before; a saved
   * place wins. `held` are people the running layout must not move. Answers whether someone
   * arrived who has no place yet.
   */
  update(people: readonly EditorPerson[], ties: readonly EditorTie[], held: ReadonlySet<string>): { newcomers: boolean } {
    const next = new Map<string, MapNode>();
    let newcomers = false;
    for (const p of people) {
      const old = this.byLid.get(p.lid);
      const n: MapNode = old ?? { lid: p.lid, group: p.group ?? '', pinned: p.pinned };
      n.group = p.group ?? '';
      n.pinned = p.pinned;
      if (p.x !== null && p.y !== null) {
        n.x = p.x;
        n.y = p.y;
      } else if (!old) newcomers = true;
      const fixed = p.pinned || held.has(p.lid);
      n.fx = fixed ? n.x : null;
      n.fy = fixed ? n.y : null;
      next.set(p.lid, n);
    }
    this.byLid = next;
    this.tieList = [];
    this.adjacency = new Map();
    for (const t of ties) {
      const source = next.get(t.source);
      const target = next.get(t.target);
      if (!source || !target) continue;
      const link: MapLink = { lid: t.lid, source, target, strength: t.strength };
      this.tieList.push(link);
      for (const end of [t.source, t.target]) {
        const list = this.adjacency.get(end) ?? [];
        list.push(link);
        this.adjacency.set(end, list);
      }
    }
    return { newcomers };
  }

  /** The ties of one person. */
  tiesOf(lid: string): readonly MapLink[] {
    return this.adjacency.get(lid) ?? [];
  }

  /** Every tie touching any of these people, each once. */
  tiesAround(nodes: readonly MapNode[]): MapLink[] {
    const links = new Set<MapLink>();
    for (const n of nodes) for (const l of this.tiesOf(n.lid)) links.add(l);
    return [...links];
  }

  /** The strongest tie's strength (0 without ties), for the width scale. */
  maxStrength(): number {
    return this.tieList.reduce((m, l) => Math.max(m, l.strength), 0);
  }

  /** The person whose shape is under (x, y), other than `except`. */
  personAt(x: number, y: number, except: string): MapNode | null {
    let best: MapNode | null = null;
    let bestD = (PERSON_RADIUS + 8) ** 2;
    for (const n of this.byLid.values()) {
      if (n.lid === except) continue;
      const d = ((n.x ?? 0) - x) ** 2 + ((n.y ?? 0) - y) ** 2;
      if (d < bestD) {
        bestD = d;
        best = n;
      }
    }
    return best;
  }

  /** The tie nearest to (x, y) within `tolerance`, if any. */
  tieAt(x: number, y: number, tolerance: number): MapLink | null {
    let hit: MapLink | null = null;
    let best = tolerance;
    for (const l of this.tieList) {
      const d = segmentDistance(x, y, l.source.x ?? 0, l.source.y ?? 0, l.target.x ?? 0, l.target.y ?? 0);
      if (d < best) {
        best = d;
        hit = l;
      }
    }
    return hit;
  }

  /** A spot near (cx, cy) at least five radii from everyone (Vogel's spiral outwards). */
  freeSpotNear(cx: number, cy: number): [number, number] {
    const clear = (x: number, y: number) =>
      [...this.byLid.values()].every((n) => n.x === undefined || Math.hypot(n.x - x, (n.y ?? 0) - y) > PERSON_RADIUS * 5);
    for (let i = 0; i < 400; i++) {
      const r = 18 * Math.sqrt(i);
      const x = Math.round(cx + r * Math.cos(i * 2.39996));
      const y = Math.round(cy + r * Math.sin(i * 2.39996));
      if (clear(x, y)) return [x, y];
    }
    return [Math.round(cx), Math.round(cy)];
  }

  /** Everyone's place, for the rubber band and the frame of the map. */
  points(): { lid: string; x: number; y: number }[] {
    return this.nodeList().map((n) => ({ lid: n.lid, x: n.x ?? 0, y: n.y ?? 0 }));
  }
}

/** What needs a redraw when it changes (positions and pins do not). */
export function structureOf(people: readonly EditorPerson[], ties: readonly EditorTie[], directed: boolean): string {
  let s = directed ? 'd' : 'u';
  for (const p of people) s += `|${p.lid}\u0001${p.name}\u0001${p.group ?? ''}`;
  s += '#';
  for (const t of ties) s += `|${t.lid}\u0001${t.source}\u0001${t.target}\u0001${t.strength}`;
  return s;
}

export function segmentDistance(px: number, py: number, x1: number, y1: number, x2: number, y2: number): number {
  const dx = x2 - x1;
  const dy = y2 - y1;
  const len2 = dx * dx + dy * dy;
  const t = len2 ? Math.max(0, Math.min(1, ((px - x1) * dx + (py - y1) * dy) / len2)) : 0;
  return Math.hypot(px - (x1 + t * dx), py - (y1 + t * dy));
}
