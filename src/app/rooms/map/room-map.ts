import {
  ChangeDetectionStrategy,
  Component,
  effect,
  ViewEncapsulation,
  type ElementRef,
  inject,
  input,
  type OnDestroy,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import type { ForceLink, Simulation } from 'd3-force';
import { RoomEditor } from '../editor/room-editor';
import type { Move } from '../editor/room-model';
import { groupStyles } from './group-style';
import { mapSvgDocument } from './map-export';
import { type Band, MapGestures, type MapTool } from './map-gestures';
import { MapGraph, structureOf } from './map-graph';
import { createSimulation, layoutMode, type LayoutMode, type MapLink, type MapNode, placeUnplaced } from './map-layout';
import { downloadCanvasPng, downloadMapPng } from './map-export';
import { MapOverview } from './map-overview';
import { MapRenderer } from './map-renderer';
import { MapZoom } from './map-zoom';
import { OVERVIEW_FROM, usesOverview } from './overview-renderer';

export type { MapTool } from './map-gestures';

/** Up to this many people each is a Tab stop; above, the keyboard path is "Find a person". */
const KEYBOARD_STOPS_MAX = 400;

/** The drawing's parts, made once the SVG elements exist (on the first room). */
interface Drawing {
  svg: SVGSVGElement;
  renderer: MapRenderer;
  zoom: MapZoom;
  gestures: MapGestures;
}

const count = new Intl.NumberFormat('en-GB');

/** The overview canvas's accessible name: what it shows and how to reach a person without it. */
function overviewLabel(people: number, ties: number): string {
  return (
    `Overview map of this room: ${count.format(people)} people and ${count.format(ties)} ${ties === 1 ? 'tie' : 'ties'}. ` +
    'Click a person to select them, or reach anyone by name with the search box above the map.'
  );
}

/**
 * The communication map: d3-force layout (map-layout.ts), drawn in SVG by MapRenderer, panned and
 * zoomed by MapZoom, driven by MapGestures. Per frame it touches only what moved: a drag updates
 * the dragged people and their own ties; a layout tick updates positions and nothing else.
 * From OVERVIEW_FROM people the map is the overview instead (map-overview.ts): one canvas,
 * redrawn per frame, where a click selects and the side panel edits.
 */
@Component({
  selector: 'app-room-map',
  templateUrl: './room-map.html',
  styleUrl: './room-map.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // The drawing is built with DOM calls, so its styles cannot be scoped by Angular.
  encapsulation: ViewEncapsulation.None,
  host: { class: 'rh-room-map', '[class.rh-overview]': 'overview()' },
})
export class RoomMap implements OnDestroy {
  private readonly editor = inject(RoomEditor);
  readonly tool = input<MapTool>('select');
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly overlayRef = viewChild.required<ElementRef<SVGSVGElement>>('overlay');
  private readonly canvasRef = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');

  readonly mode = signal<LayoutMode>('full');
  /** The room is drawn as the overview (a canvas) rather than the SVG map. */
  readonly overview = signal(false);
  protected readonly overviewFrom = count.format(OVERVIEW_FROM);
  protected readonly overviewLabel = signal('');
  /** What the live region says about the selection on the overview. */
  protected readonly announcement = signal('');
  protected readonly band = signal<Band | null>(null);
  protected readonly layoutRunning = signal(false);

  private readonly graph = new MapGraph();
  /** People the running layout must not move (it only places newcomers). */
  private readonly held = new Set<string>();
  private drawing: Drawing | null = null;
  private overviewDrawing: MapOverview | null = null;
  private sim: Simulation<MapNode, MapLink> | null = null;
  /** The structure last drawn (structureOf); a change redraws, a move only re-places. */
  private signature = '';
  private fitted = false;

  constructor() {
    effect(() => {
      this.editor.revision();
      this.editor.room();
      untracked(() => this.sync());
    });
    effect(() => {
      this.editor.selectionRevision();
      untracked(() => this.paintSelection());
    });
  }

  ngOnDestroy(): void {
    this.sim?.stop();
    this.overviewDrawing?.destroy();
  }

  /** The pan and zoom of whichever surface shows the room. */
  private get zoom(): MapZoom | null {
    return (this.overview() ? this.overviewDrawing?.zoom : this.drawing?.zoom) ?? null;
  }

  private setup(): Drawing {
    const svg = this.svgRef().nativeElement;
    const overlay = this.overlayRef().nativeElement;
    const renderer = new MapRenderer(svg, overlay);
    const zoom = new MapZoom(svg, overlay, (t) => renderer.setTransform(t.toString(), t.k));
    const gestures = new MapGestures({
      editor: this.editor,
      graph: this.graph,
      renderer,
      zoom,
      tool: () => this.tool(),
      haltLayout: () => this.haltLayout(),
      placeNames: () => this.placeNames(),
      showBand: (b) => this.band.set(b),
    });
    gestures.listen(svg);
    return { svg, renderer, zoom, gestures };
  }

  private setupOverview(): MapOverview {
    const overview = new MapOverview(this.canvasRef().nativeElement, {
      editor: this.editor,
      graph: this.graph,
      haltLayout: () => this.haltLayout(),
    });
    overview.renderer.onDrawn = () => overview.canvas.setAttribute('aria-busy', 'false');
    return overview;
  }

  /** Shows the SVG map or the overview (the room crossed OVERVIEW_FROM), keeping the pan and zoom. */
  private chooseSurface(overview: boolean): void {
    if (overview === this.overview() && (overview ? this.overviewDrawing : this.drawing)) return;
    const before = this.zoom?.transform;
    this.overview.set(overview);
    this.svgRef().nativeElement.classList.toggle('rh-map-off', overview);
    this.canvasRef().nativeElement.classList.toggle('rh-map-off', !overview);
    if (overview) {
      this.drawing?.renderer.clear();
      this.overviewDrawing ??= this.setupOverview();
    } else this.drawing ??= this.setup();
    this.signature = '';
    if (before && this.fitted) this.zoom?.adopt(before);
  }

  private sync(): void {
    const room = this.editor.room();
    if (!room) return;
    const people = this.editor.people();
    const ties = this.editor.ties();
    this.chooseSurface(usesOverview(people.length));
    const { newcomers } = this.graph.update(people, ties, this.held);
    const signature = structureOf(people, ties, room.settings.directed);
    const placesOnly = signature === this.signature && !newcomers;
    if (this.overview()) {
      this.overviewLabel.set(overviewLabel(people.length, ties.length));
      if (placesOnly) {
        this.overviewDrawing?.renderer.setPins(people);
        this.overviewDrawing?.renderer.placesChanged();
        return;
      }
    } else if (placesOnly && this.drawing) {
      // Only places changed (a move, an undo of a move): update positions, keep the elements.
      const { renderer } = this.drawing;
      renderer.reattach(this.graph);
      renderer.placeAll(this.graph);
      renderer.paintPins(this.graph, people);
      if (!this.layoutRunning()) this.placeNames();
      return;
    }
    this.signature = signature;
    this.redraw(room.settings.directed, newcomers);
  }

  /** The room's structure changed: place newcomers, draw everything anew, keep the layout going. */
  private redraw(directed: boolean, newcomers: boolean): void {
    const people = this.editor.people();
    const nodes = this.graph.nodeList();
    const mode = layoutMode(nodes.length);
    this.mode.set(mode);
    const noneSaved = people.length > 0 && people.every((p) => p.x === null || p.y === null);
    // Newcomers to a drawn map start where the user is looking, not beside everyone else.
    if (!noneSaved && this.fitted && mode !== 'static')
      for (const n of nodes) if (n.x === undefined || n.y === undefined) [n.x, n.y] = this.freeSpotInView();
    placeUnplaced(nodes);
    if (this.overview()) {
      this.canvasRef().nativeElement.setAttribute('aria-busy', 'true');
      this.overviewDrawing?.renderer.setRoom(this.graph, people, groupStyles(this.editor.groups()), directed);
    } else if (this.drawing) this.drawSvg(this.drawing, directed);
    this.paintSelection();
    if (!this.fitted && nodes.length) {
      this.fit();
      this.fitted = true;
    }
    if (this.sim && this.layoutRunning()) {
      this.sim.nodes(nodes);
      this.sim.force<ForceLink<MapNode, MapLink>>('link')?.links([...this.graph.links]);
    }
    if (mode !== 'static' && newcomers && this.editor.canEdit()) this.runLayout(noneSaved);
    else if (newcomers) this.saveLayout(nodes.filter((n) => !n.pinned));
  }

  private drawSvg({ renderer, zoom, gestures }: Drawing, directed: boolean): void {
    const people = this.editor.people();
    renderer.draw(this.graph, people, groupStyles(this.editor.groups()), directed, people.length <= KEYBOARD_STOPS_MAX);
    gestures.bindPeople(
      renderer.peopleLayer,
      people.flatMap((p) => this.graph.node(p.lid) ?? []),
      this.editor.canEdit(),
    );
    renderer.showLabels(zoom.transform.k);
    this.placeNames();
  }

  private paintSelection(): void {
    if (!this.overview()) {
      this.drawing?.renderer.paintSelection(this.graph, this.editor.selection);
      return;
    }
    this.overviewDrawing?.renderer.setSelection(this.editor.selection);
    this.announcement.set(this.selectionSentence());
  }

  /** The selection in words, for the overview's live region. */
  private selectionSentence(): string {
    const s = this.editor.selection;
    const m = this.editor.model;
    if (s.tie) {
      const t = m.ties.get(s.tie);
      return t ? `Selected tie: ${m.people.get(t.source)?.name ?? '?'} and ${m.people.get(t.target)?.name ?? '?'}.` : '';
    }
    if (s.size > 1) return `${count.format(s.size)} people selected.`;
    const p = s.size === 1 ? m.people.get(s.ids()[0] ?? '') : undefined;
    if (!p) return 'Nobody selected.';
    const ties = m.tiesOf(p.lid).length;
    return `Selected: ${p.name}${p.group ? `, ${p.group}` : ''}, ${ties} ${ties === 1 ? 'tie' : 'ties'}.`;
  }

  private placeNames(): void {
    if (this.overview()) return;
    this.drawing?.renderer.placeNames(this.graph, (lid) => this.editor.model.people.get(lid)?.name ?? '');
  }

  /** Puts everyone where the graph has them (a layout step). */
  private placeAll(): void {
    if (this.overview()) this.overviewDrawing?.renderer.placesChanged();
    else this.drawing?.renderer.placeAll(this.graph);
  }

  // ---- view commands (toolbar) ----

  zoomBy(factor: number): void {
    this.zoom?.scaleBy(factor);
  }

  fit(): void {
    this.zoom?.fit(this.graph.points());
  }

  /** Centres the map on a person and rings them. */
  find(lid: string): void {
    const n = this.graph.node(lid);
    const zoom = this.zoom;
    if (!n || !zoom) return;
    zoom.centreOn(n.x ?? 0, n.y ?? 0);
    if (this.overview()) this.overviewDrawing?.renderer.ringPerson(lid);
    else this.drawing?.renderer.ringPerson(this.graph, lid);
  }

  /** A free place near the middle of what the map shows now, for a new person. */
  freeSpotInView(): [number, number] {
    const [cx, cy] = this.zoom?.centre() ?? [300, 200];
    return this.graph.freeSpotNear(cx, cy);
  }

  /** Downloads a PNG of the whole map, framed around everyone; false when there is nothing to draw. */
  async exportPng(fileName: string): Promise<boolean> {
    if (this.overview()) {
      const picture = this.overviewDrawing?.picture(this.graph.points());
      if (!picture) return false;
      await downloadCanvasPng(picture, fileName);
      return true;
    }
    const doc = this.drawing ? mapSvgDocument(this.drawing.svg, this.drawing.renderer, this.graph) : null;
    if (!doc) return false;
    await downloadMapPng(doc, fileName);
    return true;
  }

  // ---- layout ----

  /** Runs the force layout. With `all`, everyone not pinned moves; else only people new to the map. */
  runLayout(all = true): void {
    const nodes = this.graph.nodeList();
    if (!nodes.length || this.mode() === 'static') return;
    this.sim?.stop();
    this.held.clear();
    const held = all ? [] : this.holdPlaced(nodes);
    const sim = createSimulation(nodes, [...this.graph.links], this.mode());
    this.sim = sim;
    this.layoutRunning.set(true);
    sim
      .alpha(all ? 1 : 0.5)
      .on('tick', () => this.placeAll())
      .on('end', () => this.layoutEnded(nodes, held, all))
      .restart();
  }

  /** Fixes everyone with a saved place who is not pinned, so the layout only places newcomers. */
  private holdPlaced(nodes: readonly MapNode[]): MapNode[] {
    const held: MapNode[] = [];
    for (const n of nodes) {
      const p = this.editor.model.people.get(n.lid);
      if (p && p.x !== null && !n.pinned) {
        n.fx = n.x;
        n.fy = n.y;
        held.push(n);
        this.held.add(n.lid);
      }
    }
    return held;
  }

  private layoutEnded(nodes: readonly MapNode[], held: readonly MapNode[], all: boolean): void {
    for (const n of held) {
      n.fx = null;
      n.fy = null;
    }
    this.held.clear();
    this.layoutRunning.set(false);
    this.placeAll();
    this.placeNames();
    const heldSet = new Set(held);
    this.saveLayout(nodes.filter((n) => !n.pinned && !heldSet.has(n)));
    if (all) this.fit();
  }

  stopLayout(): void {
    if (!this.sim) return;
    this.sim.stop();
    this.sim.on('end')?.call(this.sim);
  }

  /** A person moved by hand: the running layout stops and leaves everyone where they are. */
  private haltLayout(): void {
    this.sim?.stop();
    this.layoutRunning.set(false);
  }

  private saveLayout(nodes: MapNode[]): void {
    const moves: Move[] = nodes.map((n) => ({ lid: n.lid, x: Math.round(n.x ?? 0), y: Math.round(n.y ?? 0), pinned: n.pinned }));
    this.editor.recordLayout(moves);
  }
}
