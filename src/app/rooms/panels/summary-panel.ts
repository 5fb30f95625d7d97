import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, effect, inject, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { finalize } from 'rxjs';
import type { RoomSummary } from '../../../../shared/api/rooms';
import { toApiError } from '../../core/api-error';
import { RoomEditor } from '../editor/room-editor';
import { RoomsApi } from '../rooms-api';

const PROBLEM_TITLES: Partial<Record<string, string>> = {
  'cannot-enter': 'The message cannot get in',
  'cannot-leave': 'The message cannot get out',
  'separate-part': 'A separate part of the room',
};

/** What the saved room looks like to the engine, and the first hint; follows every save. */
@Component({
  selector: 'app-summary-panel',
  imports: [DecimalPipe, MatButtonModule, MatIconModule],
  templateUrl: './summary-panel.html',
  styleUrl: './summary-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SummaryPanel {
  protected readonly editor = inject(RoomEditor);
  private readonly api = inject(RoomsApi);
  protected readonly summary = signal<RoomSummary | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly loading = signal(false);
  protected readonly titles = PROBLEM_TITLES;
  private requested = -1;

  constructor() {
    effect(() => {
      const version = this.editor.savedVersion();
      const id = this.editor.room()?.id;
      if (id === undefined) return;
      untracked(() => void this.refresh(id, version));
    });
  }

  protected namesOf(list: { name: string }[]): string {
    return list.map((p) => p.name).join(', ');
  }

  protected reload(): void {
    const id = this.editor.room()?.id;
    if (id !== undefined) this.refresh(id, this.editor.savedVersion(), true);
  }

  private refresh(id: number, version: number, force = false): void {
    if (!force && version === this.requested) return;
    this.requested = version;
    this.loading.set(true);
    this.api
      .summary(id)
      .pipe(finalize(() => this.loading.set(false)))
      .subscribe({
        next: (s) => {
          // An answer for a version the room has moved past is not shown.
          if (version !== this.requested) return;
          this.summary.set(s);
          this.error.set(null);
        },
        error: (err: unknown) => this.error.set(toApiError(err).message),
      });
  }
}
