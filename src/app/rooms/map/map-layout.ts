import {
  forceLink,
  forceManyBody,
  forceSimulation,
  forceX,
  forceY,
  type Simulation,
  type SimulationLinkDatum,
  type SimulationNodeDatum,
} from 'd3-force';

export interface MapNode extends SimulationNodeDatum {
  lid: string;
  group: string;
  pinned: boolean;
  el?: SVGGElement;
}

export interface MapLink extends SimulationLinkDatum<MapNode> {
  lid: string;
  source: MapNode;
  target: MapNode;
  strength: number;
  el?: SVGLineElement;
}

/**
 * How much layout the map can afford. Up to 1,000 people the force layout runs to rest;
 * above that it stops early; from STATIC_FROM people there is no simulation at all and
 * people without a saved place are set out in group clusters (a static layout), so a very
 * large room opens at once instead of freezing the page.
 */
export const EARLY_STOP_ABOVE = 1000;
export const STATIC_FROM = 2500;

export type LayoutMode = 'full' | 'early-stop' | 'static';

export function layoutMode(people: number): LayoutMode {
  if (people >= STATIC_FROM) return 'static';
  if (people > EARLY_STOP_ABOVE) return 'early-stop';
  return 'full';
}

/** Places people without a position: one cluster per group on a grid, a sunflower spiral inside each. */
export function placeUnplaced(nodes: MapNode[]): boolean {
  const unplaced = nodes.filter((n) => n.x === undefined || n.y === undefined || Number.isNaN(n.x));
  if (!unplaced.length) return false;
  const unplacedSet = new Set(unplaced);
  const placed = nodes.filter((n) => !unplacedSet.has(n));
  const byGroup = new Map<string, MapNode[]>();
  for (const n of unplaced) {
    const list = byGroup.get(n.group) ?? [];
    list.push(n);
    byGroup.set(n.group, list);
  }
  // Start to the right of anything already placed.
  let originX = 0;
  for (const n of placed) originX = Math.max(originX, (n.x ?? 0) + 120);
  const clusters = [...byGroup.values()];
  const cols = Math.ceil(Math.sqrt(clusters.length));
  const spacing = 24;
  let cell = 0;
  for (const c of clusters) cell = Math.max(cell, Math.sqrt(c.length) * spacing * 1.2 + 120);
  clusters.forEach((members, ci) => {
    const cx = originX + (ci % cols) * cell + cell / 2;
    const cy = Math.floor(ci / cols) * cell + cell / 2;
    members.forEach((n, i) => {
      // Vogel's sunflower spiral: even spacing for any count.
      const r = spacing * Math.sqrt(i + 0.5) * 0.9;
      const a = i * 2.39996;
      n.x = cx + r * Math.cos(a);
      n.y = cy + r * Math.sin(a);
    });
  });
  return true;
}

export function createSimulation(nodes: MapNode[], links: MapLink[], mode: LayoutMode): Simulation<MapNode, MapLink> {
  let cx = 0;
  let cy = 0;
  for (const n of nodes) {
    cx += (n.x ?? 0) / (nodes.length || 1);
    cy += (n.y ?? 0) / (nodes.length || 1);
  }
  const maxStrength = links.reduce((m, l) => Math.max(m, l.strength), 0) || 1;
  const sim = forceSimulation<MapNode, MapLink>(nodes)
    .force(
      'link',
      forceLink<MapNode, MapLink>(links)
        .id((n) => n.lid)
        .distance((l) => 70 - 30 * Math.sqrt(l.strength / maxStrength))
        .strength(0.35),
    )
    .force('charge', forceManyBody<MapNode>().strength(-140).theta(0.9).distanceMax(420))
    .force('x', forceX<MapNode>(cx).strength(0.02))
    .force('y', forceY<MapNode>(cy).strength(0.02))
    .stop();
  if (mode === 'early-stop') sim.alphaMin(0.08).alphaDecay(0.06);
  return sim;
}
