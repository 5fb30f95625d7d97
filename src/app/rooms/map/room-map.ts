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
import { type MapDocument, mapSvgDocument } from './map-export';
import { type Band, MapGestures, type MapTool } from './map-gestures';
import { MapGraph, structureOf } from './map-graph';
import { createSimulation, layoutMode, type LayoutMode, type MapLink, type MapNode, placeUnplaced } from './map-layout';
import { MapRenderer } from './map-renderer';
import { MapZoom } from './map-zoom';

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

/**
 * The communication map: d3-force layout (map-layout.ts), drawn in SVG by MapRenderer, panned and
 * zoomed by MapZoom, driven by MapGestures. Per frame it touches only what moved: a drag updates
 * the dragged people and their own ties; a layout tick updates positions and nothing else.
 */
@Component({
  selector: 'app-room-map',
  templateUrl: './room-map.html',
  styleUrl: './room-map.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // The drawing is built with DOM calls, so its styles cannot be scoped by Angular.
  encapsulation: ViewEncapsulation.None,
  host: { class: 'rh-room-map' },
})
export class RoomMap implements OnDestroy {
  private readonly editor = inject(RoomEditor);
  readonly tool = input<MapTool>('select');
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly overlayRef = viewChild.required<ElementRef<SVGSVGElement>>('overlay');

  readonly mode = signal<LayoutMode>('full');
  protected readonly band = signal<Band | null>(null);
  protected readonly layoutRunning = signal(false);

  private readonly graph = new MapGraph();
  /** People the running layout must not move (it only places newcomers). */
  private readonly held = new Set<string>();
  private drawing: Drawing | null = null;
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

  private sync(): void {
    const room = this.editor.room();
    if (!room) return;
    this.drawing ??= this.setup();
    const { renderer } = this.drawing;
    const people = this.editor.people();
    const ties = this.editor.ties();
    const { newcomers } = this.graph.update(people, ties, this.held);
    const signature = structureOf(people, ties, room.settings.directed);
    if (signature === this.signature && !newcomers) {
      // Only places changed (a move, an undo of a move): update positions, keep the elements.
      renderer.reattach(this.graph);
      renderer.placeAll(this.graph);
      renderer.paintPins(this.graph, people);
      if (!this.layoutRunning()) this.placeNames();
      return;
    }
    this.signature = signature;
    this.redraw(this.drawing, room.settings.directed, newcomers);
  }

  /** The room's structure changed: place newcomers, draw everything anew, keep the layout going. */
  private redraw({ renderer, zoom, gestures }: Drawing, directed: boolean, newcomers: boolean): void {
    const people = this.editor.people();
    const nodes = this.graph.nodeList();
    const mode = layoutMode(nodes.length);
    this.mode.set(mode);
    const noneSaved = people.length > 0 && people.every((p) => p.x === null || p.y === null);
    // Newcomers to a drawn map start where the user is looking, not beside everyone else.
    if (!noneSaved && this.fitted && mode !== 'static')
      for (const n of nodes) if (n.x === undefined || n.y === undefined) [n.x, n.y] = this.freeSpotInView();
    placeUnplaced(nodes);
    renderer.draw(this.graph, people, groupStyles(this.editor.groups()), directed, people.length <= KEYBOARD_STOPS_MAX);
    gestures.bindPeople(
      renderer.peopleLayer,
      people.flatMap((p) => this.graph.node(p.lid) ?? []),
      this.editor.canEdit(),
    );
    renderer.showLabels(zoom.transform.k);
    this.placeNames();
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

  private paintSelection(): void {
    this.drawing?.renderer.paintSelection(this.graph, this.editor.selection);
  }

  private placeNames(): void {
    this.drawing?.renderer.placeNames(this.graph, (lid) => this.editor.model.people.get(lid)?.name ?? '');
  }

  // ---- view commands (toolbar) ----

  zoomBy(factor: number): void {
    this.drawing?.zoom.scaleBy(factor);
  }

  fit(): void {
    this.drawing?.zoom.fit(this.graph.points());
  }

  /** Centres the map on a person and rings them. */
  find(lid: string): void {
    const n = this.graph.node(lid);
    if (!n || !this.drawing) return;
    this.drawing.zoom.centreOn(n.x ?? 0, n.y ?? 0);
    this.drawing.renderer.ringPerson(this.graph, lid);
  }

  /** A free place near the middle of what the map shows now, for a new person. */
  freeSpotInView(): [number, number] {
    const [cx, cy] = this.drawing?.zoom.centre() ?? [300, 200];
    return this.graph.freeSpotNear(cx, cy);
  }

  /** The map as a stand-alone SVG document (for the PNG export), framed around everyone. */
  svgForExport(): MapDocument | null {
    return this.drawing ? mapSvgDocument(this.drawing.svg, this.drawing.renderer, this.graph) : null;
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
      .on('tick', () => this.drawing?.renderer.placeAll(this.graph))
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
    this.drawing?.renderer.placeAll(this.graph);
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
