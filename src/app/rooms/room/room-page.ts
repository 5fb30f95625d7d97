import { ChangeDetectionStrategy, Component, computed, effect, inject, input, untracked, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import type { ExportFormat } from '../../../../shared/api/rooms';
import { ImportDialog, type ImportDialogData } from '../dialogs/import-dialog';
import { ShareDialog } from '../dialogs/share-dialog';
import { RoomEditor, type RoomMeta } from '../editor/room-editor';
import { SettingsPanel } from '../panels/settings-panel';
import { SummaryPanel } from '../panels/summary-panel';
import { PeopleTable } from '../tables/people-table';
import { TiesTable } from '../tables/ties-table';
import { MapInspector } from './map-inspector';
import { MapPanel } from './map-panel';
import { SaveStatus } from './save-status';

/** One room: map, people and ties tables, settings, summary; import, export, sharing. */
@Component({
  selector: 'app-room-page',
  imports: [
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatTabsModule,
    MatTooltipModule,
    MapPanel,
    MapInspector,
    PeopleTable,
    TiesTable,
    SettingsPanel,
    SummaryPanel,
    SaveStatus,
  ],
  providers: [RoomEditor],
  templateUrl: './room-page.html',
  styleUrl: './room-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(window:keydown)': 'shortcut($event)', '(window:beforeunload)': 'warnUnsaved($event)' },
})
export default class RoomPage {
  readonly roomId = input.required<string>();
  protected readonly editor = inject(RoomEditor);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly mapPanel = viewChild(MapPanel);

  protected readonly room = this.editor.room;
  protected readonly isOwner = computed(() => this.room()?.access === 'owner');
  protected readonly exports: { format: ExportFormat; label: string; icon: string }[] = [
    { format: 'people-csv', label: 'People (CSV)', icon: 'table_view' },
    { format: 'ties-csv', label: 'Ties (CSV)', icon: 'table_view' },
    { format: 'graphml', label: 'GraphML', icon: 'account_tree' },
    { format: 'json', label: 'Node-link JSON', icon: 'data_object' },
    { format: 'org-chart-csv', label: 'Org chart (CSV)', icon: 'account_tree' },
  ];

  constructor() {
    effect(() => {
      const id = Number(this.roomId());
      untracked(() => this.editor.load(id));
    });
  }

  protected exportUrl(format: ExportFormat): string {
    return `/api/rooms/${this.room()?.id}/export?format=${format}`;
  }

  protected async exportPng(): Promise<void> {
    const panel = this.mapPanel();
    const done = await panel?.map().exportPng(`${this.room()?.name ?? 'room'} map.png`);
    if (!done) this.snack.open('Open the map tab with at least one person to export a picture.', 'OK', { duration: 5000 });
  }

  protected openImport(): void {
    const room = this.room();
    if (!room) return;
    // Save what is waiting first, so the import starts from the latest version.
    this.editor.flush().subscribe({ complete: () => this.showImport(room) });
  }

  private showImport(room: RoomMeta): void {
    const data: ImportDialogData = {
      roomId: room.id,
      roomName: room.name,
      version: () => this.editor.room()?.version ?? room.version,
      people: this.editor.model.people.size,
    };
    this.dialog
      .open(ImportDialog, { data, width: '860px', maxWidth: '96vw' })
      .afterClosed()
      .subscribe((committed) => {
        if (committed) this.editor.reloadFromServer();
      });
  }

  protected openShare(): void {
    const room = this.room();
    if (room) this.dialog.open(ShareDialog, { data: { roomId: room.id, roomName: room.name }, width: '620px', maxWidth: '96vw' });
  }

  protected shortcut(e: KeyboardEvent): void {
    const target = e.target as HTMLElement;
    const typing = /^(INPUT|TEXTAREA|SELECT)$/.test(target.tagName) || target.isContentEditable;
    if (this.dialog.openDialogs.length) return;
    const mod = e.ctrlKey || e.metaKey;
    if (mod && e.key.toLowerCase() === 'z' && !typing) {
      e.preventDefault();
      if (e.shiftKey) this.editor.redo();
      else this.editor.undo();
    } else if (mod && e.key.toLowerCase() === 'y' && !typing) {
      e.preventDefault();
      this.editor.redo();
    } else if ((e.key === 'Delete' || e.key === 'Backspace') && !typing && this.editor.canEdit()) {
      const s = this.editor.selection;
      if (!s.size && !s.tie) return;
      e.preventDefault();
      if (s.tie) this.editor.deleteTies([s.tie]);
      else this.editor.deletePeople(s.ids());
      this.snack
        .open('Deleted.', 'Undo', { duration: 6000 })
        .onAction()
        .subscribe(() => this.editor.undo());
    } else if (e.key === 'Escape' && !typing) {
      this.editor.selection.clear();
      this.editor.selectionChanged();
    }
  }

  protected warnUnsaved(e: BeforeUnloadEvent): void {
    if (this.editor.hasUnsaved) {
      this.editor.flush();
      e.preventDefault();
    }
  }
}
