import type { PlanExtrasDto, PlanSummary } from '../../../shared/api/plans';
import { currentWarnings, methodLine } from './score-words';

/** Only the fields the two sentences read; the rest of a plan does not matter to them. */
function stoppedPlan(certified: boolean): PlanSummary {
  const extras = { nodes: 59666, searchLeft: 0.9, stopped: false } as PlanExtrasDto;
  return {
    certified,
    methodRequested: 'auto',
    elapsedMs: 1000,
    extras,
    warnings: [
      'Time limit reached after 59666 search steps with 90 % of the search space still open: the best plan found is returned with its proven gap.',
      'Two people cannot hear at all.',
    ],
  } as unknown as PlanSummary;
}

describe('score words for a plan whose own search stopped', () => {
  it('keeps the time-limit warning while the plan is not proven best', () => {
    const p = stoppedPlan(false);
    expect(currentWarnings(p)).toEqual(p.warnings);
    expect(methodLine(p)).toContain('time limit reached with 90.0 % of the possible groups not yet ruled out');
  });

  it('says the stop is history once a later search proved the plan best, and keeps other warnings', () => {
    const p = stoppedPlan(true);
    const shown = currentWarnings(p);
    expect(shown.some((w) => w.startsWith('Time limit reached'))).toBeFalse();
    expect(shown).toContain('Two people cannot hear at all.');
    expect(shown.some((w) => w.includes('has since proven it best'))).toBeTrue();
    expect(methodLine(p)).toContain('a later search proved it best');
    expect(methodLine(p)).not.toContain('not yet ruled out');
  });
});
