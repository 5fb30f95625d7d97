import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { type BaseHarnessFilters, ComponentHarness, type HarnessLoader, HarnessPredicate, TestKey } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatAutocompleteHarness } from '@angular/material/autocomplete/testing';
import { MatButtonToggleGroupHarness } from '@angular/material/button-toggle/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import type { RoomDto } from '../../../../shared/api/rooms';
import { RoomEditor } from '../editor/room-editor';
import { MapInspector } from '../room/map-inspector';
import { MapPanel } from '../room/map-panel';

const ROOM: RoomDto = {
  id: 4,
  name: 'Keyboard room',
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
  ties: [{ id: 11, sourceId: 1, targetId: 2, strength: 1 }],
  updatedAt: '2026-01-01T00:00:00Z',
};

/** A person drawn on the map: an SVG group with role=button, its name as label and aria-pressed for the selection. */
class MapPersonHarness extends ComponentHarness {
  static hostSelector = 'app-room-map g.person';

  static with(options: BaseHarnessFilters & { label?: string | RegExp } = {}): HarnessPredicate<MapPersonHarness> {
    return new HarnessPredicate(MapPersonHarness, options).addOption('label', options.label, (h, label) =>
      HarnessPredicate.stringMatches(h.label(), label),
    );
  }

  async label(): Promise<string | null> {
    return (await this.host()).getAttribute('aria-label');
  }

  async isSelected(): Promise<boolean> {
    return (await (await this.host()).getAttribute('aria-pressed')) === 'true';
  }

  async position(): Promise<string | null> {
    return (await this.host()).getAttribute('transform');
  }

  /** Focuses the person the way Tab does and presses a key on it, with Shift if asked. */
  async press(key: TestKey, modifiers: { shift?: boolean } = {}): Promise<void> {
    const host = await this.host();
    await host.focus();
    await host.sendKeys(modifiers, key);
  }
}

