import type { RehearsalDetail, RehearsalPersonDto } from '../../../shared/api/plans';
import { rerunMatch } from './rerun-match';

function person(id: number, mean: number): RehearsalPersonDto {
  return {
    personId: id,
    name: `P${id}`,
    group: null,
    starter: false,
    walked: true,
    mean,
    sd: 1,
    stderr: 0.1,
    low95: mean - 0.2,
    high95: mean + 0.2,
    low99: mean - 0.3,
    high99: mean + 0.3,
    analytic: mean,
    capped: 0,
    inInterval99: true,
  };
}

function rehearsal(id: number, means: number[], extra: Partial<RehearsalDetail> = {}): RehearsalDetail {
  return {
    id,
    seed: 's1',
    runs: 5000,
    average: means.reduce((a, b) => a + b, 0) / means.length,
    capped: 0,
    people: means.map((m, i) => person(i + 1, m)),
    ...extra,
  } as RehearsalDetail;
}

describe('rerunMatch', () => {
  it('calls a re-run identical only when every number is the same', () => {
    const m = rerunMatch(rehearsal(1, [3, 4.25]), rehearsal(2, [3, 4.25], { rerunOf: 1 }));
    expect(m.identical).toBeTrue();
    expect(m.line).toContain('Identical to rehearsal #1');
  });

  it('reports a re-run that differs in one person, however slightly', () => {
    const m = rerunMatch(rehearsal(1, [3, 4.25]), rehearsal(2, [3, 4.25 + 1e-12]));
    expect(m.identical).toBeFalse();
    expect(m.differing).toBe(1);
    expect(m.line).toContain('1 of 2 people changed');
  });
});
