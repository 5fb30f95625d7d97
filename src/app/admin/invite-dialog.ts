import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { EMAIL_MAX, INVITE_HOURS, NAME_MAX, type AccountRole } from '../../../shared/api/accounts';
import { finalize } from 'rxjs';
import { type ApiError, toApiError } from '../core/api-error';
import { AdminApi } from './admin-api';

/** Invite someone by e-mail; the dialog closes with the address once the mail is out. */
@Component({
  selector: 'app-invite-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule],
  template: `
    <h2 mat-dialog-title>Invite a facilitator</h2>
    <form [formGroup]="form" (ngSubmit)="send()" novalidate>
      <mat-dialog-content class="rh-invite">
        <p class="rh-muted">
          They get an e-mail with a link to choose their name and password. The link works once, for {{ hours }} hours.
        </p>
        <mat-form-field appearance="outline">
          <mat-label>E-mail</mat-label>
          <input matInput type="email" formControlName="email" autocomplete="off" required />
          @if (form.controls.email.hasError('required')) {
            <mat-error>Enter the address to send the invitation to.</mat-error>
          } @else if (form.controls.email.hasError('email')) {
            <mat-error>This does not look like an e-mail address.</mat-error>
          } @else if (form.controls.email.hasError('server')) {
            <mat-error>{{ form.controls.email.getError('server') }}</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Name (they can change it)</mat-label>
          <input matInput formControlName="name" autocomplete="off" />
          @if (form.controls.name.hasError('maxlength')) {
            <mat-error>Use at most {{ nameMax }} characters.</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Role</mat-label>
          <mat-select formControlName="role">
            <mat-option value="facilitator">Facilitator</mat-option>
            <mat-option value="admin">Admin</mat-option>
          </mat-select>
        </mat-form-field>
        @if (error()) {
          <p class="rh-form-error" role="alert">{{ error() }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="pending()">Send invitation</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .rh-invite {
      display: flex;
      flex-direction: column;
      gap: 4px;
      min-width: min(420px, 80vw);
    }
    .rh-form-error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InviteDialog {
  private readonly api = inject(AdminApi);
  private readonly ref = inject(MatDialogRef<InviteDialog, string>);
  protected readonly hours = INVITE_HOURS;
  protected readonly nameMax = NAME_MAX;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(EMAIL_MAX)]],
    name: ['', [Validators.maxLength(NAME_MAX)]],
    role: ['facilitator' as AccountRole],
  });
  protected readonly pending = signal(false);
  protected readonly error = signal<string | null>(null);

  protected send(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.error.set(null);
    const value = this.form.getRawValue();
    this.api
      .invite(value)
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: () => this.ref.close(value.email),
        error: (err: unknown) => this.showError(toApiError(err)),
      });
  }

  private showError(e: ApiError): void {
    const emailError = e.details?.fields?.find((f) => f.field === 'email');
    if (emailError) {
      this.form.controls.email.setErrors({ server: e.status === 409 ? e.message : emailError.message });
      this.form.controls.email.markAsTouched();
    } else {
      this.error.set(e.message);
    }
  }
}
