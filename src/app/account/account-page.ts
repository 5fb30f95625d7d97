import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { Auth } from '../core/auth';

@Component({
  selector: 'app-account-page',
  template: `<section class="rh-page">
    <h1 class="rh-page-title">Your account</h1>
    <p>{{ auth.user()?.email }}</p>
  </section>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class AccountPage {
  protected readonly auth = inject(Auth);
}
