import { DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { PlanSummary } from '../../../shared/api/plans';
import { methodLabel } from './method-label';
import { BOUND_WORDS, currentWarnings, fasterKnownLine, gapLine, methodLine, RANK_LINE } from './score-words';

/** The plan's headline numbers, each with its unit and one line saying what it means. */
@Component({
  selector: 'app-plan-scores',
  imports: [DecimalPipe, PercentPipe, MatIconModule, MatTooltipModule],
  template: `
    @let p = plan();
    <dl class="scores">
      <div class="score">
        <dt>Room average</dt>
        <dd class="value">
          {{ p.average | number: '1.1-2' }} hops <span class="rh-muted">≈ {{ p.averageMinutes | number: '1.0-0' }} min</span>
        </dd>
        <dd class="line">
          How long someone who was not briefed waits, on average. One hop is one person asking another (≈
          {{ p.settings.minutesPerHop }} min).
        </dd>
      </div>
      <div class="score" data-score="gap">
        <dt [matTooltip]="boundTerm()">Gap to best</dt>
        <dd class="value">
          @if (p.certified) {
            <mat-icon class="ok" aria-hidden="true">verified</mat-icon> proven best
          } @else if (p.gapShare !== null) {
            at most {{ p.gapShare | percent: '1.0-1' }} to gain
          } @else {
            —
          }
        </dd>
        <dd class="line">{{ gap() }}</dd>
        @if (faster(); as f) {
          <dd class="line faster">{{ f }}</dd>
        }
      </div>
      @if (single(); as s) {
        <div class="score">
          <dt>Against one starter</dt>
          <dd class="value">{{ s.cut | percent: '1.0-0' }} shorter wait</dd>
          <dd class="line">
            Briefing only {{ s.name }}, the fastest single starter, gives {{ s.average | number: '1.1-1' }} hops on average; these
            {{ p.k }} starters cut that by {{ s.cut | percent: '1.0-0' }}.
            @if (p.extras?.gainShare !== null && p.extras?.gainShare !== undefined) {
              They achieve at least {{ p.extras!.gainShare | percent: '1.0-0' }} of the cut the best plan of this size could make.
            }
          </dd>
        </div>
      }
      <div class="score">
        <dt matTooltip="Quality rank: the plan's place between the worst single starter (0) and the vertex-cover bound (1)">
          Quality rank
        </dt>
        <dd class="value">{{ p.qualityRank | number: '1.2-2' }} <span class="rh-muted">of 1</span></dd>
        <dd class="line">{{ rankLine }} Close plans of one size often share the same rank: compare their averages.</dd>
      </div>
      <div class="score">
        <dt>Method</dt>
        <dd class="value">{{ method() }}</dd>
        <dd class="line">{{ methodText() }}</dd>
      </div>
      @if (p.absence; as a) {
        <div class="score wide" data-score="no-show">
          <dt>If starters may not show up ({{ p.noShow | percent: '1.0-1' }} each)</dt>
          <dd class="value">
            {{ a.expectedTotal / rest() | number: '1.1-2' }} hops expected
            <span class="rh-muted">(total {{ a.expectedTotal | number: '1.0-1' }} hops)</span>
          </dd>
          <dd class="line">
            Expected room average when each starter misses the briefing with chance {{ p.noShow | percent: '1.0-1' }}, as long as at least
            one shows up. Chance that nobody shows: {{ a.nobodyChance | percent: '1.0-3' }}.
          </dd>
          @if (a.worstAbsence; as w) {
            <dd class="line">
              Worst single absence: without <b>{{ w.name }}</b> the room average is {{ w.total / rest() | number: '1.1-2' }} hops.
            </dd>
          }
          @if (a.standIns.length) {
            <dd class="line">
              <table class="stand-ins">
                <caption>
                  Stand-ins: whom to brief instead if a starter is missing
                </caption>
                <thead>
                  <tr>
                    <th scope="col">If missing</th>
                    <th scope="col">Brief instead</th>
                    <th scope="col">Room average then</th>
                  </tr>
                </thead>
                <tbody>
                  @for (s of a.standIns; track s.personId) {
                    <tr>
                      <td>{{ s.name }}</td>
                      <td>{{ s.standInName ?? '—' }}</td>
                      <td>{{ s.total === null ? '—' : (s.total / rest() | number: '1.1-2') + ' hops' }}</td>
                    </tr>
                  }
                </tbody>
              </table>
            </dd>
          }
        </div>
      }
    </dl>
    @for (w of warnings(); track $index) {
      <p class="warning"><mat-icon aria-hidden="true">warning</mat-icon>{{ w }}</p>
    }
    @for (n of p.notes; track $index) {
      <p class="rh-muted note">{{ n }}</p>
    }
  `,
  styleUrl: './plan-scores.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanScores {
  readonly plan = input.required<PlanSummary>();
  protected readonly rankLine = RANK_LINE;
  protected readonly method = computed(() => methodLabel(this.plan().methodUsed ?? this.plan().methodRequested));
  protected readonly methodText = computed(() => methodLine(this.plan()));
  protected readonly warnings = computed(() => currentWarnings(this.plan()));
  protected readonly gap = computed(() => gapLine(this.plan()));
  protected readonly faster = computed(() => fasterKnownLine(this.plan()));
  protected readonly rest = computed(() => Math.max(1, this.plan().people - this.plan().k));
  protected readonly boundTerm = computed(() => {
    const s = this.plan().boundSource;
    return `Gap to best: (total − proven lower bound) ÷ total${s ? `; lower bound: ${BOUND_WORDS[s].term}` : ''}`;
  });
  protected readonly single = computed(() => {
    const p = this.plan();
    const b = p.extras?.bestSingle;
    if (!b || p.total === null || p.people < 2 || !(b.total > 0)) return null;
    return { name: b.name, average: b.total / (p.people - 1), cut: Math.max(0, 1 - (p.average ?? 0) / (b.total / (p.people - 1))) };
  });
}
