import { budgetProblem, planRequestProblems } from '../../../shared/api/plan-rules';
import { applyMode, budgetMessage, constraintMessages, createPlanForm } from './plan-form-rules';

describe('plan form rules', () => {
  const size = 60;
  const names: Record<number, string> = { 1: 'Ada', 2: 'Bo', 3: 'Cleo' };
  const make = () =>
    createPlanForm(
      () => size,
      (id) => names[id] ?? `#${id}`,
    );

  it('accepts budgets from 1 to n - 1 only, with the same words the server uses', () => {
    const form = make();
    const k = form.controls.k;
    for (const v of [1, 4, 59]) {
      k.setValue(v);
      expect(k.valid).withContext(`k = ${v}`).toBeTrue();
    }
    const cases: [unknown, string][] = [
      [0, 'Brief at least 1 person: the budget is 1 to 59.'],
      [-3, 'Brief at least 1 person: the budget is 1 to 59.'],
      [60, 'At most 59 in a room of 60: briefing everyone needs no plan. Choose 1 to 59.'],
      [61, 'At most 59 in a room of 60: briefing everyone needs no plan. Choose 1 to 59.'],
      [2.5, 'The budget is a whole number of people: 1 to 59.'],
      [null, 'Enter how many people you can brief first.'],
    ];
    for (const [v, message] of cases) {
      k.setValue(v as number | null);
      expect(budgetMessage(k.errors)).withContext(String(v)).toBe(message);
      expect(budgetProblem(v, size)?.message).withContext(`server, ${v}`).toBe(message);
    }
  });

  it('a budget out of range is a budget problem only, never a constraint problem', () => {
    const form = make();
    form.controls.k.setValue(61);
    form.controls.mustBrief.setValue([1, 2, 3]);
    expect(constraintMessages(form.errors)).toEqual({});
    form.controls.k.setValue(-3);
    expect(constraintMessages(form.errors)).toEqual({});
    expect(planRequestProblems({ k: 61, mustBrief: [], cannotBrief: [] }, size, String).map((p) => p.field)).toEqual(['k']);
  });

  it('rejects more must-brief people than the budget, and the message clears once fixed', () => {
    const form = make();
    form.controls.k.setValue(2);
    form.controls.mustBrief.setValue([1, 2, 3]);
    expect(constraintMessages(form.errors).must).toBe(
      '3 people must be briefed but the budget is 2: raise the budget to 3 or remove someone.',
    );
    form.controls.k.setValue(3);
    expect(constraintMessages(form.errors)).toEqual({});
    expect(form.valid).toBeTrue();
  });

  it('rejects a person who must and cannot be briefed', () => {
    const form = make();
    form.controls.mustBrief.setValue([1, 2]);
    form.controls.cannotBrief.setValue([2, 3]);
    expect(constraintMessages(form.errors).cannot).toBe('Bo cannot be in both lists: remove them from one.');
  });

  it('rejects a budget larger than the people left to choose from, under "cannot be briefed"', () => {
    const form = createPlanForm(() => 24);
    form.controls.k.setValue(20);
    form.controls.cannotBrief.setValue([1, 2, 3, 4, 5]);
    expect(constraintMessages(form.errors).cannot).toBe(
      'Only 19 of 24 people may be briefed, fewer than the budget of 20: allow more people or lower the budget.',
    );
  });

  it('bounds the no-show chance to 0-50 %', () => {
    const form = make();
    const ns = form.controls.noShowPercent;
    for (const v of [0, 10, 50, null]) {
      ns.setValue(v);
      expect(ns.valid).withContext(String(v)).toBeTrue();
    }
    ns.setValue(51);
    expect(ns.errors?.['noShow']).toBe('The no-show chance is 0 to 50 %.');
    ns.setValue(-1);
    expect(ns.invalid).toBeTrue();
  });

  it('checks the starters of a hand-made plan instead of the budget', () => {
    const form = make();
    form.controls.mode.setValue('hand-made');
    form.controls.k.setValue(0);
    applyMode(form);
    expect(constraintMessages(form.errors).starters).toBe('Pick at least one starter.');
    form.controls.starters.setValue([1, 2]);
    expect(form.valid).toBeTrue();
    form.controls.starters.setValue(Array.from({ length: 60 }, (_, i) => i));
    expect(constraintMessages(form.errors).starters).toContain('at most 59 starters');
  });
});
