import { ChangeDetectionStrategy, Component, inject, input, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { LinkInfo } from '../../../shared/api/accounts';
import { AccountApi } from './account-api';
import { EmailedLink } from './link-token';
import { newPasswordGroup } from './new-password';
import { NewPasswordFields } from './new-password-fields';

/** /account/reset-password?token=…: choose a new password from the e-mailed link. */
@Component({
  selector: 'app-reset-password',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatProgressBarModule, NewPasswordFields],
  template: `
    <section class="rh-account-card">
      <h1>Choose a new password</h1>
      @if (link.checking()) {
        <mat-progress-bar mode="indeterminate" aria-label="Checking the link" />
      } @else if (link.dead()) {
        <p class="rh-form-error" role="alert">{{ link.dead() }}</p>
        <a mat-button routerLink="/account/forgot-password">Ask for a new link</a>
      } @else if (link.info(); as info) {
        <p class="rh-muted">
          For <strong>{{ info.email }}</strong>. Saving it signs this account out on every device.
        </p>
        <form [formGroup]="form" (ngSubmit)="save()" class="rh-form" novalidate>
          <app-new-password-fields [group]="form" />
          @if (link.error()) {
            <p class="rh-form-error" role="alert">{{ link.error() }}</p>
          }
          <button mat-flat-button type="submit" [disabled]="link.pending()">Save the new password</button>
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
  protected readonly link = new EmailedLink<LinkInfo>();

  ngOnInit(): void {
    this.link.open(this.token(), (t) => this.api.checkReset(t));
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.link.submit(
      (t) => this.api.completeReset(t, this.form.getRawValue().password),
      (done) => void this.router.navigate(['/sign-in'], { queryParams: { email: done.email, reset: 1 } }),
    );
  }
}
