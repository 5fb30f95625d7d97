import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartOptions } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';
import type { KSweepPoint } from '../../../shared/api/plans';
import { sweepChartData, sweepSeriesFromPoints } from './sweep-chart-data';

/** Room average for budgets 1..K by method, with the two baselines. Lower is better. */
@Component({
  selector: 'app-sweep-chart',
  imports: [BaseChartDirective],
  template: `<div class="chart">
    <canvas baseChart type="line" [data]="data()" [options]="options" role="img" aria-label="Room average by budget and method"></canvas>
  </div>`,
  styles: `
    :host {
      display: block;
    }
    .chart {
      position: relative;
      height: 300px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SweepChart {
  readonly points = input.required<readonly KSweepPoint[]>();
  protected readonly data = computed(() => sweepChartData(sweepSeriesFromPoints(this.points())));
  protected readonly options: ChartOptions<'line'> = {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    interaction: { mode: 'index', intersect: false },
    scales: {
      x: { title: { display: true, text: 'budget k (people briefed first)' } },
      y: { beginAtZero: true, title: { display: true, text: 'room average (expected hops)' } },
    },
    plugins: {
      legend: { position: 'bottom' },
      tooltip: {
        callbacks: { label: (c) => `${c.dataset.label}: ${c.parsed.y === null ? 'no plan' : (c.parsed.y ?? 0).toFixed(2) + ' hops'}` },
      },
    },
  };
}
