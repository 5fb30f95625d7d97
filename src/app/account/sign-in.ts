import { ChangeDetectionStrategy, Component, computed, inject, input, signal, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { concatMap, EMPTY, finalize, from } from 'rxjs';
import { toApiError } from '../core/api-error';
import { Auth } from '../core/auth';

@Component({
  selector: 'app-sign-in',
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule],
  templateUrl: './sign-in.html',
  styleUrl: './account-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class SignIn implements OnInit {
  private readonly auth = inject(Auth);
  private readonly router = inject(Router);
  /** Where to go after signing in (from the guard). */
  readonly next = input<string>();
  /** Set by the accept-invitation and reset pages when they send the person here. */
  readonly email = input<string>();
  readonly welcome = input<string>();
  readonly reset = input<string>();

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
    password: ['', [Validators.required, Validators.maxLength(200)]],
  });
  protected readonly error = signal<string | null>(null);
  protected readonly pending = signal(false);
  protected readonly notice = computed(() =>
    this.welcome()
      ? 'Your account is active. Sign in with your new password.'
      : this.reset()
        ? 'Your new password is saved. Sign in with it.'
        : null,
  );

  ngOnInit(): void {
    this.prefill();
  }

  private prefill(): void {
    const email = this.email();
    if (email) this.form.controls.email.setValue(email);
  }

  protected signIn(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.error.set(null);
    const { email, password } = this.form.getRawValue();
    this.auth
      .signIn(email, password)
      .pipe(
        concatMap(({ user, warning }) => {
          if (warning) {
            // Moving on would land on the sign-in page again with no reason given: say why here.
            this.error.set(warning);
            return EMPTY;
          }
          const next = this.next();
          const home = user.role === 'admin' ? '/admin' : '/rooms';
          // The form stays pending until the next page is there.
          return from(this.router.navigateByUrl(next && next.startsWith('/') && !next.startsWith('//') ? next : home));
        }),
        finalize(() => this.pending.set(false)),
      )
      .subscribe({ error: (err: unknown) => this.error.set(toApiError(err).message) });
  }
}
