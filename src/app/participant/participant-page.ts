import { DOCUMENT, isPlatformBrowser } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, input, type OnInit, PLATFORM_ID, REQUEST_CONTEXT, signal } from '@angular/core';
import type { MyDebrief, SurveyState } from '../../../shared/api/workshops';
import { concatMap, EMPTY, finalize, of, tap } from 'rxjs';
import { toApiError } from '../core/api-error';
import { DayPipe } from '../core/date-format';
import { DebriefView } from './debrief-view';
import { renderedState, takeFirstState } from './first-state';
import { ParticipantApi } from './participant-api';
import { PrivacyNotice } from './privacy-notice';
import { SurveyForm } from './survey-form';

/**
 * The survey's code is loaded after the page shows (it sits in an @defer block): while a new
 * participant reads the notice, it is fetched in the background so "I have read this" shows the
 * survey at once. The same chunk as the @defer block's, so it is fetched once.
 */
function fetchSurveyCodeWhenIdle(): void {
  const fetchIt = () => void import('./survey-form').catch(() => undefined);
  if (typeof requestIdleCallback === 'function') requestIdleCallback(fetchIt, { timeout: 2000 });
  else setTimeout(fetchIt, 200);
}

/** A participant's own page, opened from their personal link: notice, survey, later their results. */
@Component({
  selector: 'app-participant-page',
  imports: [DayPipe, SurveyForm, DebriefView, PrivacyNotice],
  templateUrl: './participant-page.html',
  styleUrl: './participant-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class ParticipantPage implements OnInit {
  readonly token = input.required<string>();
  private readonly api = inject(ParticipantApi);
  private readonly doc = inject(DOCUMENT);
  private readonly inBrowser = isPlatformBrowser(inject(PLATFORM_ID));
  private readonly renderContext = inject(REQUEST_CONTEXT, { optional: true });
  protected readonly state = signal<SurveyState | null>(null);
  protected readonly debrief = signal<MyDebrief | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly agreeing = signal(false);
  protected readonly view = signal<'survey' | 'results'>('survey');

  ngOnInit(): void {
    this.open();
  }

  /**
   * Reads the survey's state (written into the page by the server when it served it cold, else
   * asked for), and the results too once they are released.
   */
  private open(): void {
    const token = this.token();
    if (!this.inBrowser) {
      // Drawn on the server: the state it was handed, and nothing asked (results, if released,
      // are fetched by the browser once the app has taken the page over).
      this.state.set(renderedState(this.renderContext, token));
      return;
    }
    const first = takeFirstState(token, this.doc);
    (first ? of(first) : this.api.state(token))
      .pipe(
        tap((s) => {
          this.state.set(s);
          if (!s.consented && s.open) fetchSurveyCodeWhenIdle();
        }),
        concatMap((s) => (s.debriefReady ? this.api.debrief(token) : EMPTY)),
      )
      .subscribe({
        next: (d) => {
          this.debrief.set(d);
          this.view.set('results');
        },
        error: (err: unknown) => this.failure.set(toApiError(err).message),
      });
  }

  protected agree(): void {
    this.agreeing.set(true);
    this.api
      .consent(this.token())
      .pipe(finalize(() => this.agreeing.set(false)))
      .subscribe({
        next: (s) => this.state.set(s),
        error: (err: unknown) => this.failure.set(toApiError(err).message),
      });
  }

  protected updated(s: SurveyState): void {
    this.state.set(s);
  }
}
