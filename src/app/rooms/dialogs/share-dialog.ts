import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { concatMap, finalize, type Observable, tap } from 'rxjs';
import { shownByInterceptor } from '../../core/error-interceptor';
import type { ShareDto, ShareRole } from '../../../../shared/api/rooms';
import { toApiError } from '../../core/api-error';
import { RoomsApi } from '../rooms-api';
import { DayPipe } from '../../core/date-format';

/** The owner shares the room with other facilitators (editor or viewer), changes roles and revokes. */
@Component({
  selector: 'app-share-dialog',
  imports: [
    DayPipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  template: `
    <h2 mat-dialog-title>Share {{ data.roomName }}</h2>
    <mat-dialog-content>
      <p class="rh-muted">
        Co-facilitators with a Ripplehall account can help. Editors change people, ties and settings; viewers only read the map and tables.
        They get an e-mail with a link.
      </p>
      <form class="rh-share-form" [formGroup]="form" (submit)="$event.preventDefault(); share()">
        <mat-form-field>
          <mat-label>Their e-mail</mat-label>
          <input matInput type="email" formControlName="email" autocomplete="off" />
          @if (form.controls.email.hasError('required')) {
            <mat-error>Give the e-mail of their account.</mat-error>
          } @else if (form.controls.email.hasError('email')) {
            <mat-error>This does not look like an e-mail address.</mat-error>
          } @else if (form.controls.email.hasError('server')) {
            <mat-error>{{ form.controls.email.getError('server') }}</mat-error>
          }
        </mat-form-field>
        <mat-form-field class="rh-role">
          <mat-label>Role</mat-label>
          <mat-select formControlName="role">
            <mat-option value="editor">Editor</mat-option>
            <mat-option value="viewer">Viewer</mat-option>
          </mat-select>
        </mat-form-field>
        <button mat-flat-button type="submit" [disabled]="busy()"><mat-icon>send</mat-icon>Share</button>
      </form>
      <h3>Shared with</h3>
      @if (shares().length === 0) {
        <p class="rh-muted">Nobody yet.</p>
      }
      <ul class="rh-shares">
        @for (s of shares(); track s.userId) {
          <li>
            <div>
              <strong>{{ s.name }}</strong> <span class="rh-muted">{{ s.email }} · since {{ s.createdAt | day }}</span>
            </div>
            <mat-form-field subscriptSizing="dynamic" class="rh-role">
              <mat-select [value]="s.role" (selectionChange)="changeRole(s, $event.value)" [attr.aria-label]="'Role of ' + s.name">
                <mat-option value="editor">Editor</mat-option>
                <mat-option value="viewer">Viewer</mat-option>
              </mat-select>
            </mat-form-field>
            <button mat-icon-button (click)="revoke(s)" [attr.aria-label]="'Stop sharing with ' + s.name">
              <mat-icon>person_remove</mat-icon>
            </button>
          </li>
        }
      </ul>
    </mat-dialog-content>
    <mat-dialog-actions align="end"><button mat-button mat-dialog-close>Done</button></mat-dialog-actions>
  `,
  styles: `
    .rh-share-form {
      display: flex;
      gap: 12px;
      align-items: flex-start;
    }
    .rh-share-form button {
      margin-top: 8px;
    }
    .rh-share-form mat-form-field:first-child {
      flex: 1;
    }
    .rh-role {
      width: 130px;
    }
    .rh-shares {
      list-style: none;
      padding: 0;
      margin: 0;
    }
    .rh-shares li {
      display: flex;
      align-items: center;
      gap: 12px;
      padding: 6px 0;
      border-bottom: 1px solid var(--rh-line);
    }
    .rh-shares li div {
      flex: 1;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ShareDialog {
  protected readonly data = inject<{ roomId: number; roomName: string }>(MAT_DIALOG_DATA);
  private readonly api = inject(RoomsApi);
  private readonly snack = inject(MatSnackBar);
  protected readonly shares = signal<ShareDto[]>([]);
  protected readonly busy = signal(false);
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
    role: ['viewer' as ShareRole],
  });

  constructor() {
    this.load().subscribe({ error: shownByInterceptor });
  }

  private load(): Observable<unknown> {
    return this.api.shares(this.data.roomId).pipe(tap((shares) => this.shares.set(shares)));
  }

  protected share(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    const v = this.form.getRawValue();
    this.api
      .share(this.data.roomId, { email: v.email.trim(), role: v.role })
      .pipe(
        tap((s) => {
          this.snack.open(`Shared with ${s.name} as ${s.role}.`, 'OK', { duration: 4000 });
          this.form.reset({ email: '', role: v.role });
        }),
        concatMap(() => this.load()),
        finalize(() => this.busy.set(false)),
      )
      .subscribe({
        error: (err: unknown) => {
          const e = toApiError(err);
          this.form.controls.email.setErrors({ server: e.details?.fields?.[0]?.message ?? e.message });
          this.form.controls.email.markAsTouched();
        },
      });
  }

  protected changeRole(s: ShareDto, role: ShareRole): void {
    this.api
      .changeShare(this.data.roomId, s.userId, role)
      .pipe(
        tap(() => this.snack.open(`${s.name} is now ${role === 'editor' ? 'an editor' : 'a viewer'}.`, 'OK', { duration: 3000 })),
        concatMap(() => this.load()),
      )
      .subscribe({ error: shownByInterceptor });
  }

  protected revoke(s: ShareDto): void {
    this.api
      .revokeShare(this.data.roomId, s.userId)
      .pipe(
        tap(() => this.snack.open(`${s.name} no longer sees this room.`, 'OK', { duration: 3000 })),
        concatMap(() => this.load()),
      )
      .subscribe({ error: shownByInterceptor });
  }
}
