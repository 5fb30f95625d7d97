import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'app-not-found',
  imports: [RouterLink, MatButtonModule],
  template: `
    <section class="rh-page">
      <h1 class="rh-page-title">This page does not exist</h1>
      <p>The address may be mistyped, or the item was deleted.</p>
      <a mat-flat-button routerLink="/">Go to your rooms</a>
    </section>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class NotFound {}
