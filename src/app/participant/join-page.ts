import { ChangeDetectionStrategy, Component, computed, inject, input, type OnInit, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { Router } from '@angular/router';
import type { JoinState } from '../../../shared/api/workshops';
import { catchError, concatMap, EMPTY, finalize, from, type Observable, tap } from 'rxjs';
import { toApiError } from '../core/api-error';
import { ParticipantApi } from './participant-api';

/** Reached from the projector QR code: pick your own name once to get your personal page. */
@Component({
  selector: 'app-join-page',
  imports: [MatButtonModule],
  template: `
    <div class="phone">
      <header class="brand"><img src="favicon.svg" alt="" width="26" height="26" /><span>Ripplehall</span></header>
      <section class="card">
        @if (failure(); as m) {
          <h1>This code does not open a workshop</h1>
          <p role="alert">{{ m }}</p>
        } @else if (state(); as s) {
          <p class="kicker">{{ s.workshopTitle }}</p>
          @if (!s.open) {
            <h1>{{ s.status === 'draft' ? 'The survey has not opened yet' : 'The survey is closed' }}</h1>
            <p class="note" role="status">
              {{
                s.status === 'draft'
                  ? 'Your facilitator will tell you when to scan the code again.'
                  : 'Names can no longer be picked here. If you already have your personal link, it still opens your page.'
              }}
            </p>
          } @else {
            <h1>Which name is yours?</h1>
            @if (allTaken()) {
              <p class="note" role="alert">
                Every name on the list has been picked. If one of them is yours, ask your facilitator to reset it; if yours is missing, ask
                them to add you.
              </p>
            } @else {
              <p class="rh-muted">Pick only your own name: it opens your personal page, and each name can be picked once.</p>
            }
          }
          @if (problem(); as p) {
            <p class="note error" role="alert">{{ p }}</p>
          }
          @if (s.open) {
            <ul class="names">
              @for (n of s.names; track n.id) {
                <li>
                  <button mat-stroked-button type="button" [disabled]="n.taken || busy() || !s.open" (click)="claim(n.id)">
                    {{ n.name }}
                    @if (n.taken) {
                      <span class="taken">already taken</span>
                    }
                  </button>
                </li>
              }
            </ul>
          }
        } @else {
          <p role="status">Opening…</p>
        }
      </section>
    </div>
  `,
  styleUrl: './join-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class JoinPage implements OnInit {
  readonly code = input.required<string>();
  private readonly api = inject(ParticipantApi);
  private readonly router = inject(Router);
  protected readonly state = signal<JoinState | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly problem = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly allTaken = computed(() => !!this.state()?.names.length && this.state()!.names.every((n) => n.taken));

  ngOnInit(): void {
    this.load().subscribe();
  }

  /** The names still to claim; a failure is shown instead of the list. */
  private load(): Observable<JoinState> {
    return this.api.join(this.code()).pipe(
      tap((s) => this.state.set(s)),
      catchError((err: unknown) => {
        this.failure.set(toApiError(err).message);
        return EMPTY;
      }),
    );
  }

  /** Claims a name and opens that person's page; a refusal is shown and the list read again. */
  protected claim(id: number): void {
    this.busy.set(true);
    this.problem.set(null);
    this.api
      .claim(this.code(), id)
      .pipe(
        concatMap(({ path }) => from(this.router.navigateByUrl(path, { replaceUrl: true }))),
        catchError((err: unknown) => {
          this.problem.set(toApiError(err).message);
          return this.load();
        }),
        finalize(() => this.busy.set(false)),
      )
      .subscribe();
  }
}
