import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { PASSWORD_MAX } from '../../../shared/api/accounts';
import { finalize } from 'rxjs';
import { type ApiError, toApiError } from '../core/api-error';
import { Auth } from '../core/auth';
import { AccountApi } from './account-api';
import { newPasswordGroup } from './new-password';
import { NewPasswordFields } from './new-password-fields';

/** /account: who you are, and a change of password (other devices are signed out). */
@Component({
  selector: 'app-account-page',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatButtonModule, NewPasswordFields],
  template: `
    <section class="rh-page">
      <h1 class="rh-page-title">Your account</h1>
      @if (auth.user(); as user) {
        <dl class="rh-facts">
          <dt>Name</dt>
          <dd>{{ user.name }}</dd>
          <dt>E-mail</dt>
          <dd>{{ user.email }}</dd>
          <dt>Role</dt>
          <dd>{{ user.role === 'admin' ? 'Admin' : 'Facilitator' }}</dd>
        </dl>
      }
      <h2 class="rh-section">Change your password</h2>
      <form [formGroup]="form" (ngSubmit)="change()" class="rh-form" novalidate>
        <mat-form-field appearance="outline">
          <mat-label>Current password</mat-label>
          <input matInput type="password" formControlName="current" autocomplete="current-password" required />
          @if (form.controls.current.hasError('required')) {
            <mat-error>Enter your current password.</mat-error>
          } @else if (form.controls.current.hasError('server')) {
            <mat-error>{{ form.controls.current.getError('server') }}</mat-error>
          }
        </mat-form-field>
        <app-new-password-fields [group]="form.controls.secret" />
        @if (error()) {
          <p class="rh-form-error" role="alert">{{ error() }}</p>
        }
        <button mat-flat-button type="submit" [disabled]="pending()">Change password</button>
      </form>
    </section>
  `,
  styles: `
    .rh-facts {
      display: grid;
      grid-template-columns: max-content 1fr;
      gap: 4px 16px;
      margin: 0 0 24px;
    }
    dt {
      color: var(--mat-sys-on-surface-variant);
    }
    dd {
      margin: 0;
    }
    .rh-section {
      font: var(--mat-sys-title-medium);
      margin: 0 0 12px;
    }
    .rh-form-error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class AccountPage {
  protected readonly auth = inject(Auth);
  private readonly api = inject(AccountApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly form = this.fb.group({
    current: ['', [Validators.required, Validators.maxLength(PASSWORD_MAX)]],
    secret: newPasswordGroup(this.fb),
  });
  protected readonly error = signal<string | null>(null);
  protected readonly pending = signal(false);

  protected change(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.error.set(null);
    const { current, secret } = this.form.getRawValue();
    this.api
      .changePassword(current, secret.password)
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: () => {
          this.form.reset();
          this.snackBar.open('Your password is changed. Other devices were signed out.', 'OK', { duration: 6000 });
        },
        error: (err: unknown) => this.showError(toApiError(err)),
      });
  }

  private showError(e: ApiError): void {
    const field = e.details?.fields?.find((f) => f.field === 'currentPassword');
    if (field) {
      this.form.controls.current.setErrors({ server: field.message });
      this.form.controls.current.markAsTouched();
    } else {
      this.error.set(e.message);
    }
  }
}
