import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { rangePlot, type IntervalPoint } from './interval-chart-data';

/**
 * Per person: the rehearsal's interval (bar), its mean (dot) and the analysis (hollow diamond), one
 * row per person. Positions are percentages of the track, so the plot fits its column at any width;
 * a table of the same numbers opens below it (keyboard reachable).
 */
@Component({
  selector: 'app-interval-chart',
  imports: [DecimalPipe],
  template: `
    @let plot = data();
    <div class="legend" aria-hidden="true">
      <span><i class="key bar"></i>{{ intervalLabel() }}</span>
      <span><i class="key dot"></i>rehearsal mean</span>
      <span><i class="key diamond"></i>analysis</span>
    </div>
    <div class="plot" role="img" [attr.aria-label]="summary()">
      <div class="row axis" aria-hidden="true">
        <span class="name">expected hops</span>
        <span class="track">
          @for (t of plot.ticks; track t.value) {
            <span class="tick" [style.left.%]="t.pct">{{ t.value | number: '1.0-2' }}</span>
          }
        </span>
      </div>
      <div class="rows">
        @for (r of plot.rows; track r.name + $index) {
          <div class="row" [class.outside]="!r.inside">
            <span class="name" [title]="r.name">{{ r.name }}</span>
            <span class="track">
              @for (t of plot.ticks; track t.value) {
                <i class="grid" [style.left.%]="t.pct"></i>
              }
              <i class="bar" [style.left.%]="r.lowPct" [style.width.%]="r.widthPct"></i>
              <i class="dot" [style.left.%]="r.meanPct"></i>
              <i class="diamond" [style.left.%]="r.analyticPct"></i>
            </span>
          </div>
        }
      </div>
    </div>
    <details class="as-table">
      <summary>These numbers as a table</summary>
      <table>
        <thead>
          <tr>
            <th scope="col">Person</th>
            <th scope="col">Analysis (hops)</th>
            <th scope="col">Rehearsal mean</th>
            <th scope="col">{{ intervalLabel() }}</th>
            <th scope="col">Agree?</th>
          </tr>
        </thead>
        <tbody>
          @for (r of plot.rows; track r.name + $index) {
            <tr>
              <th scope="row">{{ r.name }}</th>
              <td>{{ r.analytic | number: '1.2-2' }}</td>
              <td>{{ r.simulated | number: '1.2-2' }}</td>
              <td>{{ r.low | number: '1.2-2' }} – {{ r.high | number: '1.2-2' }}</td>
              <td>{{ r.inside ? 'yes' : 'no: analysis outside the interval' }}</td>
            </tr>
          }
        </tbody>
      </table>
    </details>
  `,
  styleUrl: './interval-chart.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class IntervalChart {
  readonly points = input.required<readonly IntervalPoint[]>();
  readonly intervalLabel = input('99% interval of the rehearsal');
  protected readonly data = computed(() => rangePlot(this.points()));
  protected readonly summary = computed(() => {
    const d = this.data();
    return `Rehearsal against analysis for ${d.rows.length} people: ${d.rows.length - d.outside} with the analysis inside their interval, ${d.outside} outside.`;
  });
}
