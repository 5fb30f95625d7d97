import { ChangeDetectionStrategy, Component, inject, input, signal, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { LinkInfo } from '../../../shared/api/accounts';
import { toApiError } from '../core/api-error';
import { AccountApi } from './account-api';
import { forgetTokenInAddressBar } from './link-token';
import { newPasswordGroup } from './new-password';
import { NewPasswordFields } from './new-password-fields';

/** /account/reset-password?token=…: choose a new password from the e-mailed link. */
@Component({
  selector: 'app-reset-password',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatProgressBarModule, NewPasswordFields],
  template: `
    <section class="rh-account-card">
      <h1>Choose a new password</h1>
      @if (checking()) {
        <mat-progress-bar mode="indeterminate" aria-label="Checking the link" />
      } @else if (dead()) {
        <p class="rh-form-error" role="alert">{{ dead() }}</p>
        <a mat-button routerLink="/account/forgot-password">Ask for a new link</a>
      } @else if (info(); as info) {
        <p class="rh-muted">
          For <strong>{{ info.email }}</strong>. Saving it signs this account out on every device.
        </p>
        <form [formGroup]="form" (ngSubmit)="save()" class="rh-form" novalidate>
          <app-new-password-fields [group]="form" />
          @if (error()) {
            <p class="rh-form-error" role="alert">{{ error() }}</p>
          }
          <button mat-flat-button type="submit" [disabled]="pending()">Save the new password</button>
        </form>
      }
    </section>
  `,
  styleUrl: './account-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class ResetPassword implements OnInit {
  private readonly api = inject(AccountApi);
  private readonly router = inject(Router);
  readonly token = input<string>('');
  protected readonly form = newPasswordGroup(inject(NonNullableFormBuilder));
  protected readonly checking = signal(true);
  protected readonly info = signal<LinkInfo | null>(null);
  protected readonly dead = signal<string | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly pending = signal(false);
  private linkToken = '';

  ngOnInit(): void {
    void this.checkLink();
  }

  private async checkLink(): Promise<void> {
    this.linkToken = this.token();
    forgetTokenInAddressBar();
    try {
      this.info.set(await this.api.checkReset(this.linkToken));
    } catch (err) {
      this.dead.set(toApiError(err).message);
    } finally {
      this.checking.set(false);
    }
  }

  protected async save(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.error.set(null);
    try {
      const { email } = await this.api.completeReset(this.linkToken, this.form.getRawValue().password);
      await this.router.navigate(['/sign-in'], { queryParams: { email, reset: 1 } });
    } catch (err) {
      const e = toApiError(err);
      if (e.code === 'link_invalid') this.dead.set(e.message);
      else this.error.set(e.message);
    } finally {
      this.pending.set(false);
    }
  }
}
