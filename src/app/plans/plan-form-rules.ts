import { FormControl, FormGroup, type AbstractControl, type ValidationErrors, type ValidatorFn } from '@angular/forms';
import {
  budgetProblem,
  budgetRange,
  NO_SHOW_LIMITS,
  noShowProblem,
  timeLimitProblem,
  planRequestProblems,
  startersProblem,
  type PlanField,
} from '../../../shared/api/plan-rules';
import { PLAN_LIMITS, type PlanKind, type PlanMethodChoice } from '../../../shared/api/plans';
import { METHOD_LABELS } from './method-label';
/** The plan form's two modes are the two kinds of plan it makes. */
export type PlanMode = PlanKind;

/** The methods offered, each explained in one plain line. */
export const METHOD_CHOICES: readonly { value: PlanMethodChoice; label: string; line: string }[] = [
  {
    value: 'auto',
    label: METHOD_LABELS.auto,
    line: 'Ripplehall picks: a full search for small rooms, otherwise widened greedy with swap polish; the page says what was proven.',
  },
  {
    value: 'greedy',
    label: METHOD_LABELS.greedy,
    line: 'Adds one starter at a time, each time the person who shortens the wait most. Fast.',
  },
  {
    value: 'widened',
    label: METHOD_LABELS.widened,
    line: 'Tries many strong small groups as a beginning and grows each one; never worse than greedy.',
  },
  { value: 'swap', label: METHOD_LABELS.swap, line: 'Starts from greedy, then swaps a starter for someone else while that still helps.' },
  {
    value: 'exhaustive',
    label: METHOD_LABELS.exhaustive,
    line: 'Searches every possible group, skipping the ones that provably cannot win; within the time limit it proves the best, or says how close it got.',
  },
];

export type PlanForm = FormGroup<{
  mode: FormControl<PlanMode>;
  k: FormControl<number | null>;
  method: FormControl<PlanMethodChoice>;
  /** No-show chance in percent (0..50); null or 0: every starter shows up. */
  noShowPercent: FormControl<number | null>;
  /** Search time limit in seconds (exhaustive and automatic); null: the default. */
  timeLimitSeconds: FormControl<number | null>;
  mustBrief: FormControl<number[]>;
  cannotBrief: FormControl<number[]>;
  starters: FormControl<number[]>;
}>;

/** Largest budget for a room of n people: everyone but one (briefing everyone needs no plan). */
export function maxBudget(roomSize: number): number {
  return budgetRange(roomSize).max;
}

/** k by the shared rule (shared/api/plan-rules.ts); the error carries the rule's own message. */
export function budgetValidator(roomSize: () => number): ValidatorFn {
  return (c: AbstractControl): ValidationErrors | null => {
    const p = budgetProblem(c.value, roomSize());
    return p ? { budget: p.message } : null;
  };
}

export function timeLimitValidator(c: AbstractControl): ValidationErrors | null {
  const p = timeLimitProblem(c.value === '' ? null : c.value);
  return p ? { timeLimit: p.message } : null;
}

export function noShowValidator(c: AbstractControl): ValidationErrors | null {
  const v = c.value;
  if (v === null || v === '') return null;
  const p = noShowProblem(typeof v === 'number' ? v / 100 : v);
  return p ? { noShow: p.message } : null;
}

/**
 * Checks of the whole form by the shared rules: the must-brief list fits the budget, nobody is in
 * both lists, enough people remain; a hand-made plan has 1 to n - 1 starters. The errors map each
 * field to its message (the budget's own problem stays on the budget control).
 */
export function planConstraintsValidator(roomSize: () => number, nameOf: (id: number) => string = (id) => `#${id}`): ValidatorFn {
  return (g: AbstractControl): ValidationErrors | null => {
    const f = (g as PlanForm).getRawValue();
    const errors: Partial<Record<PlanField, string>> = {};
    if (f.mode === 'hand-made') {
      const p = startersProblem(f.starters.length, roomSize());
      if (p) errors.starters = p.message;
    } else {
      for (const p of planRequestProblems({ k: f.k, mustBrief: f.mustBrief, cannotBrief: f.cannotBrief }, roomSize(), nameOf)) {
        if (p.field !== 'k' && !errors[p.field]) errors[p.field] = p.message;
      }
    }
    return Object.keys(errors).length ? { fields: errors } : null;
  };
}

/** The budget field's message (null when valid). */
export function budgetMessage(errors: ValidationErrors | null): string | null {
  return (errors?.['budget'] as string | undefined) ?? null;
}

/** The form-level message of each field. */
export function constraintMessages(errors: ValidationErrors | null): { must?: string; cannot?: string; starters?: string } {
  const f = (errors?.['fields'] ?? {}) as Partial<Record<PlanField, string>>;
  return {
    ...(f.mustBrief ? { must: f.mustBrief } : {}),
    ...(f.cannotBrief ? { cannot: f.cannotBrief } : {}),
    ...(f.starters ? { starters: f.starters } : {}),
  };
}

/** `nameOf` names people in messages (the conflict message lists them). */
export function createPlanForm(roomSize: () => number, nameOf?: (id: number) => string): PlanForm {
  const form: PlanForm = new FormGroup(
    {
      mode: new FormControl<PlanMode>('computed', { nonNullable: true }),
      k: new FormControl<number | null>(4, { validators: [budgetValidator(roomSize)] }),
      method: new FormControl<PlanMethodChoice>('auto', { nonNullable: true }),
      noShowPercent: new FormControl<number | null>(0, { validators: [noShowValidator] }),
      timeLimitSeconds: new FormControl<number | null>(PLAN_LIMITS.timeLimitSeconds.default, { validators: [timeLimitValidator] }),
      mustBrief: new FormControl<number[]>([], { nonNullable: true }),
      cannotBrief: new FormControl<number[]>([], { nonNullable: true }),
      starters: new FormControl<number[]>([], { nonNullable: true }),
    },
    { validators: [planConstraintsValidator(roomSize, nameOf)] },
  );
  return form;
}

export const NO_SHOW_PERCENT_MAX = NO_SHOW_LIMITS.max * 100;

/** In hand-made mode the budget and the no-show field are not used (k is the number of starters picked). */
export function applyMode(form: PlanForm): void {
  const hand = form.controls.mode.value === 'hand-made';
  for (const c of [form.controls.k, form.controls.noShowPercent, form.controls.timeLimitSeconds]) {
    if (hand) c.disable({ emitEvent: false });
    else c.enable({ emitEvent: false });
  }
  form.updateValueAndValidity();
}
