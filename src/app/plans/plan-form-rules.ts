import { FormControl, FormGroup, type AbstractControl, type ValidationErrors, type ValidatorFn } from '@angular/forms';

export type PlanMethodChoice = 'auto' | 'greedy' | 'widened' | 'swap' | 'exhaustive';
export type PlanMode = 'computed' | 'hand';

/** The methods offered, each explained in one plain line. */
export const METHOD_CHOICES: readonly { value: PlanMethodChoice; label: string; line: string }[] = [
  {
    value: 'auto',
    label: 'Automatic',
    line: 'Ripplehall picks: the proven best for small rooms, otherwise widened greedy with swap polish.',
  },
  { value: 'greedy', label: 'Greedy', line: 'Adds one starter at a time, each time the person who shortens the wait most. Fast.' },
  {
    value: 'widened',
    label: 'Widened greedy',
    line: 'Tries many strong small groups as a beginning and grows each one; never worse than greedy.',
  },
  { value: 'swap', label: 'Swap polish', line: 'Starts from greedy, then swaps a starter for someone else while that still helps.' },
  {
    value: 'exhaustive',
    label: 'Exhaustive',
    line: 'Checks every possible group with smart pruning and proves the best; small rooms only.',
  },
];

export type PlanForm = FormGroup<{
  mode: FormControl<PlanMode>;
  k: FormControl<number | null>;
  method: FormControl<PlanMethodChoice>;
  mustBrief: FormControl<number[]>;
  cannotBrief: FormControl<number[]>;
  starters: FormControl<number[]>;
}>;

/** Largest budget for a room of n people: everyone but one (briefing everyone needs no plan). */
export function maxBudget(roomSize: number): number {
  return Math.max(1, roomSize - 1);
}

/** k must be a whole number from 1 to n - 1. */
export function budgetValidator(roomSize: () => number): ValidatorFn {
  return (c: AbstractControl): ValidationErrors | null => {
    const v = c.value;
    if (v === null || v === undefined || v === '') return { required: true };
    if (typeof v !== 'number' || !Number.isFinite(v)) return { required: true };
    if (!Number.isInteger(v)) return { integer: true };
    if (v < 1) return { min: { min: 1, actual: v } };
    const max = maxBudget(roomSize());
    if (roomSize() < 2) return { roomTooSmall: { size: roomSize() } };
    if (v > max) return { max: { max, actual: v } };
    return null;
  };
}

/**
 * Checks that belong to the whole form: must-brief people fit in the budget, nobody is in both lists,
 * enough people remain to choose from, and a hand-made plan has starters within the room's bounds.
 */
export function planConstraintsValidator(roomSize: () => number): ValidatorFn {
  return (g: AbstractControl): ValidationErrors | null => {
    const f = (g as PlanForm).getRawValue();
    const errors: ValidationErrors = {};
    if (f.mode === 'hand') {
      if (f.starters.length === 0) errors['noStarters'] = true;
      else if (f.starters.length > maxBudget(roomSize()))
        errors['tooManyStarters'] = { max: maxBudget(roomSize()), actual: f.starters.length };
      return Object.keys(errors).length ? errors : null;
    }
    const k = typeof f.k === 'number' && Number.isInteger(f.k) ? f.k : null;
    if (k !== null && f.mustBrief.length > k) errors['mustBriefOverBudget'] = { count: f.mustBrief.length, k };
    const cannot = new Set(f.cannotBrief);
    const both = f.mustBrief.filter((id) => cannot.has(id));
    if (both.length) errors['conflict'] = { ids: both };
    const available = roomSize() - cannot.size;
    if (k !== null && available < k) errors['tooFewCandidates'] = { available, k };
    return Object.keys(errors).length ? errors : null;
  };
}

/** One message per error, for the mat-error of each field. */
export function budgetMessage(errors: ValidationErrors | null, roomSize: number): string | null {
  if (!errors) return null;
  if (errors['required']) return 'Enter how many people you can brief first.';
  if (errors['integer']) return 'The budget is a whole number of people.';
  if (errors['min']) return 'Brief at least 1 person.';
  if (errors['roomTooSmall']) return 'This room needs at least 2 people before you can plan.';
  if (errors['max']) return `At most ${maxBudget(roomSize)} in a room of ${roomSize}: briefing everyone needs no plan.`;
  return null;
}

export function constraintMessages(
  errors: ValidationErrors | null,
  nameOf: (id: number) => string,
): { must?: string; cannot?: string; starters?: string } {
  if (!errors) return {};
  const out: { must?: string; cannot?: string; starters?: string } = {};
  if (errors['mustBriefOverBudget']) {
    const { count, k } = errors['mustBriefOverBudget'];
    out.must = `${count} people must be briefed but the budget is ${k}: raise the budget or remove someone.`;
  }
  if (errors['conflict']) {
    const names = (errors['conflict'].ids as number[]).map(nameOf).join(', ');
    out.cannot = `${names} cannot be in both lists: remove them from one.`;
  }
  if (!out.cannot && errors['tooFewCandidates']) {
    const { available, k } = errors['tooFewCandidates'];
    out.cannot = `Only ${available} people can be briefed, fewer than the budget of ${k}.`;
  }
  if (errors['noStarters']) out.starters = 'Pick at least one starter.';
  if (errors['tooManyStarters'])
    out.starters = `Pick at most ${errors['tooManyStarters'].max} starters: leave someone to hear it by word of mouth.`;
  return out;
}

export function createPlanForm(roomSize: () => number): PlanForm {
  const form: PlanForm = new FormGroup(
    {
      mode: new FormControl<PlanMode>('computed', { nonNullable: true }),
      k: new FormControl<number | null>(4, { validators: [budgetValidator(roomSize)] }),
      method: new FormControl<PlanMethodChoice>('auto', { nonNullable: true }),
      mustBrief: new FormControl<number[]>([], { nonNullable: true }),
      cannotBrief: new FormControl<number[]>([], { nonNullable: true }),
      starters: new FormControl<number[]>([], { nonNullable: true }),
    },
    { validators: [planConstraintsValidator(roomSize)] },
  );
  return form;
}

/** In hand-made mode the budget field is not used (k is the number of starters picked). */
export function applyMode(form: PlanForm): void {
  if (form.controls.mode.value === 'hand') form.controls.k.disable({ emitEvent: false });
  else form.controls.k.enable({ emitEvent: false });
  form.updateValueAndValidity();
}
