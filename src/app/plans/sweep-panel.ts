import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { finalize } from 'rxjs';
import { PLAN_LIMITS, type KSweepResult } from '../../../shared/api/plans';
import { toApiError } from '../core/api-error';
import { PlansApi } from './plans-api';
import { SweepChart } from './sweep-chart';

/** Room average by budget for greedy, widened greedy, swap polish and two baselines. */
@Component({
  selector: 'app-sweep-panel',
  imports: [DecimalPipe, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, SweepChart],
  template: `
    <form class="row" (submit)="$event.preventDefault(); run()" novalidate>
      <mat-form-field appearance="outline" class="k">
        <mat-label>Budgets up to</mat-label>
        <input matInput type="number" [formControl]="maxK" min="1" [max]="limit()" />
        @if (maxK.invalid) {
          <mat-error>Choose a whole number from 1 to {{ limit() }}.</mat-error>
        }
      </mat-form-field>
      <button mat-stroked-button type="submit" [disabled]="pending()"><mat-icon>stacked_line_chart</mat-icon>Compare methods</button>
      <span class="rh-muted">Lower is better. The baselines show what simple rules of thumb would give.</span>
    </form>
    @if (error()) {
      <p class="error" role="alert">{{ error() }}</p>
    }
    @if (result(); as r) {
      <app-sweep-chart [points]="r.points" />
      <p class="rh-muted small">
        Most ties: the k people with the most tie strength. Random: the mean of 20 random draws (seed "{{ r.seed }}"). Computed in
        {{ r.elapsedMs | number: '1.0-0' }} ms on room version {{ r.roomVersion }}.
        @for (n of r.notes; track $index) {
          {{ n }}
        }
      </p>
    }
  `,
  styles: `
    .row {
      display: flex;
      align-items: baseline;
      gap: 12px;
      flex-wrap: wrap;
    }
    .k {
      width: 160px;
    }
    .small {
      font-size: 0.85rem;
    }
    .error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SweepPanel {
  private readonly api = inject(PlansApi);
  readonly roomId = input.required<number>();
  readonly roomSize = input(2);
  protected readonly limit = computed(() => Math.max(1, Math.min(this.roomSize() - 1, PLAN_LIMITS.sweepMaxK)));
  protected readonly maxK = new FormControl<number | null>(8, [
    Validators.required,
    Validators.min(1),
    Validators.pattern(/^\d+$/),
    (c) => (c.value > this.limit() ? { max: true } : null),
  ]);
  protected readonly result = signal<KSweepResult | null>(null);
  protected readonly pending = signal(false);
  protected readonly error = signal<string | null>(null);

  protected run(): void {
    this.maxK.markAsTouched();
    this.maxK.updateValueAndValidity();
    if (this.maxK.invalid) return;
    this.pending.set(true);
    this.error.set(null);
    this.api
      .sweep(this.roomId(), this.maxK.value!)
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: (r) => this.result.set(r),
        error: (e: unknown) => this.error.set(toApiError(e).message),
      });
  }
}
