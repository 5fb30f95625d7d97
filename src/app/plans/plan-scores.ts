import { DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { PlanSummary } from '../../../shared/api/plans';
import { methodLabel } from './method-label';

/** The plan's headline numbers, each with one line saying what it means. */
@Component({
  selector: 'app-plan-scores',
  imports: [DecimalPipe, PercentPipe, MatIconModule],
  template: `
    @let p = plan();
    <dl class="scores">
      <div class="score">
        <dt>Room average</dt>
        <dd class="value">
          {{ p.average | number: '1.1-2' }} hops <span class="rh-muted">≈ {{ p.averageMinutes | number: '1.0-0' }} min</span>
        </dd>
        <dd class="line">How long, on average, someone who was not briefed waits to hear.</dd>
      </div>
      <div class="score">
        <dt>Quality rank</dt>
        <dd class="value">{{ p.qualityRank | number: '1.2-2' }}</dd>
        <dd class="line">0 is as slow as the worst single starter; 1 means everyone talks directly to a starter.</dd>
      </div>
      <div class="score">
        <dt>Gap to best</dt>
        <dd class="value">
          @if (p.certified) {
            <mat-icon class="ok" aria-hidden="true">verified</mat-icon> proven best
          } @else if (p.gapShare !== null) {
            at most {{ p.gapShare | percent: '1.0-1' }}
          } @else {
            —
          }
        </dd>
        <dd class="line">{{ gapLine() }}</dd>
      </div>
      <div class="score">
        <dt>Method</dt>
        <dd class="value">{{ method() }}</dd>
        <dd class="line">
          @if (p.methodRequested === 'auto') {
            Chosen automatically ·
          }
          computed in {{ p.elapsedMs | number: '1.0-0' }} ms on room version {{ p.roomVersion }}.
        </dd>
      </div>
    </dl>
    @for (w of p.warnings; track $index) {
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
  protected readonly method = computed(() => methodLabel(this.plan().methodUsed ?? this.plan().methodRequested));
  protected readonly gapLine = computed(() => {
    const p = this.plan();
    if (p.certified) return 'Checked against every other plan of this size: none is faster.';
    if (p.gap === null) return 'No bound is available for this plan.';
    const share = p.gapShare !== null ? `${(p.gapShare * 100).toFixed(1)}% (` : '';
    const close = share ? ')' : '';
    return `No plan of this size can cut the total waiting by more than ${share}${p.gap.toFixed(1)} hops${close}: a proven bound, often loose.`;
  });
}
