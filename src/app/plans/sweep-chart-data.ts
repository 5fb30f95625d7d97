import { SWEEP_SERIES, type KSweepPoint } from '../../../shared/api/plans';
import type { ChartData, ChartDataset } from 'chart.js';
import { METHOD_LABELS } from './method-label';
import { SERIES_COLOURS } from './reach-chart-data';

/** One method's results across budgets: room average (expected hops) for each k. */
export interface SweepSeries {
  /** Method key, e.g. greedy, widened, swap, most-ties, random. */
  method: string;
  points: readonly { k: number; average: number | null }[];
}

/** The server's sweep rows turned into one series per method (greedy, widened, swap, most ties, random). */
export function sweepSeriesFromPoints(points: readonly KSweepPoint[]): SweepSeries[] {
  const series: SweepSeries[] = SWEEP_SERIES.map((method) => ({ method, points: points.map((p) => ({ k: p.k, average: p[method] })) }));
  if (points.some((p) => p.lowerBound !== null))
    series.push({ method: 'lowerBound', points: points.map((p) => ({ k: p.k, average: p.lowerBound })) });
  return series;
}

/** Plain labels for the sweep's methods and baselines. */
export const SWEEP_LABELS: Record<string, string> = {
  greedy: METHOD_LABELS.greedy,
  widened: METHOD_LABELS.widened,
  swap: METHOD_LABELS.swap,
  exhaustive: METHOD_LABELS.exhaustive,
  'most-ties': 'Most ties (baseline)',
  mostTies: 'Most ties (baseline)',
  random: 'Random (baseline)',
  lowerBound: 'No plan can beat this (proven bound)',
};

const BASELINES = new Set(['most-ties', 'mostTies', 'random']);

/**
 * Line chart data for the k-sweep: x = budget k, y = room average. Every series is laid on the same
 * k axis (the union of all budgets, ascending); a method without a value at some k leaves a gap
 * (null) rather than a made-up point. Baselines are dashed so the methods stand out.
 */
export function sweepChartData(series: readonly SweepSeries[]): ChartData<'line', (number | null)[], number> {
  const ks = [...new Set(series.flatMap((s) => s.points.map((p) => p.k)))].sort((a, b) => a - b);
  const datasets: ChartDataset<'line', (number | null)[]>[] = series.map((s, i) => {
    const byK = new Map(s.points.map((p) => [p.k, p.average]));
    const colour = SERIES_COLOURS[i % SERIES_COLOURS.length];
    const baseline = BASELINES.has(s.method);
    const bound = s.method === 'lowerBound';
    return {
      label: SWEEP_LABELS[s.method] ?? s.method,
      data: ks.map((k) => {
        const v = byK.get(k);
        return v === undefined || v === null || !Number.isFinite(v) ? null : Math.round(v * 1000) / 1000;
      }),
      borderColor: bound ? '#9aa5ad' : colour,
      backgroundColor: bound ? '#9aa5ad' : colour,
      borderDash: baseline ? [5, 4] : bound ? [2, 3] : undefined,
      pointRadius: bound ? 0 : 3,
      pointStyle: baseline ? 'rect' : 'circle',
      borderWidth: 2,
      spanGaps: false,
    };
  });
  return { labels: ks, datasets };
}
