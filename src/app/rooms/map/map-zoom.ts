import { select } from 'd3-selection';
import { zoom, type ZoomBehavior, zoomIdentity, type ZoomTransform } from 'd3-zoom';

const FIT_PADDING = 48;
const FIT_MAX_SCALE = 1.6;
const FIND_MIN_SCALE = 1.5;

/** What the map is drawn on: the small room's SVG or the overview's canvas. */
export type ZoomSurface = SVGSVGElement | HTMLCanvasElement;

/** A press that moves less than this many pixels on the overview is a click, not a pan. */
const OVERVIEW_CLICK_DISTANCE = 3;

/**
 * Pan and zoom of the map (d3-zoom). On the SVG map, during a pan or wheel gesture the drawing is
 * moved as one composited layer (a CSS transform relative to where the gesture began) together
 * with its drag `overlay`; the SVG itself is redrawn once, at the end, through `apply`. Without an
 * overlay (the overview's canvas) every step goes to `apply`, which redraws on the next frame.
 */
export class MapZoom {
  private current: ZoomTransform = zoomIdentity;
  private gestureBase: ZoomTransform | null = null;
  private readonly behaviour: ZoomBehavior<ZoomSurface, unknown>;

  constructor(
    private readonly svg: ZoomSurface,
    private readonly overlay: SVGSVGElement | null,
    private readonly apply: (t: ZoomTransform) => void,
  ) {
    this.behaviour = zoom<ZoomSurface, unknown>()
      .scaleExtent([0.05, 6])
      // Shift + drag on the background is the rubber band, not a pan.
      .filter((e: MouseEvent & WheelEvent) => (!e.ctrlKey || e.type === 'wheel') && !e.button && !e.shiftKey)
      .on('start', (e: { sourceEvent: Event | null }) => this.gestureStart(e.sourceEvent))
      .on('zoom', (e: { transform: ZoomTransform; sourceEvent: Event | null }) => this.zoomed(e.transform, e.sourceEvent))
      .on('end', () => this.gestureEnd());
    if (!overlay) this.behaviour.clickDistance(OVERVIEW_CLICK_DISTANCE);
    select(svg).call(this.behaviour).on('dblclick.zoom', null);
  }

  get transform(): ZoomTransform {
    return this.current;
  }

  /** A point on the screen (relative to the map's corner) in the drawing's coordinates. */
  invert(point: [number, number]): [number, number] {
    return this.current.invert(point);
  }

  /** A pointer event's place in the drawing's coordinates. */
  toGraph(e: MouseEvent): [number, number] {
    const rect = this.svg.getBoundingClientRect();
    return this.invert([e.clientX - rect.left, e.clientY - rect.top]);
  }

  scaleBy(factor: number): void {
    select(this.svg).call(this.behaviour.scaleBy, factor);
  }

  /** Frames all these points (does nothing before the map has a size). */
  fit(points: readonly { x: number; y: number }[]): void {
    const t = fitTransform(points, this.svg.clientWidth, this.svg.clientHeight);
    if (t) select(this.svg).call(this.behaviour.transform, t);
  }

  /** Centres the view on (x, y), zooming in to at least FIND_MIN_SCALE. */
  centreOn(x: number, y: number): void {
    const k = Math.max(this.current.k, FIND_MIN_SCALE);
    const t = zoomIdentity
      .translate(this.svg.clientWidth / 2, this.svg.clientHeight / 2)
      .scale(k)
      .translate(-x, -y);
    select(this.svg).call(this.behaviour.transform, t);
  }

  /** The middle of what the map shows now, in the drawing's coordinates. */
  centre(): [number, number] {
    return this.invert([this.svg.clientWidth / 2 || 300, this.svg.clientHeight / 2 || 200]);
  }

  /** Takes over another surface's pan and zoom (the map switched between SVG and overview). */
  adopt(t: ZoomTransform): void {
    select(this.svg).call(this.behaviour.transform, t);
  }

  private gestureStart(source: Event | null): void {
    if (!source || !this.overlay) return;
    this.gestureBase = this.current;
    this.svg.classList.add('rh-gesture');
    this.overlay.classList.add('rh-gesture');
  }

  private zoomed(t: ZoomTransform, source: Event | null): void {
    this.current = t;
    const base = this.gestureBase;
    if (base && source && this.overlay) {
      const s = t.k / base.k;
      const css = `translate(${t.x - s * base.x}px, ${t.y - s * base.y}px) scale(${s})`;
      this.svg.style.transform = css;
      this.overlay.style.transform = css;
      return;
    }
    this.apply(t);
  }

  private gestureEnd(): void {
    if (!this.gestureBase || !this.overlay) return;
    this.gestureBase = null;
    this.svg.style.transform = '';
    this.overlay.style.transform = '';
    this.svg.classList.remove('rh-gesture');
    this.overlay.classList.remove('rh-gesture');
    this.apply(this.current);
  }
}

/** The transform that shows every point inside a width x height view, centred, at most FIT_MAX_SCALE. */
export function fitTransform(points: readonly { x: number; y: number }[], width: number, height: number): ZoomTransform | null {
  if (!points.length || !width) return null;
  const [x0, x1, y0, y1] = bounds(points);
  const k = Math.min(FIT_MAX_SCALE, (width - FIT_PADDING * 2) / Math.max(x1 - x0, 1), (height - FIT_PADDING * 2) / Math.max(y1 - y0, 1));
  return zoomIdentity
    .translate(width / 2, height / 2)
    .scale(k)
    .translate(-(x0 + x1) / 2, -(y0 + y1) / 2);
}

/** The smallest and largest x and y of some points (a loop: a spread of 100,000 arguments overflows the stack). */
export function bounds(points: readonly { x: number; y: number }[]): [x0: number, x1: number, y0: number, y1: number] {
  let [x0, x1, y0, y1] = [Infinity, -Infinity, Infinity, -Infinity];
  for (const p of points) {
    x0 = Math.min(x0, p.x);
    x1 = Math.max(x1, p.x);
    y0 = Math.min(y0, p.y);
    y1 = Math.max(y1, p.y);
  }
  return [x0, x1, y0, y1];
}
