import { forceCollide, forceLink, forceManyBody, forceSimulation, forceX, forceY, type SimulationNodeDatum } from 'd3-force';

/**
 * Positions for the replay, normalised to 0..1 on both axes. The room's own layout is used
 * when every person has one; otherwise a force layout is run once, up front (not animated,
 * so the projector shows a still map from the first frame).
 */
export interface LayoutPerson {
  x: number | null;
  y: number | null;
}

export function replayLayout(
  people: readonly LayoutPerson[],
  ties: readonly { source: number; target: number }[],
): { x: Float64Array; y: Float64Array } {
  const n = people.length;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  if (n && people.every((p) => p.x !== null && p.y !== null)) {
    people.forEach((p, i) => {
      x[i] = p.x!;
      y[i] = p.y!;
    });
  } else if (n) {
    const nodes: SimulationNodeDatum[] = people.map((_, i) => ({ x: Math.cos(i) * i, y: Math.sin(i) * i }));
    const sim = forceSimulation(nodes)
      .force('charge', forceManyBody().strength(-40))
      .force('link', forceLink(ties.map((t) => ({ source: t.source, target: t.target }))).distance(30))
      .force('collide', forceCollide(9))
      .force('x', forceX(0).strength(0.05))
      .force('y', forceY(0).strength(0.05))
      .stop();
    sim.tick(Math.min(300, 60 + n));
    nodes.forEach((d, i) => {
      x[i] = d.x ?? 0;
      y[i] = d.y ?? 0;
    });
  }
  const norm = (a: Float64Array) => {
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of a) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    const span = hi - lo || 1;
    a.forEach((v, i) => (a[i] = hi === lo ? 0.5 : (v - lo) / span));
  };
  norm(x);
  norm(y);
  return { x, y };
}
