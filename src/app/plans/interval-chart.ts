import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartOptions } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';
import { intervalChartData, type IntervalPoint } from './interval-chart-data';

/** Per person: the rehearsal's interval (bar), its mean (dot) and the analysis (diamond). */
@Component({
  selector: 'app-interval-chart',
  imports: [BaseChartDirective],
  template: `<div class="chart" [style.min-width.px]="points().length * 14">
    <canvas
      baseChart
      type="bar"
      [data]="$any(data())"
      [options]="options"
      role="img"
      aria-label="Rehearsal against analysis per person"
    ></canvas>
  </div>`,
  styles: `
    :host {
      display: block;
      overflow-x: auto;
    }
    .chart {
      position: relative;
      height: 320px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class IntervalChart {
  readonly points = input.required<readonly IntervalPoint[]>();
  readonly intervalLabel = input('99% interval of the rehearsal');
  protected readonly data = computed(() => intervalChartData(this.points(), this.intervalLabel()));
  protected readonly options: ChartOptions<'bar'> = {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    interaction: { mode: 'index', intersect: false },
    scales: {
      x: { ticks: { autoSkip: true, maxRotation: 60, minRotation: 45, font: { size: 10 } } },
      y: { beginAtZero: true, title: { display: true, text: 'expected hops to hear' } },
    },
    plugins: {
      legend: { position: 'bottom' },
      tooltip: {
        callbacks: {
          label: (c) => {
            const v = c.raw as number | [number, number];
            return Array.isArray(v) ? `${c.dataset.label}: ${v[0].toFixed(2)} – ${v[1].toFixed(2)}` : `${c.dataset.label}: ${v.toFixed(2)}`;
          },
        },
      },
    },
  };
}
