/**
 * Turns merged accumulators into the rehearsal's report: per person mean, variance, standard
 * error and 95% interval (normal approximation, mean +- 1.959964 se); the room total and average
 * with their standard errors (from the per-run totals, so correlations between walks of one run
 * are accounted for); the reach curve; capped walks; and the people who cannot be reached.
 */
import type { UnreachablePerson } from '../reachability';
import { runsOf, type SampleCascade, type SimPartial } from './partial';
import type { SimPlan } from './plan';

/** Two-sided 95% and 99% normal quantiles. */
export const Z95 = 1.959963984540054;
export const Z99 = 2.5758293035489004;

export interface SimulationSummary {
  readonly runs: number;
  readonly seed: string;
  readonly n: number;
  readonly starters: readonly number[];
  /** Per person; starters have 0; people who cannot be reached are 0 here and listed in `unreachable`. */
  readonly mean: Float64Array;
  readonly variance: Float64Array;
  readonly stderr: Float64Array;
  readonly low95: Float64Array;
  readonly high95: Float64Array;
  /** Capped walks per person. */
  readonly cappedByPerson: Float64Array;
  /** 1 for people who walked (not briefed and able to reach a starter). */
  readonly walked: Uint8Array;
  /** Sum of the mean hops over the people who walked. */
  readonly total: number;
  readonly totalStderr: number;
  /** total / number of people who walked. */
  readonly average: number;
  readonly averageStderr: number;
  readonly capped: number;
  readonly hopCap: number;
  readonly hops: number;
  /**
   * reachCurve[t]: share of the non-starters who have heard by hop t, averaged over runs (as the
   * analytic shareReached of reach-time.ts; people who cannot be reached never count as reached).
   */
  readonly reachCurve: number[];
  readonly unreachable: readonly UnreachablePerson[];
  readonly samples: readonly SampleCascade[];
}

export function summarize(plan: SimPlan, merged: SimPartial, seed: string | number): SimulationSummary {
  const n = plan.room.n;
  const runs = runsOf(merged);
  const walked = new Uint8Array(n);
  for (const i of plan.walkers) walked[i] = 1;
  const variance = new Float64Array(n);
  const stderr = new Float64Array(n);
  const low95 = new Float64Array(n);
  const high95 = new Float64Array(n);
  const mean = merged.mean.slice();
  let total = 0;
  for (let i = 0; i < n; i++) {
    if (!walked[i]) continue;
    variance[i] = runs > 1 ? merged.m2[i] / (runs - 1) : 0;
    stderr[i] = runs > 0 ? Math.sqrt(variance[i] / runs) : 0;
    low95[i] = mean[i] - Z95 * stderr[i];
    high95[i] = mean[i] + Z95 * stderr[i];
    total += mean[i];
  }
  const w = plan.walkers.length;
  const totalStderr = runs > 1 ? Math.sqrt(merged.totalM2 / (runs - 1) / runs) : 0;
  return {
    runs,
    seed: String(seed),
    n,
    starters: plan.starters,
    mean,
    variance,
    stderr,
    low95,
    high95,
    cappedByPerson: merged.capped.slice(),
    walked,
    total,
    totalStderr,
    average: w > 0 ? total / w : 0,
    averageStderr: w > 0 ? totalStderr / w : 0,
    capped: merged.cappedWalks,
    hopCap: plan.hopCap,
    hops: merged.hops,
    reachCurve: reachCurve(merged.histogram, runs * (n - plan.starters.length)),
    unreachable: plan.unreachable,
    samples: merged.samples,
  };
}

/** Cumulative share reached by hop t, up to the last hop at which anyone was reached. */
function reachCurve(histogram: Float64Array, walks: number): number[] {
  let last = histogram.length - 1;
  while (last > 0 && histogram[last] === 0) last--;
  const out: number[] = [];
  let sum = 0;
  for (let t = 0; t <= last; t++) {
    sum += histogram[t];
    out.push(walks > 0 ? sum / walks : 1);
  }
  return out;
}
