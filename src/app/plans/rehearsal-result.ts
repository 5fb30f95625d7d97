import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import type { RehearsalDetail } from '../../../shared/api/plans';
import { IntervalChart } from './interval-chart';
import { intervalPointsFrom } from './interval-chart-data';
import { ModelCaution } from './model-caution';
import { ReachChart } from './reach-chart';
import type { ReachSeries } from './reach-chart-data';
import type { RerunMatch } from './rerun-match';

/** A finished rehearsal: the verdict, its numbers, and the two comparison charts. */
@Component({
  selector: 'app-rehearsal-result',
  imports: [DecimalPipe, RouterLink, MatButtonModule, MatIconModule, MatTooltipModule, IntervalChart, ModelCaution, ReachChart],
  templateUrl: './rehearsal-result.html',
  styleUrl: './rehearsal-result.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RehearsalResult {
  readonly rehearsal = input.required<RehearsalDetail>();
  readonly match = input<RerunMatch | null>(null);
  readonly rerun = output<RehearsalDetail>();

  protected readonly points = computed(() => intervalPointsFrom(this.rehearsal().people));
  protected readonly series = computed<ReachSeries[]>(() => {
    const r = this.rehearsal().reach;
    if (!r) return [];
    return [
      { label: 'Analysis', share: r.analytic, colour: '#c2603a' },
      { label: `Rehearsal (${this.rehearsal().runs.toLocaleString('en')} cascades)`, share: r.simulated, dashed: true, colour: '#5b7065' },
    ];
  });
}
