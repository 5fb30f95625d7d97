import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { clockMinutes, clockProblem, clockTimes, DEFAULT_SEND_AT, formatClock } from '../../../shared/api/briefing-clock';
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
  /** Clock time the message goes out (24-hour HH:MM), to turn minutes into times of day on the sheet. */
  protected readonly sendAt = signal(DEFAULT_SEND_AT);
  protected readonly sendAtProblem = computed(() => clockProblem(this.sendAt()));
  protected readonly clock = computed(() => {
    const s = this.sheet();
    return s ? clockTimes(s.expectations, this.sendAt()) : [];
  });
  /** The PDF carries the same start time as the screen. */
  protected readonly pdfHref = computed(() => {
    const start = this.sendAtProblem() ? DEFAULT_SEND_AT : formatClock(clockMinutes(this.sendAt())!);
    return `/api/plans/${this.planId()}/briefing.pdf?start=${encodeURIComponent(start)}`;
  });

  constructor() {
    effect(() => {
      const id = Number(this.planId());
      untracked(() => this.load(id));
    });
  }

  private load(id: number): void {
    this.api.briefing(id).subscribe({
      next: (sheet) => this.sheet.set(sheet),
      error: (e: unknown) => this.error.set(toApiError(e).message),
    });
  }

  protected print(): void {
    window.print();
  }
}
