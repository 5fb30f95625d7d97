import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { BriefingSheet } from '../../../shared/api/plans';
import { toApiError } from '../core/api-error';
import { PlansApi } from './plans-api';
import { DateTimePipe } from '../core/date-format';

/** The printable briefing sheet of a plan: whom to brief, in which order, and what to expect. */
@Component({
  selector: 'app-briefing-page',
  imports: [DateTimePipe, DecimalPipe, RouterLink, MatButtonModule, MatIconModule],
  templateUrl: './briefing-page.html',
  styleUrl: './briefing-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class BriefingPage {
  private readonly api = inject(PlansApi);
  readonly roomId = input.required<string>();
  readonly planId = input.required<string>();
  protected readonly sheet = signal<BriefingSheet | null>(null);
  protected readonly error = signal<string | null>(null);
  /** Clock time the message goes out (HH:MM), to turn minutes into times of day on the sheet. */
  protected readonly sendAt = signal('09:00');

  protected readonly clock = computed(() => {
    const s = this.sheet();
    const m = /^(\d{1,2}):(\d{2})$/.exec(this.sendAt());
    if (!s || !m) return [];
    const start = Number(m[1]) * 60 + Number(m[2]);
    return s.expectations
      .filter((e) => e.minutes !== null)
      .map((e) => {
        const t = Math.round(start + e.minutes!) % (24 * 60);
        return { share: e.share, at: `${String(Math.floor(t / 60)).padStart(2, '0')}:${String(t % 60).padStart(2, '0')}` };
      });
  });

  constructor() {
    effect(() => {
      const id = Number(this.planId());
      untracked(() => void this.load(id));
    });
  }

  private async load(id: number): Promise<void> {
    try {
      this.sheet.set(await firstValueFrom(this.api.briefing(id)));
    } catch (e) {
      this.error.set(toApiError(e).message);
    }
  }

  protected print(): void {
    window.print();
  }
}
