/**
 * Agreement of a rehearsal with the analysis (engine.md section 4): the analytic expected hops
 * should lie inside the simulated 99% interval for about 99% of people, and the simulated room
 * average within 3 standard errors of the analytic one.
 *
 * How many people may fall outside by chance: with m people each outside with probability 0.01,
 * the count is about Binomial(m, 0.01); we allow its mean plus 3 standard deviations, plus one
 * (a common-practice tolerance, so that a room of ten people is not judged on a single miss).
 */
import { Z99 } from '../../shared/engine/index';
import type { AgreementVerdict } from '../../shared/api/plans';
import { itemAt } from '../../shared/checked';

export interface VerdictInput {
  mean: ArrayLike<number>;
  stderr: ArrayLike<number>;
  walked: ArrayLike<number>;
  analytic: ArrayLike<number | null>;
  average: number;
  averageStderr: number;
  analyticAverage: number;
  runs: number;
  capped: number;
}

export function allowedOutside(m: number): number {
  return Math.floor(0.01 * m + 3 * Math.sqrt(0.01 * 0.99 * m)) + 1;
}

export function verdictOf(v: VerdictInput): AgreementVerdict & { inside: Uint8Array } {
  const inside = new Uint8Array(v.mean.length);
  let checked = 0;
  let ok = 0;
  for (let i = 0; i < v.mean.length; i++) {
    const a = v.analytic[i];
    if (!v.walked[i] || typeof a !== 'number' || !Number.isFinite(a)) continue;
    checked++;
    const half = Z99 * itemAt(v.stderr, i, 'rehearsal stderr');
    if (Math.abs(a - itemAt(v.mean, i, 'rehearsal mean')) <= half + 1e-12 * Math.max(1, Math.abs(a))) {
      ok++;
      inside[i] = 1;
    }
  }
  const share = checked > 0 ? ok / checked : 1;
  const diff = v.average - v.analyticAverage;
  const within = Math.abs(diff) <= 3 * v.averageStderr + 1e-12 * Math.max(1, Math.abs(v.analyticAverage));
  const outside = checked - ok;
  const agrees = outside <= allowedOutside(checked) && within;
  const pct = (x: number) => `${(x * 100).toFixed(1)}%`;
  const people = `${ok} of ${checked} people (${pct(share)}) have their analytic expected hops inside the simulated 99% interval`;
  const avg = `the simulated room average ${v.average.toFixed(3)} is ${within ? 'within' : 'more than'} 3 standard errors (${(3 * v.averageStderr).toFixed(3)}) of the analytic ${v.analyticAverage.toFixed(3)}`;
  let line: string;
  if (agrees) line = `Agrees with the analysis: ${people}, and ${avg}.`;
  else {
    const why: string[] = [];
    if (v.capped > 0) why.push(`${v.capped} walks reached the hop cap, so some simulated means are too low`);
    if (v.runs < 1000) why.push(`with only ${v.runs} cascades the intervals rest on a rough normal approximation: run more cascades`);
    if (why.length === 0)
      why.push('more people fall outside than chance explains; check that the room was not changed and run again with another seed');
    line = `Does not agree with the analysis: ${people}, and ${avg}. Likely reason: ${why.join('; ')}.`;
  }
  return {
    shareInInterval99: share,
    peopleChecked: checked,
    averageWithin3se: within,
    averageDifference: diff,
    averageStderr: v.averageStderr,
    agrees,
    line,
    inside,
  };
}
