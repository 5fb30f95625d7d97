import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import type { PlanSummary } from '../../../shared/api/plans';
import { methodLabel } from './method-label';
import { DateTimePipe } from '../core/date-format';

const SHOWN = 8;

/** The room's saved plans: open one, mark the chosen one, pick two to compare. */
@Component({
  selector: 'app-saved-plans',
  imports: [DateTimePipe, DecimalPipe, RouterLink, MatButtonModule, MatCheckboxModule, MatIconModule, MatTooltipModule],
  templateUrl: './saved-plans.html',
  styleUrl: './saved-plans.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SavedPlans {
  readonly plans = input.required<readonly PlanSummary[]>();
  readonly roomId = input.required<number>();
  readonly openId = input<number | null>(null);
  /** Viewers of a shared room can read plans but not mark or delete them. */
  readonly canChange = input(true);
  readonly opened = output<number>();
  readonly chosen = output<PlanSummary>();
  readonly removed = output<PlanSummary>();

  protected readonly picked = signal<number[]>([]);
  protected readonly showAll = signal(false);
  protected readonly visible = computed(() => (this.showAll() ? this.plans() : this.plans().slice(0, SHOWN)));
  protected readonly shown = SHOWN;
  protected readonly methodLabel = methodLabel;

  protected togglePick(id: number, on: boolean): void {
    this.picked.update((ids) => (on ? [...ids.filter((x) => x !== id), id].slice(-2) : ids.filter((x) => x !== id)));
  }
}
