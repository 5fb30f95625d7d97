import { ChangeDetectionStrategy, Component, computed, inject, signal, viewChild } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RoomEditor } from '../editor/room-editor';
import { groupStyles, NO_GROUP_STYLE, shapePath } from '../map/group-style';
import { type MapTool, RoomMap } from '../map/room-map';

/** The map tab: tools, the map, the legend of groups and the inspector of the selection. */
@Component({
  selector: 'app-map-panel',
  imports: [
    FormsModule,
    MatAutocompleteModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatTooltipModule,
    RoomMap,
  ],
  templateUrl: './map-panel.html',
  styleUrl: './map-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MapPanel {
  protected readonly editor = inject(RoomEditor);
  readonly map = viewChild.required(RoomMap);
  protected readonly tool = signal<MapTool>('select');
  protected readonly query = signal('');
  protected readonly findMessage = signal<string | null>(null);

  protected readonly legend = computed(() => {
    const styles = groupStyles(this.editor.groups());
    const rows = [...styles.values()].map((s) => ({ ...s, d: shapePath(s.shape, 7) }));
    if (this.editor.people().some((p) => !p.group)) rows.push({ ...NO_GROUP_STYLE, group: 'No group', d: shapePath('circle', 7) });
    return rows;
  });

  protected readonly matches = computed(() => {
    const q = this.query().trim().toLowerCase();
    if (!q) return [];
    return this.editor
      .people()
      .filter((p) => p.name.toLowerCase().includes(q) || p.key.toLowerCase() === q)
      .slice(0, 12);
  });

  protected addPerson(): void {
    // Placed where the user is looking, so the new person is on screen at once.
    const [x, y] = this.map().freeSpotInView();
    const lid = this.editor.addPerson({ name: `New person ${this.editor.model.people.size + 1}`, x, y });
    this.editor.selection.only(lid);
    this.editor.selectionChanged();
  }

  protected find(lid?: string): void {
    const target = lid ?? this.matches()[0]?.lid;
    if (!target) {
      this.findMessage.set(this.query().trim() ? `Nobody called "${this.query().trim()}" in this room.` : null);
      return;
    }
    this.findMessage.set(null);
    this.map().find(target);
    this.editor.selection.only(target);
    this.editor.selectionChanged();
  }

  protected nameOf(lid: string): string {
    return this.editor.model.people.get(lid)?.name ?? '';
  }
}
