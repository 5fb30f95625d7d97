import type { RoomEditor } from '../editor/room-editor';
import { keyDelta, nudgeSelection } from './map-gestures';
import type { MapGraph } from './map-graph';
import { bounds, MapZoom } from './map-zoom';
import { OverviewRenderer } from './overview-renderer';

/** How near (in screen pixels) a click must come to a tie to select it. */
const TIE_TOLERANCE = 6;

/** Room around everyone in the exported picture, in drawing units (names are written below people). */
const PICTURE_PADDING = 40;
/** The exported picture's longer side at most (px), so a very large room stays a file a browser can make. */
const PICTURE_MAX_SIDE = 6000;

/** What the overview acts on: the map component hands these over. */
export interface OverviewHost {
  readonly editor: RoomEditor;
  readonly graph: MapGraph;
  /** Stops a running layout (a person moved by the keyboard stays where they were put). */
  haltLayout(): void;
}

/**
 * The overview of a large room: the canvas, its renderer, pan and zoom (d3-zoom, redrawn on the
 * next animation frame), and what the pointer and keys do on it. A click picks the person under
 * the pointer (Shift adds or removes), else the tie, else clears the selection; hovering a person
 * writes their name; with the canvas focused, arrow keys move the selection and Escape clears it.
 * People are not dragged and ties are not drawn here: the side panel edits the selection.
 */
export class MapOverview {
  readonly renderer: OverviewRenderer;
  readonly zoom: MapZoom;
  private readonly resize: ResizeObserver;

  constructor(
    readonly canvas: HTMLCanvasElement,
    private readonly host: OverviewHost,
  ) {
    this.renderer = new OverviewRenderer(canvas);
    this.zoom = new MapZoom(canvas, null, () => this.showView());
    canvas.addEventListener('click', (e) => this.click(e));
    canvas.addEventListener('pointermove', (e) => this.hover(e));
    canvas.addEventListener('pointerleave', () => this.renderer.setHovered(null));
    canvas.addEventListener('keydown', (e) => this.key(e));
    canvas.addEventListener('focus', () => this.renderer.setFocused(canvas.matches(':focus-visible')));
    canvas.addEventListener('blur', () => this.renderer.setFocused(false));
    this.resize = new ResizeObserver(() => this.showView());
    this.resize.observe(canvas);
  }

  /** Hands the renderer the current pan, zoom and size. */
  showView(): void {
    const t = this.zoom.transform;
    this.renderer.setView({ k: t.k, x: t.x, y: t.y, width: this.canvas.clientWidth, height: this.canvas.clientHeight });
  }

  /** The whole room on a canvas of its own, on white, for the PNG export (null for an empty room). */
  picture(points: readonly { x: number; y: number }[]): HTMLCanvasElement | null {
    if (!points.length) return null;
    const pad = PICTURE_PADDING;
    const [minX, maxX, minY, maxY] = bounds(points);
    const x0 = minX - pad;
    const y0 = minY - pad;
    const width = maxX - x0 + pad;
    const height = maxY - y0 + pad;
    const scale = Math.min(2, PICTURE_MAX_SIDE / Math.max(width, height));
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(width * scale);
    canvas.height = Math.round(height * scale);
    const ctx = canvas.getContext('2d');
    if (!ctx) return null;
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    this.renderer.drawInto(ctx, { k: 1, x: -x0, y: -y0, width, height }, scale);
    return canvas;
  }

  destroy(): void {
    this.resize.disconnect();
  }

  private screenPoint(e: MouseEvent): [number, number] {
    const rect = this.canvas.getBoundingClientRect();
    return [e.clientX - rect.left, e.clientY - rect.top];
  }

  private click(e: MouseEvent): void {
    const { editor, graph } = this.host;
    const s = editor.selection;
    const person = this.renderer.personAt(...this.screenPoint(e));
    if (person) {
      if (e.shiftKey) s.toggle(person.lid);
      else s.only(person.lid);
    } else {
      const [x, y] = this.zoom.toGraph(e);
      const tie = graph.tieAt(x, y, TIE_TOLERANCE / this.zoom.transform.k);
      if (tie) s.selectTie(tie.lid);
      else if (!e.shiftKey) s.clear();
    }
    editor.selectionChanged();
  }

  private hover(e: PointerEvent): void {
    if (e.buttons) return;
    const person = this.renderer.personAt(...this.screenPoint(e));
    this.canvas.style.cursor = person ? 'pointer' : '';
    this.renderer.setHovered(person?.lid ?? null);
  }

  private key(e: KeyboardEvent): void {
    const { editor } = this.host;
    if (e.key === 'Escape' && (editor.selection.size || editor.selection.tie)) {
      e.preventDefault();
      editor.selection.clear();
      editor.selectionChanged();
      return;
    }
    const d = keyDelta(e.key, e.shiftKey);
    if (!d || !editor.canEdit() || !editor.selection.size) return;
    e.preventDefault();
    nudgeSelection(this.host, d);
  }
}
