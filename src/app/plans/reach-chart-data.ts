import type { ChartData, ChartDataset } from 'chart.js';

/** One reach curve as the charts need it: share of people reached (0..1) by hop t, t = 0, 1, 2, ... */
export interface ReachSeries {
  label: string;
  /** share[t]: share of people who have heard by hop t. */
  share: readonly number[];
  /** Dashed line for a second curve (simulated, or the other plan of a comparison). */
  dashed?: boolean;
  colour?: string;
}

export type ReachAxis = 'hop' | 'minute';

export const SERIES_COLOURS = ['#16324a', '#c2603a', '#5b7065', '#8a6d1f', '#6b4e8a', '#9aa5ad'];

/**
 * Line chart data of one or more reach curves against hops or minutes (minutes = hop x minutes
 * per hop). Curves of different lengths are padded with their last value (a curve that stopped
 * because everyone had heard stays at its final share). Shares become percentages.
 */
export function reachChartData(
  series: readonly ReachSeries[],
  axis: ReachAxis,
  minutesPerHop: number,
  trimShare = 0.995,
): ChartData<'line', { x: number; y: number }[]> {
  const len = visibleLength(series, trimShare);
  const scale = axis === 'minute' ? minutesPerHop : 1;
  const datasets: ChartDataset<'line', { x: number; y: number }[]>[] = series.map((s, i) => {
    const colour = s.colour ?? SERIES_COLOURS[i % SERIES_COLOURS.length];
    const data: { x: number; y: number }[] = [];
    for (let t = 0; t < len; t++) {
      const v = s.share[Math.min(t, s.share.length - 1)] ?? 0; // past the end: the last share; none: 0
      data.push({ x: round(t * scale), y: round(100 * v) });
    }
    return {
      label: s.label,
      data,
      borderColor: colour,
      backgroundColor: colour,
      borderDash: s.dashed ? [6, 4] : undefined,
      pointRadius: 0,
      borderWidth: 2,
      tension: 0,
      stepped: axis === 'hop' ? ('before' as const) : false,
    };
  });
  return { datasets };
}

/**
 * How many hops to draw: up to the first hop where every curve has reached `trimShare` (plus two,
 * so the flat end shows), so a long thin tail does not squeeze the part that matters.
 */
export function visibleLength(series: readonly ReachSeries[], trimShare: number): number {
  const full = Math.max(0, ...series.map((s) => s.share.length));
  if (series.length === 0 || trimShare >= 1) return full;
  let need = 0;
  for (const s of series) {
    const hop = s.share.findIndex((v) => v >= trimShare);
    if (hop < 0) return full;
    need = Math.max(need, hop);
  }
  return Math.min(full, need + 3);
}

/**
 * The first hop by which at least `share` of people have heard (null when the curve never gets there),
 * and the same in minutes. Used for "90% will have heard within 40 minutes".
 */
export function reachedBy(curve: readonly number[], share: number, minutesPerHop: number): { hop: number | null; minutes: number | null } {
  const t = curve.findIndex((v) => v >= share - 1e-12);
  return t < 0 ? { hop: null, minutes: null } : { hop: t, minutes: round(t * minutesPerHop) };
}

function round(v: number): number {
  return Math.round(v * 1000) / 1000;
}
