import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { RoomDto } from '../../../../shared/api/rooms';
import { RoomEditor } from '../editor/room-editor';
import { groupStyles } from './group-style';
import { type Band, keyDelta, MapGestures, type MapGestureHost } from './map-gestures';
import { MapGraph } from './map-graph';
import { MapRenderer, SVG_NS } from './map-renderer';
import { MapZoom } from './map-zoom';

const ROOM: RoomDto = {
  id: 7,
  name: 'Gesture room',
  description: '',
  settings: { directed: false, minutesPerHop: 5, laziness: 0, mixing: 0 },
  version: 1,
  access: 'owner',
  ownerName: 'Owner',
  people: [
    { id: 1, key: 'A', name: 'Asha', group: null, email: null, x: 0, y: 0, pinned: false },
    { id: 2, key: 'B', name: 'Dara', group: null, email: null, x: 200, y: 0, pinned: true },
  ],
  ties: [{ id: 11, sourceId: 1, targetId: 2, strength: 1 }],
  updatedAt: '2026-01-01T00:00:00Z',
};

describe('MapGestures', () => {
  let svg: SVGSVGElement;
  let overlay: SVGSVGElement;
  let editor: RoomEditor;
  let halted: number;
  let bands: (Band | null)[];

  async function setup(room: RoomDto = ROOM): Promise<void> {
    TestBed.configureTestingModule({ providers: [RoomEditor, provideHttpClient(), provideHttpClientTesting()] });
    editor = TestBed.inject(RoomEditor);
    editor.load(room.id);
    TestBed.inject(HttpTestingController).expectOne(`/api/rooms/${room.id}`).flush(room);
    svg = document.createElementNS(SVG_NS, 'svg');
    overlay = document.createElementNS(SVG_NS, 'svg');
    svg.setAttribute('style', 'width: 400px; height: 300px; display: block; position: fixed; left: 0; top: 0');
    document.body.append(svg, overlay);
    const graph = new MapGraph();
    const renderer = new MapRenderer(svg, overlay);
    const zoom = new MapZoom(svg, overlay, () => undefined);
    halted = 0;
    bands = [];
    const host: MapGestureHost = {
      editor,
      graph,
      renderer,
      zoom,
      tool: () => 'select',
      haltLayout: () => halted++,
      placeNames: () => undefined,
      showBand: (b) => bands.push(b),
    };
    graph.update(editor.people(), editor.ties(), new Set());
    renderer.draw(graph, editor.people(), groupStyles([]), false, true);
    const gestures = new MapGestures(host);
    gestures.listen(svg);
    gestures.bindPeople(renderer.peopleLayer, graph.nodeList(), editor.canEdit());
  }

  afterEach(() => {
    svg?.remove();
    overlay?.remove();
  });

  const personEl = (lid: string) => svg.querySelector(`g.person[data-lid="${lid}"]`);
  const key = (lid: string, k: string, shiftKey = false) =>
    personEl(lid)?.dispatchEvent(new KeyboardEvent('keydown', { key: k, shiftKey, bubbles: true, cancelable: true }));

  it('Enter selects the focused person, Shift+Enter adds to the selection', async () => {
    await setup();
    key('p1', 'Enter');
    expect(editor.selection.ids()).toEqual(['p1']);
    key('p2', 'Enter', true);
    expect(editor.selection.ids()).toEqual(['p1', 'p2']);
    key('p2', ' ');
    expect(editor.selection.ids()).toEqual(['p2']);
  });

  it('an arrow key selects the person if needed, moves the selection, stops the layout, and a second key moves on', async () => {
    await setup();
    key('p1', 'ArrowRight');
    expect(editor.selection.ids()).toEqual(['p1']);
    expect(halted).toBe(1);
    key('p1', 'ArrowDown', true);
    expect([editor.model.person('p1').x, editor.model.person('p1').y]).toEqual([10, 50]);
    expect(editor.model.person('p2').x).withContext('not selected, not moved').toBe(200);
    expect(editor.history().undo).toBeTruthy();
  });

  it('a viewer selects with the keyboard but cannot move anyone', async () => {
    await setup({ ...ROOM, access: 'viewer' });
    key('p1', 'ArrowLeft');
    expect(editor.model.person('p1').x).toBe(0);
    key('p1', 'Enter');
    expect(editor.selection.ids()).toEqual(['p1']);
  });

  it('a click near a tie selects it, a click on empty space clears the selection', async () => {
    await setup();
    const rect = svg.getBoundingClientRect();
    editor.selection.only('p1');
    svg.dispatchEvent(new MouseEvent('click', { clientX: rect.left + 100, clientY: rect.top + 3, bubbles: true }));
    expect(editor.selection.tie).toBe('t11');
    expect(editor.selection.size).toBe(0);
    svg.dispatchEvent(new MouseEvent('click', { clientX: rect.left + 100, clientY: rect.top + 60, bubbles: true }));
    expect(editor.selection.tie).toBeNull();
  });
});

describe('keyDelta', () => {
  it('moves 10 for an arrow key, 50 with Shift, nothing for other keys', () => {
    expect(keyDelta('ArrowLeft', false)).toEqual([-10, 0]);
    expect(keyDelta('ArrowUp', true)).toEqual([0, -50]);
    expect(keyDelta('ArrowDown', false)).toEqual([0, 10]);
    expect(keyDelta('ArrowRight', true)).toEqual([50, 0]);
    expect(keyDelta('a', false)).toBeNull();
  });
});
