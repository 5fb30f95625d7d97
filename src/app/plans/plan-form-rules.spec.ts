import { applyMode, budgetMessage, constraintMessages, createPlanForm } from './plan-form-rules';

describe('plan form rules', () => {
  const size = 24;
  const make = () => createPlanForm(() => size);
  const names: Record<number, string> = { 1: 'Ada', 2: 'Bo', 3: 'Cleo' };

  it('accepts budgets from 1 to n - 1 only', () => {
    const form = make();
    const k = form.controls.k;
    for (const v of [1, 4, 23]) {
      k.setValue(v);
      expect(k.valid).withContext(`k = ${v}`).toBeTrue();
    }
    k.setValue(0);
    expect(budgetMessage(k.errors, size)).toBe('Brief at least 1 person.');
    k.setValue(24);
    expect(budgetMessage(k.errors, size)).toBe('At most 23 in a room of 24: briefing everyone needs no plan.');
    k.setValue(2.5);
    expect(budgetMessage(k.errors, size)).toBe('The budget is a whole number of people.');
    k.setValue(null);
    expect(budgetMessage(k.errors, size)).toBe('Enter how many people you can brief first.');
  });

  it('rejects more must-brief people than the budget', () => {
    const form = make();
    form.controls.k.setValue(2);
    form.controls.mustBrief.setValue([1, 2, 3]);
    expect(form.hasError('mustBriefOverBudget')).toBeTrue();
    expect(constraintMessages(form.errors, (id) => names[id]).must).toBe(
      '3 people must be briefed but the budget is 2: raise the budget or remove someone.',
    );
    form.controls.k.setValue(3);
    expect(form.valid).toBeTrue();
  });

  it('rejects a person who must and cannot be briefed', () => {
    const form = make();
    form.controls.mustBrief.setValue([1, 2]);
    form.controls.cannotBrief.setValue([2, 3]);
    expect(form.hasError('conflict')).toBeTrue();
    expect(constraintMessages(form.errors, (id) => names[id]).cannot).toBe('Bo cannot be in both lists: remove them from one.');
  });

  it('rejects a budget larger than the people left to choose from', () => {
    const form = make();
    form.controls.k.setValue(20);
    form.controls.cannotBrief.setValue([1, 2, 3, 4, 5]);
    expect(form.hasError('tooFewCandidates')).toBeTrue();
    expect(constraintMessages(form.errors, (id) => names[id]).cannot).toBe('Only 19 people can be briefed, fewer than the budget of 20.');
  });

  it('checks the starters of a hand-made plan instead of the budget', () => {
    const form = make();
    form.controls.mode.setValue('hand');
    form.controls.k.setValue(0);
    applyMode(form);
    expect(form.hasError('noStarters')).toBeTrue();
    form.controls.starters.setValue([1, 2]);
    expect(form.valid).toBeTrue();
    form.controls.starters.setValue(Array.from({ length: 24 }, (_, i) => i));
    expect(constraintMessages(form.errors, (id) => names[id]).starters).toContain('at most 23 starters');
  });
});
