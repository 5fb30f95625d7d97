import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { finalize } from 'rxjs';
import { DEFAULT_ROOM_SETTINGS, ROOM_LIMITS, type RoomDto } from '../../../../shared/api/rooms';
import { toApiError } from '../../core/api-error';
import { SettingsFields, settingsForm } from '../panels/settings-fields';
import { RoomsApi } from '../rooms-api';

/** A new, empty room: a name and its settings. */
@Component({
  selector: 'app-create-room-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, SettingsFields],
  template: `
    <h2 mat-dialog-title>New room</h2>
    <form (submit)="$event.preventDefault(); create()">
      <mat-dialog-content>
        <mat-form-field class="rh-wide">
          <mat-label>Name</mat-label>
          <input matInput [formControl]="name" [maxlength]="limits.roomNameMax" cdkFocusInitial />
          <mat-error>Give the room a name (up to {{ limits.roomNameMax }} characters).</mat-error>
        </mat-form-field>
        <app-settings-fields [form]="settings" />
        @if (error(); as e) {
          <p class="rh-error" role="alert">{{ e }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()">Create room</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .rh-wide {
      width: 100%;
    }
    .rh-error {
      color: #a03a17;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreateRoomDialog {
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly api = inject(RoomsApi);
  private readonly ref = inject(MatDialogRef<CreateRoomDialog, RoomDto>);
  protected readonly limits = ROOM_LIMITS;
  protected readonly name = this.fb.control('', [Validators.required, Validators.maxLength(ROOM_LIMITS.roomNameMax)]);
  protected readonly settings = settingsForm(this.fb, DEFAULT_ROOM_SETTINGS);
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected create(): void {
    if (this.name.invalid || this.settings.invalid || !this.name.value.trim()) {
      this.name.markAsTouched();
      this.settings.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    const s = this.settings.getRawValue();
    this.api
      .create({
        name: this.name.value.trim(),
        settings: {
          directed: s.directed,
          minutesPerHop: Number(s.minutesPerHop),
          laziness: Number(s.laziness),
          mixing: Number(s.mixing),
        },
      })
      .pipe(finalize(() => this.busy.set(false)))
      .subscribe({
        next: (room) => this.ref.close(room),
        error: (err: unknown) => {
          const e = toApiError(err);
          const fields = e.details?.fields?.map((f) => `${f.field}: ${f.message}`).join('; ');
          this.error.set(fields ? `${e.message} (${fields})` : e.message);
        },
      });
  }
}
