import { ChangeDetectionStrategy, Component, DestroyRef, effect, inject, untracked } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { DEFAULT_ROOM_SETTINGS, ROOM_LIMITS, type RoomSettings } from '../../../../shared/api/rooms';
import { RoomEditor } from '../editor/room-editor';
import { SettingsFields, settingsForm } from './settings-fields';

/** Name, description and settings of the room; valid changes save by themselves. */
@Component({
  selector: 'app-settings-panel',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, SettingsFields],
  template: `
    <form class="rh-room-form" [formGroup]="meta">
      <mat-form-field>
        <mat-label>Room name</mat-label>
        <input matInput formControlName="name" [maxlength]="limits.roomNameMax" />
        <mat-error>A name of 1 to {{ limits.roomNameMax }} characters.</mat-error>
      </mat-form-field>
      <mat-form-field>
        <mat-label>Description</mat-label>
        <textarea matInput formControlName="description" rows="2" [maxlength]="limits.descriptionMax"></textarea>
      </mat-form-field>
    </form>
    <app-settings-fields [form]="settings" />
    @if (!editor.canEdit()) {
      <p class="rh-muted">You can view this room; only its owner and editors change its settings.</p>
    }
  `,
  styles: `
    .rh-room-form {
      display: grid;
      grid-template-columns: 1fr 2fr;
      gap: 0 24px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SettingsPanel {
  protected readonly editor = inject(RoomEditor);
  protected readonly limits = ROOM_LIMITS;
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly meta = this.fb.group({
    name: ['', [Validators.required, Validators.maxLength(ROOM_LIMITS.roomNameMax)]],
    description: ['', Validators.maxLength(ROOM_LIMITS.descriptionMax)],
  });
  protected readonly settings = settingsForm(this.fb, DEFAULT_ROOM_SETTINGS);

  constructor() {
    // Follow the room when it is (re)loaded, not on every edit, so typing is never overwritten.
    effect(() => {
      this.editor.loaded();
      const canEdit = this.editor.canEdit();
      untracked(() => {
        const room = this.editor.room();
        if (!room) return;
        this.meta.patchValue({ name: room.name, description: room.description }, { emitEvent: false });
        this.settings.patchValue(room.settings, { emitEvent: false });
        if (canEdit) {
          this.meta.enable({ emitEvent: false });
          this.settings.enable({ emitEvent: false });
        } else {
          this.meta.disable({ emitEvent: false });
          this.settings.disable({ emitEvent: false });
        }
      });
    });
    const destroyRef = inject(DestroyRef);
    this.meta.valueChanges.pipe(takeUntilDestroyed(destroyRef)).subscribe(() => {
      if (this.meta.invalid) return;
      const v = this.meta.getRawValue();
      const room = this.editor.room();
      if (room && (v.name.trim() !== room.name || v.description !== room.description)) {
        this.editor.updateRoom({ name: v.name.trim(), description: v.description });
      }
    });
    this.settings.valueChanges.pipe(takeUntilDestroyed(destroyRef)).subscribe(() => {
      if (this.settings.invalid) return;
      const v = this.settings.getRawValue();
      const current = this.editor.room()?.settings;
      if (!current) return;
      const next: RoomSettings = {
        directed: v.directed,
        minutesPerHop: Number(v.minutesPerHop),
        laziness: Number(v.laziness),
        mixing: Number(v.mixing),
      };
      const changed: Partial<RoomSettings> = {};
      for (const k of Object.keys(next) as (keyof RoomSettings)[]) {
        if (next[k] !== current[k]) Object.assign(changed, { [k]: next[k] });
      }
      if (Object.keys(changed).length) this.editor.updateRoom({ settings: changed });
    });
  }
}
