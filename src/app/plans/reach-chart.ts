import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import type { ChartOptions } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';
import { reachChartData, type ReachAxis, type ReachSeries } from './reach-chart-data';

/** Share of people reached by hop or by minute, for one or more curves (plans or rehearsals). */
@Component({
  selector: 'app-reach-chart',
  imports: [BaseChartDirective, MatButtonToggleModule],
  template: `
    <div class="head">
      <h3>{{ title() }}</h3>
      <mat-button-toggle-group
        [value]="axis()"
        (change)="axis.set($event.value)"
        aria-label="Reach curve axis"
        hideSingleSelectionIndicator="true"
      >
        <mat-button-toggle value="hop">By hop</mat-button-toggle>
        <mat-button-toggle value="minute">By minute</mat-button-toggle>
      </mat-button-toggle-group>
    </div>
    <div class="chart">
      <canvas baseChart type="line" [data]="data()" [options]="options()" [attr.aria-label]="title()" role="img"></canvas>
    </div>
  `,
  styles: `
    :host {
      display: block;
    }
    .head {
      display: flex;
      align-items: center;
      justify-content: space-between;
      gap: 8px;
    }
    h3 {
      margin: 0;
      font: var(--mat-sys-title-medium);
    }
    .chart {
      position: relative;
      height: 260px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReachChart {
  readonly series = input.required<readonly ReachSeries[]>();
  readonly minutesPerHop = input.required<number>();
  readonly title = input('Share of people who have heard');
  protected readonly axis = signal<ReachAxis>('hop');

  protected readonly data = computed(() => reachChartData(this.series(), this.axis(), this.minutesPerHop()));
  protected readonly options = computed<ChartOptions<'line'>>(() => ({
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    parsing: false,
    interaction: { mode: 'nearest', intersect: false, axis: 'x' },
    scales: {
      x: {
        type: 'linear',
        title: { display: true, text: this.axis() === 'hop' ? 'hops after the briefing' : 'minutes after the briefing' },
      },
      y: { min: 0, max: 100, title: { display: true, text: '% of the others who have heard' } },
    },
    plugins: {
      legend: { display: this.series().length > 1, position: 'bottom' },
      tooltip: { callbacks: { label: (c) => `${c.dataset.label}: ${(c.parsed.y ?? 0).toFixed(1)}%` } },
    },
  }));
}
