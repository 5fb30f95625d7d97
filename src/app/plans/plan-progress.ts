import { DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { PlanSearchProgress } from '../../../shared/api/plans';

const STAGES: Record<string, string> = {
  greedy: 'Adding starters one by one',
  widened: 'Growing strong small groups',
  swap: 'Trying swaps',
  search: 'Searching every group',
  exhaustive: 'Searching every group',
  bounds: 'Proving how close the plan is',
};

/**
 * A plan being computed: a bar driven by the search itself, what it has found and proven so far,
 * stop (keep the best plan so far) and cancel (keep nothing).
 */
@Component({
  selector: 'app-plan-progress',
  imports: [DecimalPipe, PercentPipe, MatButtonModule, MatIconModule, MatProgressBarModule, MatTooltipModule],
  template: `
    <div class="progress" aria-live="polite">
      <mat-progress-bar mode="determinate" [value]="percent()" aria-label="Plan progress" />
      <div class="lines">
        @if (position()) {
          <p class="main">Waiting: number {{ position() }} in your queue.</p>
        } @else {
          <p class="main">
            {{ stageWords() }}
            @if (search()?.closed !== null && search()?.closed !== undefined) {
              · {{ search()!.closed | percent: '1.0-0' }} of the possible groups settled
            } @else {
              · {{ progress() | percent: '1.0-0' }}
            }
          </p>
          @if (bestAverage() !== null) {
            <p>
              Best plan so far: <b>{{ bestAverage() | number: '1.2-2' }} hops</b> on average
              @if (search()?.gapShare !== null && search()?.gapShare !== undefined) {
                · at most
                <b matTooltip="Gap to best: (best total so far − proven lower bound) ÷ best total so far">{{
                  search()!.gapShare | percent: '1.0-1'
                }}</b>
                left to gain (proven)
              }
            </p>
          }
          @if (search()?.closed !== null && search()?.closed !== undefined) {
            <p class="rh-muted">The search stops when every group is settled or at its time limit, whichever comes first.</p>
          }
          @if (search()?.nodes) {
            <p class="rh-muted" matTooltip="Search nodes: partial groups the branch-and-bound search has examined">
              {{ search()!.nodes | number }} partial groups examined
            </p>
          }
        }
      </div>
      <div class="actions">
        @if (bestAverage() !== null && !position()) {
          <button
            mat-stroked-button
            type="button"
            (click)="stopped.emit()"
            matTooltip="Ends the search now and keeps the best plan it has found, with how far from the best it can still be"
          >
            <mat-icon>flag</mat-icon>Stop, keep the best
          </button>
        }
        <button mat-stroked-button type="button" (click)="cancelled.emit()"><mat-icon>stop_circle</mat-icon>Cancel</button>
      </div>
    </div>
  `,
  styles: `
    .progress {
      display: grid;
      grid-template-columns: minmax(0, 1fr) auto;
      gap: 8px 12px;
      align-items: center;
      padding: 12px 14px;
      border: 1px solid var(--rh-line);
      border-radius: var(--rh-radius);
      background: #fff;
    }
    mat-progress-bar {
      grid-column: 1 / -1;
    }
    .actions {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      justify-content: flex-end;
    }
    .lines p {
      margin: 2px 0;
    }
    .main {
      font-weight: 600;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanProgress {
  /** 0..1: the search's share closed when it reports one, otherwise the planner's own estimate. */
  readonly progress = input(0);
  readonly position = input<number | null>(null);
  readonly search = input<PlanSearchProgress | null>(null);
  readonly people = input(0);
  readonly k = input(0);
  readonly cancelled = output<void>();
  /** Stop the search and keep its best plan (the job then ends with that plan). */
  readonly stopped = output<void>();

  protected readonly percent = computed(() => Math.round(Math.min(1, Math.max(0, this.progress())) * 1000) / 10);
  protected readonly stageWords = computed(() => STAGES[this.search()?.stage ?? ''] ?? 'Computing');
  protected readonly bestAverage = computed(() => {
    const best = this.search()?.bestTotal;
    const rest = this.people() - this.k();
    return best !== null && best !== undefined && rest > 0 ? best / rest : null;
  });
}