/** The map tab and its side panel, as the room page shows them. */
@Component({
  selector: 'app-map-host',
  imports: [MapPanel, MapInspector],
  providers: [RoomEditor],
  template: `<div style="width: 640px; height: 460px"><app-map-panel /></div>
    <app-map-inspector />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class MapHost {
  readonly editor = inject(RoomEditor);
}

describe('RoomMap (with its tools and side panel)', () => {
  let loader: HarnessLoader;
  let root: HarnessLoader;
  let editor: RoomEditor;
  let host: HTMLElement;

  async function setup(room: RoomDto = ROOM): Promise<void> {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    const fixture = TestBed.createComponent(MapHost);
    host = fixture.nativeElement;
    document.body.append(host);
    editor = fixture.componentInstance.editor;
    const http = TestBed.inject(HttpTestingController);
    editor.load(room.id);
    http.expectOne(`/api/rooms/${room.id}`).flush(room);
    await fixture.whenStable();
    loader = TestbedHarnessEnvironment.loader(fixture);
    root = TestbedHarnessEnvironment.documentRootLoader(fixture);
  }

  afterEach(() => host?.remove());

  const person = (name: string) => loader.getHarness(MapPersonHarness.with({ label: new RegExp(`^${name},`) }));
  const panelField = async (label: string) =>
    (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label, ancestor: 'app-map-inspector' }))).getControl(
      MatInputHarness,
    );

  it('draws every person as a labelled keyboard stop, and Enter selects one and opens it in the side panel', async () => {
    await setup();
    const people = await loader.getAllHarnesses(MapPersonHarness);
    expect(await Promise.all(people.map((p) => p.label()))).toEqual(['Asha, Sales', 'Dara, Ops', 'Cyd, Ops']);
    expect(host.querySelector('app-map-inspector')?.textContent).toContain('Select a person or a tie on the map');

    const dara = await person('Dara');
    expect(await dara.isSelected()).toBeFalse();
    await dara.press(TestKey.ENTER);
    expect(await dara.isSelected()).toBeTrue();
    expect(await (await person('Asha')).isSelected()).toBeFalse();
    expect(await (await panelField('Name'))!.getValue()).toBe('Dara');
    expect(host.querySelector('app-map-inspector h3')?.textContent).toContain('Dara');
    expect(host.querySelector('app-map-inspector')?.textContent).toContain('1 tie');
  });

  it('Shift+Enter adds a second person to the selection and the panel speaks of both', async () => {
    await setup();
    await (await person('Asha')).press(TestKey.ENTER);
    const cyd = await person('Cyd');
    await cyd.press(TestKey.ENTER, { shift: true });
    expect(await cyd.isSelected()).toBeTrue();
    expect(await (await person('Asha')).isSelected()).toBeTrue();
    expect(host.querySelector('app-map-inspector h3')?.textContent).toContain('2 people selected');
  });

  it('arrow keys move the selected person by 10, Shift by 50, and the drawing follows', async () => {
    await setup();
    const asha = await person('Asha');
    await asha.press(TestKey.ENTER);
    const before = await asha.position();
    await asha.press(TestKey.RIGHT_ARROW);
    expect(editor.model.person('p1').x).toBe(10);
    expect(editor.model.person('p1').y).toBe(0);
    await asha.press(TestKey.DOWN_ARROW, { shift: true });
    expect(editor.model.person('p1').y).toBe(50);
    expect(await asha.position()).not.toBe(before);
    expect(editor.model.person('p2').x).withContext('others stay put').toBe(120);
  });

  it('"Tie to" in the side panel adds a tie from its menu; the map draws it and the snack bar can undo it', async () => {
    await setup();
    await (await person('Asha')).press(TestKey.ENTER);
    const tieLines = () => host.querySelectorAll('app-room-map g.ties line').length;
    expect(tieLines()).toBe(1);
    const tieTo = await loader.getHarness(MatAutocompleteHarness.with({ selector: '[data-testid="tie-to"]' }));
    await tieTo.enterText('cy');
    const options = await tieTo.getOptions();
    expect(await Promise.all(options.map((o) => o.getText()))).toEqual([jasmine.stringMatching(/^Cyd/)]);
    await tieTo.selectOption({ text: /^Cyd/ });
    expect(editor.ties().map((t) => [t.source, t.target].sort().join('-'))).toContain('p1-p3');
    expect(tieLines()).toBe(2);
    expect(host.querySelector('app-map-inspector')?.textContent).toContain('2 ties');

    const snack = await root.getHarness(MatSnackBarHarness);
    expect(await snack.getMessage()).toBe('Tie added: Asha and Cyd.');
    expect(await snack.getActionDescription()).toBe('Undo');
    await snack.dismissWithAction();
    expect(editor.ties().length).toBe(1);
    expect(tieLines()).toBe(1);
  });

  it('"Find a person" selects the one picked from its menu; the tool toggle switches to drawing ties', async () => {
    await setup();
    const find = await loader.getHarness(MatAutocompleteHarness.with({ selector: 'input[aria-label="Find a person"]' }));
    await find.enterText('da');
    await find.selectOption({ text: /^Dara/ });
    expect(await (await person('Dara')).isSelected()).toBeTrue();
    expect(await (await panelField('Name'))!.getValue()).toBe('Dara');

    const tools = await loader.getHarness(MatButtonToggleGroupHarness.with({ selector: '[aria-label="Pointer tool"]' }));
    const [move, ties] = await tools.getToggles();
    if (!move || !ties) throw new Error('the pointer tool has two toggles');
    expect(await move.isChecked()).toBeTrue();
    expect(host.querySelector('.rh-map-area')?.classList).not.toContain('rh-tie-tool');
    await ties.check();
    expect(await ties.isChecked()).toBeTrue();
    expect(host.querySelector('.rh-map-area')?.classList).toContain('rh-tie-tool');
  });

  it('a viewer gets no tools, cannot move anyone with the keyboard, and the panel only reads', async () => {
    await setup({ ...ROOM, access: 'viewer' });
    expect(await loader.getAllHarnesses(MatButtonToggleGroupHarness)).toEqual([]);
    const asha = await person('Asha');
    await asha.press(TestKey.ENTER);
    expect(await asha.isSelected()).toBeTrue();
    await asha.press(TestKey.RIGHT_ARROW);
    expect(editor.model.person('p1').x).toBe(0);
    expect(await loader.getAllHarnesses(MatInputHarness.with({ ancestor: 'app-map-inspector' }))).toEqual([]);
    expect(host.querySelector('app-map-inspector')?.textContent).toContain('Group: Sales');
  });
});
