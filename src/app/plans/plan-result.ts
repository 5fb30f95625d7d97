import { ChangeDetectionStrategy, Component, computed, effect, inject, input, PendingTasks, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { PlanDetail } from '../../../shared/api/plans';
import type { RoomDto } from '../../../shared/api/rooms';
import { inPaintedTurns } from '../core/painted-turns';
import { ModelCaution } from './model-caution';
import { PlanMap } from './plan-map';
import { PlanPeopleTable } from './plan-people-table';
import { PlanScores } from './plan-scores';
import { ReachChart } from './reach-chart';

/** One plan's result: scores, map, reach curve, per-person table and the cautions. */
@Component({
  selector: 'app-plan-result',
  imports: [MatIconModule, ModelCaution, PlanMap, PlanPeopleTable, PlanScores, ReachChart],
  template: `
    @let p = plan();
    <div class="starters">
      <span class="label">Brief first:</span>
      @for (s of p.starters; track s.personId) {
        <span class="starter"
          ><b>{{ s.order }}</b> {{ s.name }}
          @if (s.group) {
            <span class="rh-muted"> · {{ s.group }}</span>
          }
        </span>
      }
    </div>
    @for (q of p.reach?.quantiles ?? []; track q.share) {
      @if (q.share === 0.9 && q.minutes !== null) {
        <p class="headline">{{ q.share * 100 }}% will have heard within about {{ q.minutes }} minutes ({{ q.hop }} hops).</p>
      }
    }
    <app-plan-scores [plan]="p" />
    <app-model-caution />
    <div class="grid">
      <section [class.stale]="!!mapOf() && mapOf() !== p">
        <h3>On the map</h3>
        @if (mapOf()) {
          <app-plan-map [people]="room().people" [ties]="room().ties" [hops]="hops()" [starters]="starterIds()" />
        } @else {
          <div class="map-to-come" aria-busy="true"></div>
        }
      </section>
      <section [class.stale]="!!curveOf() && curveOf() !== p">
        @if (curveOf(); as c) {
          @if (c.reach) {
            <app-reach-chart
              [series]="[{ label: c.name, share: c.reach.byHop }]"
              [minutesPerHop]="c.reach.minutesPerHop"
              title="How fast the word spreads"
            />
            <p class="rh-muted small">
              @if (!c.reach.complete) {
                The curve is cut where the slowest few have not yet heard.
              }
              One hop ≈ {{ c.reach.minutesPerHop }} min (room setting).
            </p>
          }
        } @else if (p.reach) {
          <div class="curve-to-come" aria-busy="true"></div>
        }
      </section>
    </div>
    <section [class.stale]="!!tableOf() && tableOf() !== p">
      <h3>Person by person</h3>
      @if (tableOf(); as t) {
        <app-plan-people-table [people]="t.perPerson" />
      }
    </section>
  `,
  styleUrl: './plan-result.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanResult {
  readonly plan = input.required<PlanDetail>();
  readonly room = input.required<RoomDto>();
  /**
   * The plans the map, the reach curve and the table show. They follow `plan` one painted frame
   * apart, in that order: the starters and scores reach the screen first, then each drawing (the
   * costly part) in a task of its own. Until a drawing is redone it shows the previous plan, dimmed.
   */
  protected readonly mapOf = signal<PlanDetail | null>(null);
  protected readonly curveOf = signal<PlanDetail | null>(null);
  protected readonly tableOf = signal<PlanDetail | null>(null);
  protected readonly hops = computed(() => new Map((this.mapOf()?.perPerson ?? []).map((p) => [p.personId, p.expectedHops])));
  protected readonly starterIds = computed(() => (this.mapOf()?.starters ?? []).map((s) => s.personId));

  constructor() {
    const tasks = inject(PendingTasks);
    effect((onCleanup) => {
      const p = this.plan();
      onCleanup(inPaintedTurns(tasks, [() => this.mapOf.set(p), () => this.curveOf.set(p), () => this.tableOf.set(p)]));
    });
  }
}
