import type { RehearsalPersonDto } from '../../../shared/api/plans';

/** One person's analytic expectation and the rehearsal's estimate with its interval. */
export interface IntervalPoint {
  name: string;
  analytic: number;
  simulated: number;
  low: number;
  high: number;
}

/** One row of the range plot: positions are percentages of the track, so the plot fits any width. */
export interface RangeRow extends IntervalPoint {
  lowPct: number;
  widthPct: number;
  meanPct: number;
  analyticPct: number;
  inside: boolean;
}

export interface RangePlot {
  rows: RangeRow[];
  /** Axis ticks (hops) and their positions. */
  ticks: { value: number; pct: number }[];
  max: number;
  outside: number;
}

/** A round axis end and step: 1, 2 or 5 times a power of ten, about five ticks. */
export function niceAxis(max: number): { max: number; step: number } {
  if (!(max > 0)) return { max: 1, step: 0.2 };
  const raw = max / 5;
  const p = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw)!;
  return { max: Math.round(Math.ceil(max / step - 1e-9) * step * 1e9) / 1e9, step };
}

/**
 * The person-by-person range plot: people (starters left out: both values are 0) sorted by analytic
 * expected hops; each row has the rehearsal's interval as a bar, its mean as a dot and the analysis
 * as a hollow diamond drawn over the bar (so the bar stays visible). A diamond outside its bar is a
 * person where the two disagree; those rows are flagged.
 */
export function rangePlot(points: readonly IntervalPoint[]): RangePlot {
  const rows = [...points].sort((a, b) => a.analytic - b.analytic || a.name.localeCompare(b.name));
  const top = Math.max(0, ...rows.map((r) => Math.max(r.high, r.analytic, r.simulated)));
  const axis = niceAxis(top);
  const pct = (v: number) => Math.min(100, Math.max(0, (v / axis.max) * 100));
  const out = rows.map((r) => ({
    ...r,
    lowPct: pct(r.low),
    widthPct: Math.max(0.4, pct(r.high) - pct(r.low)),
    meanPct: pct(r.simulated),
    analyticPct: pct(r.analytic),
    inside: isInside(r),
  }));
  const ticks: { value: number; pct: number }[] = [];
  for (let v = 0; v <= axis.max + 1e-9; v += axis.step) ticks.push({ value: Math.round(v * 1e6) / 1e6, pct: pct(v) });
  return { rows: out, ticks, max: axis.max, outside: out.filter((r) => !r.inside).length };
}

function isInside(p: IntervalPoint): boolean {
  return p.analytic >= p.low - 1e-9 && p.analytic <= p.high + 1e-9;
}

/** The rehearsal's people who walked (starters excluded), with the 99% interval the verdict uses. */
export function intervalPointsFrom(people: readonly RehearsalPersonDto[]): IntervalPoint[] {
  return people
    .filter((p) => p.walked)
    .map((p) => ({ name: p.name, analytic: p.analytic, simulated: p.mean, low: p.low99, high: p.high99 }));
}

/** How many people's analytic value falls inside their interval (the agreement check reads this). */
export function insideCount(points: readonly IntervalPoint[]): { inside: number; of: number } {
  return { inside: points.filter(isInside).length, of: points.length };
}
