import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { EMAIL_MAX } from '../../../shared/api/accounts';
import { finalize } from 'rxjs';
import { toApiError } from '../core/api-error';
import { AccountApi } from './account-api';

/** /account/forgot-password: asks for a reset link. The answer never says whether the account exists. */
@Component({
  selector: 'app-forgot-password',
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule],
  template: `
    <section class="rh-account-card">
      <h1>Forgot your password?</h1>
      @if (sent()) {
        <p role="status">{{ sent() }}</p>
        <p class="rh-muted">No e-mail? Check the address and your spam folder, or ask your admin.</p>
        <a mat-button routerLink="/sign-in">Back to sign-in</a>
      } @else {
        <p class="rh-muted">Enter the e-mail address of your account. We send a link to choose a new password.</p>
        <form [formGroup]="form" (ngSubmit)="send()" class="rh-form" novalidate>
          <mat-form-field appearance="outline">
            <mat-label>E-mail</mat-label>
            <input matInput type="email" formControlName="email" autocomplete="username" required />
            @if (form.controls.email.hasError('required')) {
              <mat-error>Enter your e-mail address.</mat-error>
            } @else if (form.controls.email.hasError('email')) {
              <mat-error>This does not look like an e-mail address.</mat-error>
            }
          </mat-form-field>
          @if (error()) {
            <p class="rh-form-error" role="alert">{{ error() }}</p>
          }
          <button mat-flat-button type="submit" [disabled]="pending()">Send me a link</button>
          <a mat-button routerLink="/sign-in">Back to sign-in</a>
        </form>
      }
    </section>
  `,
  styleUrl: './account-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class ForgotPassword {
  private readonly api = inject(AccountApi);
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(EMAIL_MAX)]],
  });
  protected readonly sent = signal<string | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly pending = signal(false);

  protected send(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.error.set(null);
    this.api
      .requestReset(this.form.getRawValue().email)
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: ({ message }) => this.sent.set(message),
        error: (err: unknown) => this.error.set(toApiError(err).message),
      });
  }
}
