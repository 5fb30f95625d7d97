import type { RehearsalPersonDto } from '../../../shared/api/plans';
import type { ChartData, ChartDataset } from 'chart.js';

/** One person's analytic expectation and the rehearsal's estimate with its interval. */
export interface IntervalPoint {
  name: string;
  analytic: number;
  simulated: number;
  low: number;
  high: number;
}

export type IntervalChartData = ChartData<'bar' | 'line', (number | [number, number] | null)[], string>;

/**
 * Per-person comparison: people (starters left out: both values are 0) sorted by analytic expected
 * hops; each gets a floating bar from the interval's low to high end, a point for the simulated mean
 * and a diamond for the analytic value. A diamond outside its bar is a person where the two disagree.
 */
export function intervalChartData(points: readonly IntervalPoint[], intervalLabel = '99% interval of the rehearsal'): IntervalChartData {
  const rows = [...points].sort((a, b) => a.analytic - b.analytic || a.name.localeCompare(b.name));
  const interval: ChartDataset<'bar', [number, number][]> = {
    type: 'bar',
    label: intervalLabel,
    data: rows.map((r) => [round(r.low), round(r.high)]),
    backgroundColor: 'rgba(91, 112, 101, 0.35)',
    borderColor: '#5b7065',
    borderWidth: 1,
    barPercentage: 0.6,
    order: 3,
  };
  const simulated: ChartDataset<'line', number[]> = {
    type: 'line',
    label: 'Rehearsal mean',
    data: rows.map((r) => round(r.simulated)),
    showLine: false,
    pointRadius: 3,
    pointStyle: 'circle',
    borderColor: '#5b7065',
    backgroundColor: '#5b7065',
    order: 2,
  };
  const analytic: ChartDataset<'line', number[]> = {
    type: 'line',
    label: 'Analysis (expected hops)',
    data: rows.map((r) => round(r.analytic)),
    showLine: false,
    pointRadius: 5,
    pointStyle: 'rectRot',
    borderColor: '#c2603a',
    backgroundColor: '#c2603a',
    order: 1,
  };
  return { labels: rows.map((r) => r.name), datasets: [interval, simulated, analytic] as IntervalChartData['datasets'] };
}

/** The rehearsal's people who walked (starters excluded), with the 99% interval the verdict uses. */
export function intervalPointsFrom(people: readonly RehearsalPersonDto[]): IntervalPoint[] {
  return people
    .filter((p) => p.walked)
    .map((p) => ({ name: p.name, analytic: p.analytic, simulated: p.mean, low: p.low99, high: p.high99 }));
}

/** How many people's analytic value falls inside their interval (the agreement check reads this). */
export function insideCount(points: readonly IntervalPoint[]): { inside: number; of: number } {
  const inside = points.filter((p) => p.analytic >= p.low - 1e-9 && p.analytic <= p.high + 1e-9).length;
  return { inside, of: points.length };
}

function round(v: number): number {
  return Math.round(v * 1000) / 1000;
}
