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
import { MatTooltipModule } from '@angular/material/tooltip';
import { map, merge } from 'rxjs';
import { PLAN_LIMITS, type CreatePlanRequest } from '../../../shared/api/plans';
import type { PersonDto } from '../../../shared/api/rooms';
import { PersonChips } from './person-chips';
import { ShowWhenChanged } from './show-when-changed';
import {
  applyMode,
  budgetMessage,
  constraintMessages,
  createPlanForm,
  maxBudget,
  METHOD_CHOICES,
  NO_SHOW_PERCENT_MAX,
  type PlanMode,
} from './plan-form-rules';

/** A problem the server reported for the last request, and the field it belongs to. */
export interface ServerProblem {
  message: string;
  field: string | null;
}

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
    MatTooltipModule,
    PersonChips,
  ],
  templateUrl: './plan-form-panel.html',
  styleUrl: './plan-form-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanFormPanel {
  readonly people = input<readonly PersonDto[]>([]);
  readonly pending = input(false);
  /** What the server said about the last request; shown under its field until the form changes. */
  readonly serverProblem = input<ServerProblem | null>(null);
  readonly submitted = output<CreatePlanRequest>();

  protected readonly methods = METHOD_CHOICES;
  protected readonly exhaustiveMax = PLAN_LIMITS.exhaustiveMaxPeople;
  protected readonly noShowMax = NO_SHOW_PERCENT_MAX;
  protected readonly matcher = new ShowWhenChanged();
  protected readonly size = computed(() => this.people().length);
  protected readonly maxK = computed(() => maxBudget(this.size()));
  private readonly names = computed(() => new Map(this.people().map((p) => [p.id, p.name])));
  protected readonly form = createPlanForm(
    () => this.size(),
    (id) => this.names().get(id) ?? `#${id}`,
  );
  private readonly changes = toSignal(merge(this.form.valueChanges, this.form.statusChanges).pipe(map(() => ({}))), { initialValue: {} });

  protected readonly mode = computed(() => (this.changes(), this.form.controls.mode.value));
  protected readonly methodLine = computed(() => {
    this.changes();
    return METHOD_CHOICES.find((m) => m.value === this.form.controls.method.value)?.line ?? '';
  });
  protected readonly exhaustiveTooBig = computed(() => this.size() > PLAN_LIMITS.exhaustiveMaxPeople);
  protected readonly kError = computed(() => (this.changes(), budgetMessage(this.form.controls.k.errors)));
  protected readonly timeLimitError = computed(
    () => (this.changes(), (this.form.controls.timeLimitSeconds.errors?.['timeLimit'] as string) ?? null),
  );
  protected readonly searches = computed(() => (this.changes(), ['exhaustive', 'auto'].includes(this.form.controls.method.value)));
  protected readonly timeLimits = PLAN_LIMITS.timeLimitSeconds;
  protected readonly noShowError = computed(
    () => (this.changes(), (this.form.controls.noShowPercent.errors?.['noShow'] as string) ?? null),
  );
  /** The slider shows the box's value (clamped to its track while the box holds an out-of-range number). */
  protected readonly sliderValue = computed(() => {
    this.changes();
    const v = this.form.controls.k.value;
    return typeof v === 'number' && Number.isFinite(v) ? Math.min(this.maxK(), Math.max(1, Math.round(v))) : 1;
  });
  protected readonly invalid = computed(() => (this.changes(), this.form.invalid));
  protected readonly whyDisabled = computed(() => {
    this.changes();
    const f = this.form.getRawValue();
    return f.mode === 'hand-made' && f.starters.length === 0
      ? 'Pick at least one starter to continue.'
      : 'Correct the marked field to continue.';
  });
  /** The server's message until the facilitator changes something. */
  private readonly serverVisible = signal(false);
  protected readonly server = computed(() => (this.serverVisible() ? this.serverProblem() : null));
  protected readonly serverOn = (field: string) => (this.server()?.field === field ? this.server()!.message : null);
  protected readonly serverElsewhere = computed(() => {
    const s = this.server();
    return s && !['k', 'mustBrief', 'cannotBrief', 'starters', 'noShow'].includes(s.field ?? '') ? s.message : null;
  });
  protected readonly constraint = computed(() => {
    this.changes();
    const messages = constraintMessages(this.form.errors);
    // "Pick at least one starter" waits until the facilitator has touched the list: an empty new form is not a mistake.
    if (!this.form.controls.starters.touched && !this.form.controls.starters.dirty) delete messages.starters;
    return {
      must: messages.must ?? this.serverOn('mustBrief') ?? undefined,
      cannot: messages.cannot ?? this.serverOn('cannotBrief') ?? undefined,
      starters: messages.starters ?? this.serverOn('starters') ?? undefined,
    };
  });

  constructor() {
    // The room arrives after the form is built: re-check the bounds, and keep the default budget inside them.
    effect(() => {
      const max = this.maxK();
      this.names();
      untracked(() => {
        const k = this.form.controls.k;
        if (typeof k.value === 'number' && k.value > max && !k.dirty) k.setValue(max);
        this.form.updateValueAndValidity();
      });
    });
    effect(() => {
      this.serverVisible.set(this.serverProblem() !== null);
    });
    this.form.valueChanges.subscribe(() => this.serverVisible.set(false));
  }

  protected setMode(mode: PlanMode): void {
    this.form.controls.mode.setValue(mode);
    applyMode(this.form);
  }

  /** The slider and the box are one control: the slider writes the box's FormControl. */
  protected fromSlider(value: number): void {
    const k = this.form.controls.k;
    k.setValue(value);
    k.markAsDirty();
  }

  protected submit(): void {
    this.form.markAllAsTouched();
    this.form.updateValueAndValidity();
    if (this.form.invalid || this.pending()) return;
    const f = this.form.getRawValue();
    if (f.mode === 'hand-made') {
      this.submitted.emit({ starters: f.starters });
    } else {
      const noShow = f.noShowPercent ? f.noShowPercent / 100 : 0;
      const searching = f.method === 'exhaustive' || f.method === 'auto';
      const limit = searching && f.timeLimitSeconds !== null && f.timeLimitSeconds !== PLAN_LIMITS.timeLimitSeconds.default;
      this.submitted.emit({
        k: f.k!,
        method: f.method,
        mustBrief: f.mustBrief,
        cannotBrief: f.cannotBrief,
        ...(noShow > 0 ? { noShow } : {}),
        ...(limit ? { timeLimitSeconds: f.timeLimitSeconds! } : {}),
      });
    }
  }

  /** Lets the page pre-fill the form (e.g. "plan the same again with greedy"). */
  prefill(request: CreatePlanRequest): void {
    if (request.starters) {
      this.form.patchValue({ mode: 'hand-made', starters: request.starters });
    } else {
      this.form.patchValue({
        mode: 'computed',
        k: request.k ?? 4,
        method: request.method ?? 'auto',
        noShowPercent: request.noShow ? Math.round(request.noShow * 1000) / 10 : 0,
        mustBrief: request.mustBrief ?? [],
        cannotBrief: request.cannotBrief ?? [],
      });
    }
    applyMode(this.form);
  }
}
