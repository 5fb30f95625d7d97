import { ChangeDetectionStrategy, Component, inject, input, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { NAME_MAX, type LinkInfo } from '../../../shared/api/accounts';
import { AccountApi } from './account-api';
import { newPasswordGroup } from './new-password';
import { NewPasswordFields } from './new-password-fields';
import { EmailedLink } from './link-token';

/** /account/accept?token=…: the invited person chooses a name and password. */
@Component({
  selector: 'app-accept-invitation',
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule, MatProgressBarModule, NewPasswordFields],
  template: `
    <section class="rh-account-card">
      <h1>Set up your account</h1>
      @if (link.checking()) {
        <mat-progress-bar mode="indeterminate" aria-label="Checking the link" />
      } @else if (link.dead()) {
        <p class="rh-form-error" role="alert">{{ link.dead() }}</p>
        <a mat-button routerLink="/sign-in">Go to sign-in</a>
      } @else if (link.info(); as info) {
        <p class="rh-muted">
          You were invited as <strong>{{ info.email }}</strong>. Choose how your name appears and a password.
        </p>
        <form [formGroup]="form" (ngSubmit)="accept()" class="rh-form" novalidate>
          <mat-form-field appearance="outline">
            <mat-label>Your name</mat-label>
            <input matInput formControlName="name" autocomplete="name" required />
            @if (form.controls.name.hasError('required')) {
              <mat-error>Enter your name.</mat-error>
            } @else if (form.controls.name.hasError('maxlength')) {
              <mat-error>Use at most {{ nameMax }} characters.</mat-error>
            }
          </mat-form-field>
          <app-new-password-fields [group]="form.controls.secret" label="Password" />
          @if (link.error()) {
            <p class="rh-form-error" role="alert">{{ link.error() }}</p>
          }
          <button mat-flat-button type="submit" [disabled]="link.pending()">Activate my account</button>
        </form>
      }
    </section>
  `,
  styleUrl: './account-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class AcceptInvitation implements OnInit {
  private readonly api = inject(AccountApi);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);
  /** From the link's query string (component input binding). */
  readonly token = input<string>('');
  protected readonly nameMax = NAME_MAX;
  protected readonly form = this.fb.group({
    name: ['', [Validators.required, Validators.maxLength(NAME_MAX)]],
    secret: newPasswordGroup(this.fb),
  });
  protected readonly link = new EmailedLink<LinkInfo>();

  ngOnInit(): void {
    this.open();
  }

  private open(): void {
    this.link.open(
      this.token(),
      (t) => this.api.checkInvitation(t),
      (info) => this.form.controls.name.setValue(info.name),
    );
  }

  protected accept(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, secret } = this.form.getRawValue();
    this.link.submit(
      (t) => this.api.acceptInvitation(t, name.trim(), secret.password),
      (done) => void this.router.navigate(['/sign-in'], { queryParams: { email: done.email, welcome: 1 } }),
    );
  }
}
