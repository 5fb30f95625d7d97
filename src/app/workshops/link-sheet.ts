import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { LinkSheetStore } from './link-sheet-store';

/** A printable sheet: one slip per participant with their name, QR code and link, to cut apart. */
@Component({
  selector: 'app-link-sheet',
  imports: [DatePipe, MatButtonModule, MatIconModule, RouterLink],
  template: `
    @if (sheet.links(); as s) {
      <section class="rh-page">
        <div class="rh-no-print bar">
          <a mat-button [routerLink]="['/workshops', s.workshopId]"><mat-icon>arrow_back</mat-icon>Back</a>
          <button mat-flat-button type="button" (click)="print()"><mat-icon>print</mat-icon>Print</button>
          <span class="rh-muted">These links are shown once. Print now; opening this sheet again issues new ones.</span>
        </div>
        <div class="slips">
          @for (l of s.links; track l.participantId) {
            <article class="slip">
              <img [src]="l.qr" alt="" width="120" height="120" />
              <div>
                <p class="for">{{ s.title }}</p>
                <h2>{{ l.name }}</h2>
                <p class="url">{{ l.url }}</p>
                <p class="small">Personal link, please do not share. Works until {{ l.expiresAt | date: 'd MMM y' }}.</p>
              </div>
            </article>
          }
        </div>
      </section>
    } @else {
      <section class="rh-page">
        <p>This sheet is no longer in memory (links are shown only once). Go back and choose “Print a sheet” again.</p>
        <a mat-stroked-button routerLink="/workshops">Workshops</a>
      </section>
    }
  `,
  styles: `
    .bar {
      display: flex;
      gap: 12px;
      align-items: center;
      margin-bottom: 16px;
    }
    .slips {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(340px, 1fr));
      gap: 0;
    }
    .slip {
      display: flex;
      gap: 14px;
      padding: 14px;
      border: 1px dashed #9aa5ad;
      break-inside: avoid;
      h2 {
        margin: 0 0 4px;
        font-size: 1.2rem;
      }
    }
    .for {
      margin: 0;
      color: var(--rh-sage);
      font-weight: 600;
    }
    .url {
      font-family: ui-monospace, monospace;
      font-size: 0.72rem;
      word-break: break-all;
      margin: 4px 0;
    }
    .small {
      font-size: 0.8rem;
      margin: 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class LinkSheet {
  protected readonly sheet = inject(LinkSheetStore);
  protected print(): void {
    window.print();
  }
}
