import { ChangeDetectionStrategy, Component, inject, input, type OnDestroy, type OnInit, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { SurveyProgress } from '../../../shared/api/workshops';
import { forkJoin } from 'rxjs';
import { toApiError } from '../core/api-error';
import { WorkshopsApi } from './workshops-api';
import { DateTimePipe } from '../core/date-format';

/** Full-screen QR code for the projector: participants scan it and pick their own name. */
@Component({
  selector: 'app-join-projector',
  imports: [DateTimePipe, RouterLink, MatIconModule],
  template: `
    <section class="qr-screen">
      @if (error(); as e) {
        <p role="alert">{{ e }}</p>
      } @else if (progress(); as p) {
        @if (p.status !== 'collecting') {
          <h1 role="status">{{ p.status === 'draft' ? 'The survey has not opened yet' : 'The survey is closed' }}</h1>
          <p class="hint">
            {{
              p.status === 'draft'
                ? 'The code appears here once the survey opens.'
                : 'Thank you: names can no longer be picked here. Your personal link still shows your page.'
            }}
          </p>
          <p class="count">
            <strong>{{ p.answered }}</strong> of {{ p.participants }} answered
          </p>
        } @else if (code(); as c) {
          <h1>Scan to join the survey</h1>
          <img [src]="c.qr" alt="QR code leading to the join page" />
          <p class="url">{{ c.url }}</p>
          <p class="hint">Pick your own name on your phone. Each name can be picked once.</p>
          <p class="count" aria-live="polite">
            <strong>{{ p.answered }}</strong> of {{ p.participants }} have answered
          </p>
          <p class="small">This code works until {{ c.expiresAt | dateTime }}; showing it again makes a new one.</p>
        }
      } @else {
        <p role="status">Preparing the code…</p>
      }
      <a [routerLink]="['/workshops', id()]" class="back"><mat-icon>arrow_back</mat-icon>Back to the workshop</a>
    </section>
  `,
  styles: `
    .qr-screen {
      min-height: 100vh;
      background: #0d1b26;
      color: #f2f5f7;
      display: flex;
      flex-direction: column;
      align-items: center;
      justify-content: center;
      text-align: center;
      padding: 24px;
    }
    h1 {
      font-size: 3rem;
      margin: 0 0 24px;
    }
    img {
      width: min(60vh, 80vw);
      height: auto;
      background: #fff;
      padding: 12px;
      border-radius: 12px;
    }
    .url {
      font-family: ui-monospace, monospace;
      font-size: 1.1rem;
      word-break: break-all;
      max-width: 90vw;
    }
    .hint {
      font-size: 1.6rem;
    }
    .count {
      font-size: 1.8rem;
      strong {
        color: #ffc94d;
        font-size: 2.4rem;
      }
    }
    .small {
      color: #a9b8c4;
    }
    .back {
      color: #6fd3ff;
      display: inline-flex;
      gap: 6px;
      align-items: center;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class JoinProjector implements OnInit, OnDestroy {
  readonly id = input.required<string>();
  private readonly api = inject(WorkshopsApi);
  protected readonly code = signal<{ url: string; qr: string; expiresAt: string } | null>(null);
  protected readonly progress = signal<SurveyProgress | null>(null);
  protected readonly error = signal<string | null>(null);
  private timer: ReturnType<typeof setInterval> | undefined;

  ngOnInit(): void {
    this.open(Number(this.id()));
  }

  private open(id: number): void {
    forkJoin([this.api.joinCode(id), this.api.progress(id)]).subscribe({
      next: ([code, progress]) => {
        this.code.set(code);
        this.progress.set(progress);
        // The count and the survey's state, every 3 s: once the survey closes the screen says so.
        this.timer = setInterval(() => this.refresh(id), 3000);
      },
      error: (err: unknown) => this.error.set(toApiError(err).message),
    });
  }

  /** A missed refresh keeps the last count. */
  private refresh(id: number): void {
    this.api.progress(id).subscribe({ next: (p) => this.progress.set(p), error: () => undefined });
  }

  ngOnDestroy(): void {
    clearInterval(this.timer);
  }
}
