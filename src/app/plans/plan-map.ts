import { ChangeDetectionStrategy, Component, effect, ElementRef, input, viewChild } from '@angular/core';
import { forceCenter, forceLink, forceManyBody, forceSimulation, type SimulationNodeDatum } from 'd3-force';
import { select, type BaseType, type Selection } from 'd3-selection';
import type { PersonDto, TieDto } from '../../../shared/api/rooms';
import { groupStyles, shapePath, type ShapeName } from '../rooms/map/group-style';
import { hopsShade } from './hops-shade';

interface Dot extends SimulationNodeDatum {
  id: number;
  name: string;
  hops: number | null;
  order: number | null;
  shape: ShapeName;
}

const W = 640;
const H = 420;
const PAD = 28;

/**
 * Read-only drawing of the room with the stored positions: starters as clay rings with their briefing
 * number, everyone else filled darker the sooner they are expected to hear. People without a stored
 * position are placed by a short force layout so the drawing never leaves anyone out.
 */
@Component({
  selector: 'app-plan-map',
  template: `
    <figure class="map-figure">
      <svg #svg [attr.viewBox]="'0 0 ' + w + ' ' + h" role="img" [attr.aria-label]="label()"></svg>
      <figcaption class="legend">
        <span class="item"><span class="starter-key" aria-hidden="true"></span>starter, numbered in briefing order</span>
        <span class="item"><span class="ramp" aria-hidden="true"></span>hears sooner &rarr; later</span>
        <span class="item">shape = group</span>
      </figcaption>
    </figure>
  `,
  styleUrl: './plan-map.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanMap {
  readonly people = input.required<readonly PersonDto[]>();
  readonly ties = input.required<readonly TieDto[]>();
  /** Expected hops per person id (starters 0). */
  readonly hops = input<ReadonlyMap<number, number>>(new Map());
  /** Starter person ids in briefing order. */
  readonly starters = input<readonly number[]>([]);
  readonly label = input('Map of the room with the starters marked');

  protected readonly w = W;
  protected readonly h = H;
  private readonly svg = viewChild.required<ElementRef<SVGSVGElement>>('svg');

  constructor() {
    effect(() => this.draw());
  }

  private draw(): void {
    const { dots, links } = this.layout();
    const finite = dots.map((d) => d.hops).filter((v): v is number => v !== null && v > 0 && Number.isFinite(v));
    const lo = Math.min(...finite, Infinity);
    const hi = Math.max(...finite, -Infinity);
    const maxStrength = Math.max(1, ...links.map((l) => l.strength));

    const root = select(this.svg().nativeElement);
    root.selectAll('*').remove();
    root
      .append('g')
      .attr('class', 'ties')
      .selectAll('line')
      .data(links)
      .join('line')
      .attr('x1', (l) => l.source.x!)
      .attr('y1', (l) => l.source.y!)
      .attr('x2', (l) => l.target.x!)
      .attr('y2', (l) => l.target.y!)
      .attr('stroke-width', (l) => 0.6 + 2.2 * (l.strength / maxStrength));
    const nodes = root
      .append('g')
      .selectAll('g')
      .data(dots)
      .join('g')
      .attr('class', (d) => (d.order ? 'person starter' : 'person'))
      .attr('transform', (d) => `translate(${d.x},${d.y})`);
    nodes
      .append('path')
      .attr('d', (d) => shapePath(d.shape, d.order ? 11 : 7))
      .attr('fill', (d) => (d.order ? '#fff' : hopsShade(d.hops, lo, hi)));
    labelPeople(nodes, dots.length <= 40);
  }

  /** The people as dots (their room-map shapes, hops and briefing order) and the ties between them, placed and fitted. */
  private layout(): { dots: Dot[]; links: { source: Dot; target: Dot; strength: number }[] } {
    const people = this.people();
    const hops = this.hops();
    const order = new Map(this.starters().map((id, i) => [id, i + 1]));
    // Groups keep the shapes they have on the room's own map, so the two drawings read alike.
    const styles = groupStyles([...new Set(people.map((p) => p.group).filter((g): g is string => !!g))].sort());
    const dots: Dot[] = people.map((p) => ({
      id: p.id,
      name: p.name,
      hops: hops.get(p.id) ?? null,
      order: order.get(p.id) ?? null,
      shape: (p.group && styles.get(p.group)?.shape) || 'circle',
      x: p.x ?? undefined,
      y: p.y ?? undefined,
    }));
    const byId = new Map(dots.map((d) => [d.id, d]));
    const links = this.ties()
      .map((t) => ({ source: byId.get(t.sourceId)!, target: byId.get(t.targetId)!, strength: t.strength }))
      .filter((l) => l.source && l.target);
    placeMissing(dots, links);
    fit(dots);
    return { dots, links };
  }
}

/** Starter numbers, a hover title for everyone, and first names when the room is small enough to read them. */
function labelPeople(nodes: Selection<SVGGElement | BaseType, Dot, SVGGElement, unknown>, withNames: boolean): void {
  nodes
    .filter((d) => !!d.order)
    .append('text')
    .attr('class', 'order')
    .attr('text-anchor', 'middle')
    .attr('dy', '0.35em')
    .text((d) => String(d.order));
  nodes
    .append('title')
    .text((d) =>
      d.order ? `${d.name}: starter ${d.order}` : `${d.name}: ${d.hops === null ? 'no value' : d.hops.toFixed(1) + ' expected hops'}`,
    );
  if (!withNames) return;
  nodes
    .append('text')
    .attr('class', 'name')
    .attr('y', (d) => (d.order ? 22 : 17))
    .attr('text-anchor', 'middle')
    .text((d) => d.name.split(' ')[0] ?? '');
}

function placeMissing(dots: Dot[], links: { source: Dot; target: Dot }[]): void {
  const missing = dots.filter((d) => d.x === undefined || d.y === undefined);
  if (missing.length === 0) return;
  const fixed = dots.length - missing.length;
  for (const d of dots) {
    if (d.x !== undefined && d.y !== undefined) {
      d.fx = d.x;
      d.fy = d.y;
    }
  }
  const sim = forceSimulation(dots).force('charge', forceManyBody().strength(-60)).force('link', forceLink(links).distance(40)).stop();
  if (fixed === 0) sim.force('center', forceCenter(W / 2, H / 2));
  for (let i = 0; i < 200; i++) sim.tick();
}

/** Scales positions into the drawing box, keeping the aspect ratio. */
function fit(dots: Dot[]): void {
  if (dots.length === 0) return;
  const xs = dots.map((d) => d.x!);
  const ys = dots.map((d) => d.y!);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const s = Math.min((W - 2 * PAD) / Math.max(1e-9, x1 - x0), (H - 2 * PAD) / Math.max(1e-9, y1 - y0));
  const ox = (W - s * (x1 - x0)) / 2;
  const oy = (H - s * (y1 - y0)) / 2;
  for (const d of dots) {
    d.x = x1 === x0 ? W / 2 : ox + s * (d.x! - x0);
    d.y = y1 === y0 ? H / 2 : oy + s * (d.y! - y0);
  }
}
