import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { PlanDetail } from '../../../shared/api/plans';
import type { RoomDto } from '../../../shared/api/rooms';
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
      <section>
        <h3>On the map</h3>
        <app-plan-map [people]="room().people" [ties]="room().ties" [hops]="hops()" [starters]="starterIds()" />
      </section>
      <section>
        @if (p.reach) {
          <app-reach-chart
            [series]="[{ label: p.name, share: p.reach.byHop }]"
            [minutesPerHop]="p.reach.minutesPerHop"
            title="How fast the word spreads"
          />
          <p class="rh-muted small">
            @if (!p.reach.complete) {
              The curve is cut where the slowest few have not yet heard.
            }
            One hop ≈ {{ p.reach.minutesPerHop }} min (room setting).
          </p>
        }
      </section>
    </div>
    <section>
      <h3>Person by person</h3>
      <app-plan-people-table [people]="p.perPerson" />
    </section>
  `,
  styleUrl: './plan-result.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanResult {
  readonly plan = input.required<PlanDetail>();
  readonly room = input.required<RoomDto>();
  protected readonly hops = computed(() => new Map(this.plan().perPerson.map((p) => [p.personId, p.expectedHops])));
  protected readonly starterIds = computed(() => this.plan().starters.map((s) => s.personId));
}
