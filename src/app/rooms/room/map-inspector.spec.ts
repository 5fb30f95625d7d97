import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { RoomDto } from '../../../../shared/api/rooms';
import { RoomEditor } from '../editor/room-editor';
import { RoomMap } from '../map/room-map';
import { MapInspector } from './map-inspector';

const ROOM: RoomDto = {
  id: 9,
  name: 'Side panel room',
  description: '',
  settings: { directed: false, minutesPerHop: 5, laziness: 0, mixing: 0 },
  version: 1,
  access: 'owner',
  ownerName: 'Owner',
  people: [
    { id: 1, key: 'A', name: 'Asha', group: 'Sales', email: null, x: 0, y: 0, pinned: true },
    { id: 2, key: 'B', name: 'Dara', group: 'Ops', email: null, x: 120, y: 0, pinned: true },
    { id: 3, key: 'C', name: 'Cyd', group: 'Ops', email: null, x: 60, y: 90, pinned: true },
  ],
  ties: [
    { id: 11, sourceId: 1, targetId: 2, strength: 1 },
    { id: 12, sourceId: 2, targetId: 3, strength: 4 },
  ],
  updatedAt: '2026-01-01T00:00:00Z',
};

/** The map and its side panel, as the room page shows them. */
@Component({
  selector: 'app-inspector-host',
  imports: [RoomMap, MapInspector],
  providers: [RoomEditor],
  template: `<div style="width: 600px; height: 440px"><app-room-map /></div>
    <app-map-inspector />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class InspectorHost {
  readonly editor = inject(RoomEditor);
}

/** Defect: a name typed in the side panel went to the next person clicked on the map. */
describe('MapInspector edits go to the person they were typed for', () => {
  let host: HTMLElement;
  let editor: RoomEditor;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    const fixture = TestBed.createComponent(InspectorHost);
    host = fixture.nativeElement;
    document.body.append(host);
    editor = fixture.componentInstance.editor;
    const http = TestBed.inject(HttpTestingController);
    editor.load(9);
    http.expectOne('/api/rooms/9').flush(ROOM);
    await fixture.whenStable();
    // Select Asha the way a user does: a click on her shape.
    clickPerson('p1');
    await fixture.whenStable();
  });

  afterEach(() => host.remove());

  function shape(lid: string): SVGGElement {
    const g = host.querySelector<SVGGElement>(`g.person[data-lid="${lid}"]`);
    if (!g) throw new Error(`no shape for ${lid}`);
    return g;
  }

  /** A real click's order: mousedown (the map selects), the field loses focus (blur), mouseup. */
  function clickPerson(lid: string): void {
    const g = shape(lid);
    const box = g.getBoundingClientRect();
    const at = { bubbles: true, cancelable: true, view: window, clientX: box.x + box.width / 2, clientY: box.y + box.height / 2 };
    g.dispatchEvent(new MouseEvent('mousedown', at));
    (document.activeElement as HTMLElement | null)?.blur();
    window.dispatchEvent(new MouseEvent('mouseup', at));
    g.dispatchEvent(new MouseEvent('click', at));
  }

  function type(label: string, text: string): void {
    const input = [...host.querySelectorAll<HTMLInputElement>('app-map-inspector input')].find(
      (i) => i.closest('mat-form-field')?.querySelector('mat-label')?.textContent?.trim() === label,
    );
    if (!input) throw new Error(`no field ${label}`);
    input.focus();
    input.value = text;
    input.dispatchEvent(new Event('input', { bubbles: true }));
  }

  it('a name typed for Asha stays with Asha when Dara is clicked next', async () => {
    expect(editor.selection.ids()).toEqual(['p1']);
    type('Name', 'Ben');
    type('Group', 'HR');
    clickPerson('p2');
    await new Promise((r) => setTimeout(r));
    expect(editor.model.person('p1').name).toBe('Ben');
    expect(editor.model.person('p1').group).toBe('HR');
    expect(editor.model.person('p2').name).toBe('Dara');
    expect(editor.model.person('p2').group).toBe('Ops');
    expect(editor.selection.ids()).toEqual(['p2']);
    // The panel now shows Dara, with her own values.
    const name = host.querySelector<HTMLInputElement>('app-map-inspector input')!;
    expect(name.value).toBe('Dara');
    // Undo takes back Asha's changes (the group, then the name) and never touches Dara.
    editor.undo();
    editor.undo();
    expect(editor.model.person('p1').name).toBe('Asha');
    expect(editor.model.person('p1').group).toBe('Sales');
    expect(editor.model.person('p2').name).toBe('Dara');
  });

  it('a pending edit is committed even when the field never lost focus', async () => {
    type('Name', 'Asha Brook');
    // Selection moved without a blur (a keyboard shortcut, a find): the effect commits first.
    editor.selection.only('p3');
    editor.selectionChanged();
    await new Promise((r) => setTimeout(r));
    expect(editor.model.person('p1').name).toBe('Asha Brook');
    expect(editor.model.person('p3').name).toBe('Cyd');
  });

  it('an invalid pending edit is dropped visibly, never written to the next person', async () => {
    type('Name', '   ');
    clickPerson('p2');
    await new Promise((r) => setTimeout(r));
    expect(editor.model.person('p1').name).toBe('Asha');
    expect(editor.model.person('p2').name).toBe('Dara');
    expect(document.body.textContent).toContain('Your change to Asha was not kept');
  });
});
