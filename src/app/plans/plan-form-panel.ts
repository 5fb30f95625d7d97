import { ChangeDetectionStrategy, Component, computed, effect, input, output, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSliderModule } from '@angular/material/slider';
import { map, merge } from 'rxjs';
import { PLAN_LIMITS, type CreatePlanRequest } from '../../../shared/api/plans';
import type { PersonDto } from '../../../shared/api/rooms';
import { PersonChips } from './person-chips';
import { applyMode, budgetMessage, constraintMessages, createPlanForm, maxBudget, METHOD_CHOICES } from './plan-form-rules';

/** The plan request: budget, method and constraints, or the facilitator's own starters. */
@Component({
  selector: 'app-plan-form-panel',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSliderModule,
    PersonChips,
  ],
  templateUrl: './plan-form-panel.html',
  styleUrl: './plan-form-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanFormPanel {
  readonly people = input<readonly PersonDto[]>([]);
  readonly pending = input(false);
  /** A message from the server about the last request (shown under the button). */
  readonly serverError = input<string | null>(null);
  readonly submitted = output<CreatePlanRequest>();

  protected readonly methods = METHOD_CHOICES;
  protected readonly exhaustiveMax = PLAN_LIMITS.exhaustiveMaxPeople;
  protected readonly size = computed(() => this.people().length);
  protected readonly maxK = computed(() => maxBudget(this.size()));
  protected readonly form = createPlanForm(() => this.size());
  private readonly changes = toSignal(merge(this.form.valueChanges, this.form.statusChanges).pipe(map(() => ({}))), { initialValue: {} });

  protected readonly mode = computed(() => (this.changes(), this.form.controls.mode.value));
  protected readonly methodLine = computed(() => {
    this.changes();
    return METHOD_CHOICES.find((m) => m.value === this.form.controls.method.value)?.line ?? '';
  });
  protected readonly exhaustiveTooBig = computed(() => this.size() > PLAN_LIMITS.exhaustiveMaxPeople);
  protected readonly kError = computed(() => (this.changes(), budgetMessage(this.form.controls.k.errors, this.size())));
  protected readonly constraint = computed(() => {
    this.changes();
    const names = new Map(this.people().map((p) => [p.id, p.name]));
    const messages = constraintMessages(this.form.errors, (id) => names.get(id) ?? `#${id}`);
    // "Pick at least one starter" waits until the facilitator has tried: an empty new form is not a mistake.
    if (!this.tried() && !this.form.controls.starters.touched) delete messages.starters;
    return messages;
  });
  private readonly tried = signal(false);

  constructor() {
    // The room arrives after the form is built: re-check the bounds, and keep the default budget inside them.
    effect(() => {
      const max = this.maxK();
      untracked(() => {
        const k = this.form.controls.k;
        if (typeof k.value === 'number' && k.value > max && !k.dirty) k.setValue(max);
        this.form.updateValueAndValidity();
      });
    });
  }

  protected setMode(mode: 'computed' | 'hand'): void {
    this.form.controls.mode.setValue(mode);
    applyMode(this.form);
  }

  protected submit(): void {
    this.tried.set(true);
    this.form.markAllAsTouched();
    this.form.updateValueAndValidity();
    if (this.form.invalid) return;
    const f = this.form.getRawValue();
    if (f.mode === 'hand') {
      this.submitted.emit({ starters: f.starters });
    } else {
      this.submitted.emit({ k: f.k!, method: f.method, mustBrief: f.mustBrief, cannotBrief: f.cannotBrief });
    }
  }

  /** Lets the page pre-fill the form (e.g. "plan the same again with greedy"). */
  prefill(request: CreatePlanRequest): void {
    if (request.starters) {
      this.form.patchValue({ mode: 'hand', starters: request.starters });
    } else {
      this.form.patchValue({
        mode: 'computed',
        k: request.k ?? 4,
        method: request.method ?? 'auto',
        mustBrief: request.mustBrief ?? [],
        cannotBrief: request.cannotBrief ?? [],
      });
    }
    applyMode(this.form);
  }
}
