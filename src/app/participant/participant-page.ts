import { ChangeDetectionStrategy, Component, inject, input, type OnInit, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatIconModule } from '@angular/material/icon';
import type { MyDebrief, SurveyState } from '../../../shared/api/workshops';
import { toApiError } from '../core/api-error';
import { DayPipe } from '../core/date-format';
import { DebriefView } from './debrief-view';
import { ParticipantApi } from './participant-api';
import { PrivacyNotice } from './privacy-notice';
import { SurveyForm } from './survey-form';

/** A participant's own page, opened from their personal link: notice, survey, later their results. */
@Component({
  selector: 'app-participant-page',
  imports: [DayPipe, MatButtonModule, MatCheckboxModule, MatIconModule, SurveyForm, DebriefView, PrivacyNotice],
  templateUrl: './participant-page.html',
  styleUrl: './participant-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class ParticipantPage implements OnInit {
  readonly token = input.required<string>();
  private readonly api = inject(ParticipantApi);
  protected readonly state = signal<SurveyState | null>(null);
  protected readonly debrief = signal<MyDebrief | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly agreeing = signal(false);
  protected readonly view = signal<'survey' | 'results'>('survey');

  async ngOnInit(): Promise<void> {
    try {
      const s = await this.api.state(this.token());
      this.state.set(s);
      if (s.debriefReady) {
        this.debrief.set(await this.api.debrief(this.token()));
        this.view.set('results');
      }
    } catch (err) {
      this.failure.set(toApiError(err).message);
    }
  }

  protected async agree(): Promise<void> {
    this.agreeing.set(true);
    try {
      this.state.set(await this.api.consent(this.token()));
    } catch (err) {
      this.failure.set(toApiError(err).message);
    } finally {
      this.agreeing.set(false);
    }
  }

  protected updated(s: SurveyState): void {
    this.state.set(s);
  }
}
