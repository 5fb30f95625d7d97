import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router } from '@angular/router';

const PERSONAL = /\/p\/([A-Za-z0-9_-]{43})(?:[/?#]|$)/;
const JOIN = /\/p\/join\/([A-Za-z0-9_-]{43})(?:[/?#]|$)/;

/** `/p` without a link: says how to reach your own page, and opens a pasted link. */
@Component({
  selector: 'app-link-help',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  template: `
    <div class="phone">
      <header class="brand"><img src="favicon.svg" alt="" width="26" height="26" /><span>Ripplehall</span></header>
      <section class="card">
        <h1>Open your personal link</h1>
        <p>This address needs the rest of your link. Your facilitator gave you one of these:</p>
        <ul>
          <li>an e-mail with the button “Open my survey”,</li>
          <li>a printed slip with your name, a QR code and a link,</li>
          <li>a QR code on the projector, where you pick your own name.</li>
        </ul>
        <p>Open it from there, or paste the whole link here:</p>
        <form [formGroup]="form" (ngSubmit)="open()" class="paste">
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>Your link</mat-label>
            <input matInput formControlName="link" autocomplete="off" spellcheck="false" />
          </mat-form-field>
          @if (problem(); as p) {
            <p class="note error" role="alert">{{ p }}</p>
          }
          <button mat-flat-button type="submit">Open</button>
        </form>
        <p class="rh-muted">No link? Ask your facilitator: they can print or e-mail yours again.</p>
      </section>
    </div>
  `,
  styleUrl: './join-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class LinkHelp {
  private readonly router = inject(Router);
  protected readonly form = new FormGroup({ link: new FormControl('', { nonNullable: true }) });
  protected readonly problem = signal<string | null>(null);

  protected async open(): Promise<void> {
    const text = this.form.controls.link.value.trim();
    const join = JOIN.exec(text);
    const mine = PERSONAL.exec(text);
    if (join) await this.router.navigateByUrl(`/p/join/${join[1]}`);
    else if (mine) await this.router.navigateByUrl(`/p/${mine[1]}`);
    else this.problem.set('That is not a whole personal link: it ends with /p/ and 43 letters, digits, - or _. Copy all of it.');
  }
}
