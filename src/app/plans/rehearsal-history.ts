import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input, model, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { JOB_STATUSES, type PlanSummary, type RehearsalSummary } from '../../../shared/api/plans';
import { DateTimePipe } from '../core/date-format';

/** The room's rehearsals, newest first, filtered by plan and status. */
@Component({
  selector: 'app-rehearsal-history',
  imports: [DateTimePipe, DecimalPipe, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule, MatTooltipModule],
  templateUrl: './rehearsal-history.html',
  styleUrl: './rehearsal-history.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RehearsalHistory {
  readonly rehearsals = input.required<readonly RehearsalSummary[]>();
  readonly plans = input.required<readonly PlanSummary[]>();
  readonly shownId = input<number | null>(null);
  readonly planFilter = model<number | null>(null);
  readonly statusFilter = model<string | null>(null);
  readonly opened = output<number>();
  readonly rerun = output<RehearsalSummary>();
  protected readonly statuses = JOB_STATUSES;
  /** The room's own number of a rehearsal, from its id (ids run across all rooms). */
  protected numberOf(id: number): number | string {
    return this.rehearsals().find((r) => r.id === id)?.number ?? '?';
  }
  protected readonly statusLabel: Record<string, string> = {
    queued: 'waiting',
    running: 'running',
    done: 'finished',
    failed: 'failed',
    cancelled: 'cancelled',
    interrupted: 'interrupted (server restart)',
  };
}
