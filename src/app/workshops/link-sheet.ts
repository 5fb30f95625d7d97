import { ChangeDetectionStrategy, Component, inject, input, type OnInit, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { forkJoin } from 'rxjs';
import { toApiError } from '../core/api-error';
import { LinkSheetStore } from './link-sheet-store';
import { WorkshopsApi } from './workshops-api';
import { DayPipe } from '../core/date-format';

/** A printable sheet: one slip per participant with their own link and its QR code, to cut apart. */
@Component({
  selector: 'app-link-sheet',
  imports: [DayPipe, MatButtonModule, MatIconModule, RouterLink],
  template: `
    <section class="rh-page">
      @if (sheet.links(); as s) {
        <div class="rh-no-print bar">
          <a mat-button [routerLink]="['/workshops', s.workshopId]"><mat-icon>arrow_back</mat-icon>Back</a>
          <button mat-flat-button type="button" (click)="print()"><mat-icon>print</mat-icon>Print</button>
          <span class="rh-muted">
            @if (s.reissued) {
              New links for {{ s.links.length === 1 ? s.links[0]?.name : s.links.length + ' people' }}: their earlier links no longer work.
            } @else {
              Each person's own link: the same as in their e-mail, and the same on every sheet until you reissue it.
            }
          </span>
        </div>
        <div class="slips">
          @for (l of s.links; track l.participantId) {
            <article class="slip">
              <img [src]="l.qr" [attr.alt]="'QR code of the link for ' + l.name" width="120" height="120" />
              <div>
                <p class="for">{{ s.title }}</p>
                <h2>{{ l.name }}</h2>
                <p class="url">{{ l.url }}</p>
                <p class="small">Personal link, please do not share. Works until {{ l.expiresAt | day }}.</p>
              </div>
            </article>
          }
        </div>
      } @else if (failure(); as f) {
        <p role="alert">{{ f }}</p>
        <a mat-stroked-button [routerLink]="['/workshops', id()]">Back to the workshop</a>
      } @else {
        <p role="status">Preparing the sheet…</p>
      }
    </section>
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
export default class LinkSheet implements OnInit {
  readonly id = input.required<string>();
  protected readonly sheet = inject(LinkSheetStore);
  private readonly api = inject(WorkshopsApi);
  protected readonly failure = signal<string | null>(null);

  /** Reissued links arrive in memory; otherwise the sheet shows everyone's own link, fetched again. */
  ngOnInit(): void {
    this.load(Number(this.id()));
  }

  private load(id: number): void {
    if (this.sheet.links()?.workshopId === id) return;
    forkJoin([this.api.detail(id), this.api.sheet(id)]).subscribe({
      next: ([w, links]) => this.sheet.links.set({ workshopId: id, title: w.title, links, reissued: false }),
      error: (err: unknown) => this.failure.set(toApiError(err).message),
    });
  }

  protected print(): void {
    window.print();
  }
}
