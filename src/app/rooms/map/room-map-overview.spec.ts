import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { RoomDto } from '../../../../shared/api/rooms';
import { RoomEditor } from '../editor/room-editor';
import { MapInspector } from '../room/map-inspector';
import { MapPanel } from '../room/map-panel';
import { OVERVIEW_FROM } from './overview-renderer';

/** A room of n people on a grid 40 apart, the first two tied; person i is "Member i". */
function gridRoom(n: number): RoomDto {
  return {
    id: 9,
    name: 'Grid room',
    description: '',
    settings: { directed: false, minutesPerHop: 5, laziness: 0, mixing: 0 },
    version: 1,
    access: 'owner',
    ownerName: 'Owner',
    people: Array.from({ length: n }, (_, i) => ({
      id: i + 1,
      key: `m${i}`,
      name: `Member ${i}`,
      group: i % 2 ? 'Floor' : 'Desk',
      email: null,
      x: (i % 50) * 40,
      y: Math.floor(i / 50) * 40,
      pinned: false,
    })),
    ties: [{ id: 1, sourceId: 1, targetId: 2, strength: 1 }],
    updatedAt: '2026-01-01T00:00:00Z',
  };
}

@Component({
  selector: 'app-overview-host',
  imports: [MapPanel, MapInspector],
  providers: [RoomEditor],
  template: `<div style="width: 640px; height: 460px"><app-map-panel /></div>
    <app-map-inspector />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class OverviewHost {
  readonly editor = inject(RoomEditor);
}

describe('RoomMap as the overview (large rooms)', () => {
  let fixture: ComponentFixture<OverviewHost>;
  let host: HTMLElement;

  async function open(room: RoomDto): Promise<void> {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    fixture = TestBed.createComponent(OverviewHost);
    host = fixture.nativeElement;
    document.body.append(host);
    fixture.componentInstance.editor.load(room.id);
    TestBed.inject(HttpTestingController).expectOne(`/api/rooms/${room.id}`).flush(room);
    await fixture.whenStable();
  }

  const canvas = () => host.querySelector<HTMLCanvasElement>('app-room-map canvas')!;
  const frame = () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));

  afterEach(() => host?.remove());

  it(`stays the SVG map one person below ${OVERVIEW_FROM}`, async () => {
    await open(gridRoom(OVERVIEW_FROM - 1));
    expect(host.querySelectorAll('app-room-map g.person').length).toBe(OVERVIEW_FROM - 1);
    expect(getComputedStyle(canvas()).display).toBe('none');
    expect(host.querySelector('[aria-label="Pointer tool"]')).not.toBeNull();
  });

  it(`from ${OVERVIEW_FROM} people draws one canvas that names the room's size, and says what it leaves out`, async () => {
    await open(gridRoom(OVERVIEW_FROM));
    await frame();
    expect(host.querySelectorAll('app-room-map g.person').length).toBe(0);
    const c = canvas();
    expect(getComputedStyle(c).display).toBe('block');
    expect(c.getAttribute('role')).toBe('img');
    expect(c.getAttribute('aria-label')).toMatch(/^Overview map of this room: 1,500 people and 1 tie\./);
    expect(c.getAttribute('aria-busy')).toBe('false');
    expect(c.tabIndex).toBe(0);
    expect(host.querySelector('#rh-overview-note')?.textContent).toContain('Dragging people, drawing ties on the map');
    expect(host.querySelector('[aria-label="Pointer tool"]')).withContext('no tie tool on the overview').toBeNull();
  });

  it('a click picks the person under the pointer, the side panel edits them and the live region says who', async () => {
    await open(gridRoom(OVERVIEW_FROM));
    const editor = fixture.componentInstance.editor;
    // Centre the view on Member 51 (x 40, y 40) the way "Find a person" does.
    const panel = fixture.debugElement.query((d) => d.componentInstance instanceof MapPanel).componentInstance as MapPanel;
    panel.map().find('p52');
    await frame();
    const rect = canvas().getBoundingClientRect();
    canvas().dispatchEvent(
      new MouseEvent('click', { clientX: rect.left + rect.width / 2, clientY: rect.top + rect.height / 2, bubbles: true }),
    );
    await fixture.whenStable();
    expect(editor.selection.ids()).toEqual(['p52']);
    expect(host.querySelector('app-map-inspector h3')?.textContent).toContain('Member 51');
    expect(host.querySelector('app-room-map [role="status"]')?.textContent?.trim()).toBe('Selected: Member 51, Floor, 0 ties.');

    // With the map focused, the arrow keys move the selection as on the small map, and Escape clears it.
    canvas().focus();
    canvas().dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true }));
    expect(editor.model.person('p52').x).toBe(50);
    canvas().dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape', bubbles: true }));
    await fixture.whenStable();
    expect(editor.selection.size).toBe(0);
    expect(host.querySelector('app-room-map [role="status"]')?.textContent?.trim()).toBe('Nobody selected.');
  });
});
