import type { PlanExtrasDto, PlanSummary, PlanWarning } from '../../../shared/api/plans';
import { currentWarnings, CUT_SHORT_SINCE_PROVEN, methodLine } from './score-words';

const SEARCH_TIME_LIMIT: PlanWarning = {
  code: 'search-time-limit',
  text: 'Time limit reached after 59666 search steps with 90 % of the search space still open: the best plan found is returned with its proven gap.',
};
const OTHER: PlanWarning = {
  code: 'over-dense-limit',
  text: 'The room has 900 people, above the dense limit of 800: exact greedy was used instead of swap.',
};

/** Only the fields the two sentences read; the rest of a plan does not matter to them. */
function stoppedPlan(certified: boolean, warnings: PlanWarning[] = [SEARCH_TIME_LIMIT, OTHER]): PlanSummary {
  const extras = { nodes: 59666, searchLeft: 0.9, stopped: false } as PlanExtrasDto;
  return { certified, methodRequested: 'auto', elapsedMs: 1000, extras, warnings } as unknown as PlanSummary;
}

describe('score words for a plan whose own search stopped', () => {
  it('keeps the time-limit warning while the plan is not proven best', () => {
    const p = stoppedPlan(false);
    expect(currentWarnings(p)).toEqual([SEARCH_TIME_LIMIT.text, OTHER.text]);
    expect(methodLine(p)).toContain('time limit reached with 90.0 % of the possible groups not yet ruled out');
  });

  it('says the stop is history once a later search proved the plan best, and keeps other warnings', () => {
    const p = stoppedPlan(true);
    expect(currentWarnings(p)).toEqual([OTHER.text, CUT_SHORT_SINCE_PROVEN]);
    expect(CUT_SHORT_SINCE_PROVEN).toContain('has since been proven best');
    expect(methodLine(p)).toContain('a later search proved it best');
    expect(methodLine(p)).not.toContain('not yet ruled out');
  });

  it('treats a widened plan whose time limit cut its seeds short the same once a later search proved it best', () => {
    const widening: PlanWarning[] = [
      { code: 'widening-time-limit', text: 'Time limit reached after 3 of 10 seeds.' },
      { code: 'widening-time-limit', text: 'Time limit reached while widening.' },
      { code: 'swap-time-limit', text: 'Swap polish stopped at the time limit after 2 passes.' },
    ];
    expect(currentWarnings(stoppedPlan(false, widening))).toEqual(widening.map((w) => w.text));
    expect(currentWarnings(stoppedPlan(true, widening))).toEqual([CUT_SHORT_SINCE_PROVEN]);
  });

  it('goes by the code, not the words: a note that reads like a time limit stays', () => {
    const note: PlanWarning = { code: 'note', text: 'Time limit reached after 5 search steps with 1 % still open.' };
    expect(currentWarnings(stoppedPlan(true, [note]))).toEqual([note.text]);
    const reworded: PlanWarning = { code: 'search-stopped', text: 'Stopped on request.' };
    expect(currentWarnings(stoppedPlan(true, [reworded]))).toEqual([CUT_SHORT_SINCE_PROVEN]);
  });
});
