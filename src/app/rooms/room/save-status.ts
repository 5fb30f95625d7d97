import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RoomEditor } from '../editor/room-editor';

/** Saved / saving / failed, with retry; and the "changed elsewhere" choice after a 409. */
@Component({
  selector: 'app-save-status',
  imports: [MatButtonModule, MatIconModule],
  template: `
    @switch (editor.saveState()) {
      @case ('saved') {
        <span class="rh-state rh-ok" role="status"><mat-icon>cloud_done</mat-icon>All changes saved</span>
      }
      @case ('unsaved') {
        <span class="rh-state" role="status"
          ><mat-icon>edit</mat-icon>Unsaved changes…
          @if (editor.saveError(); as why) {
            {{ why }}
          }
        </span>
      }
      @case ('saving') {
        <span class="rh-state" role="status"><mat-icon>cloud_upload</mat-icon>Saving…</span>
      }
      @case ('failed') {
        <span class="rh-state rh-bad" role="alert">
          <mat-icon>cloud_off</mat-icon>Not saved: {{ editor.saveError() }}
          <button mat-button (click)="editor.retry()">Retry</button>
        </span>
      }
      @case ('conflict') {
        <div class="rh-conflict" role="alertdialog" aria-labelledby="rh-conflict-text">
          <mat-icon>sync_problem</mat-icon>
          <span id="rh-conflict-text"
            >This room was changed elsewhere: reload or keep yours. Your unsaved changes are kept until you choose.</span
          >
          <button mat-flat-button (click)="editor.keepMine()">Keep mine</button>
          <button mat-stroked-button (click)="editor.reloadFromServer()">Reload theirs</button>
        </div>
      }
    }
  `,
  styles: `
    :host {
      display: contents;
    }
    .rh-state {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      font-size: 0.9rem;
      color: var(--mat-sys-on-surface-variant);
      margin-left: 12px;
    }
    .rh-state mat-icon {
      font-size: 18px;
      width: 18px;
      height: 18px;
    }
    .rh-ok mat-icon {
      color: var(--rh-sage);
    }
    .rh-bad {
      color: #a03a17;
    }
    .rh-conflict {
      display: flex;
      align-items: center;
      gap: 8px;
      flex-basis: 100%;
      order: 10;
      background: #fbf0ea;
      border: 1px solid var(--rh-clay);
      border-radius: 8px;
      padding: 8px 12px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SaveStatus {
  protected readonly editor = inject(RoomEditor);
}
