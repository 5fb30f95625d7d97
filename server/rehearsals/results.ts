/** What a finished rehearsal stores (engine order): per-person figures, reach curves, sample cascades. */
import type { SimulationSummary } from '../../shared/engine/index';

/** Longest path stored per walk of a sample cascade. */
export const SAMPLE_PATH_CAP = 500;

/** What is stored per rehearsal (engine order), written in one go when the job is done. */
export interface StoredRehearsalResults {
  mean: number[];
  sd: number[];
  stderr: number[];
  low95: number[];
  high95: number[];
  capped: number[];
  walked: number[];
  analytic: (number | null)[];
  inside99: number[];
  reachSimulated: number[];
  reachAnalytic: number[];
}

export function storedResults(
  s: SimulationSummary,
  analytic: (number | null)[],
  analyticCurve: number[],
  inside: Uint8Array,
): StoredRehearsalResults {
  return {
    mean: Array.from(s.mean),
    sd: Array.from(s.variance, (v) => Math.sqrt(v)),
    stderr: Array.from(s.stderr),
    low95: Array.from(s.low95),
    high95: Array.from(s.high95),
    capped: Array.from(s.cappedByPerson),
    walked: Array.from(s.walked),
    analytic,
    inside99: Array.from(inside),
    reachSimulated: s.reachCurve,
    reachAnalytic: analyticCurve,
  };
}

export function storedSamples(s: SimulationSummary) {
  return s.samples.map((c) => ({
    run: c.run,
    people: Array.from(c.people),
    hops: Array.from(c.hops),
    capped: Array.from(c.capped),
    truncated: Array.from(c.truncated),
    pathStart: Array.from(c.pathStart),
    path: Array.from(c.path),
  }));
}
export type StoredSample = ReturnType<typeof storedSamples>[number];
