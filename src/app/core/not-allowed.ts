import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'app-not-allowed',
  imports: [RouterLink, MatButtonModule],
  template: `
    <section class="rh-page">
      <h1 class="rh-page-title">Your account cannot open this page</h1>
      <p>This part of Ripplehall is for another role. Ask an admin if you think you need it.</p>
      <a mat-flat-button routerLink="/">Go to your rooms</a>
    </section>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class NotAllowed {}
