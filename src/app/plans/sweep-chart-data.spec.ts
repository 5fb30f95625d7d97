import { sweepChartData, sweepSeriesFromPoints } from './sweep-chart-data';
import { itemAt } from '../../../shared/checked';

describe('sweepChartData', () => {
  it('lays every method on one ascending k axis with gaps where a method has no value', () => {
    const data = sweepChartData([
      {
        method: 'greedy',
        points: [
          { k: 2, average: 3.5 },
          { k: 1, average: 5.25 },
          { k: 3, average: 2.1 },
        ],
      },
      {
        method: 'swap',
        points: [
          { k: 1, average: 5.25 },
          { k: 3, average: 2.0 },
        ],
      },
      {
        method: 'random',
        points: [
          { k: 1, average: 9.1 },
          { k: 2, average: Infinity },
          { k: 3, average: null },
        ],
      },
    ]);
    expect(data.labels).toEqual([1, 2, 3]);
    expect(itemAt(data.datasets, 0, 'datasets').data).toEqual([5.25, 3.5, 2.1]);
    expect(itemAt(data.datasets, 1, 'datasets').data).toEqual([5.25, null, 2]);
    // A baseline with an unreachable person has no finite average: a gap, not a made-up value.
    expect(itemAt(data.datasets, 2, 'datasets').data).toEqual([9.1, null, null]);
  });

  it('labels methods plainly and dashes the baselines', () => {
    const data = sweepChartData([
      { method: 'widened', points: [{ k: 1, average: 1 }] },
      { method: 'most-ties', points: [{ k: 1, average: 2 }] },
    ]);
    expect(data.datasets.map((d) => d.label)).toEqual(['Widened greedy', 'Most ties (baseline)']);
    expect(itemAt(data.datasets, 0, 'datasets').borderDash).toBeUndefined();
    expect(itemAt(data.datasets, 1, 'datasets').borderDash).toEqual([5, 4]);
  });
});

describe('sweepSeriesFromPoints', () => {
  it('turns server rows into one series per method, baselines included', () => {
    const series = sweepSeriesFromPoints([
      { k: 1, greedy: 4, widened: 4, swap: 4, mostTies: 5, random: 7, lowerBound: 3.5 },
      { k: 2, greedy: 3, widened: 2.9, swap: 2.9, mostTies: 3.6, random: null, lowerBound: 2.5 },
    ]);
    expect(series.map((s) => s.method)).toEqual(['greedy', 'widened', 'swap', 'mostTies', 'random', 'lowerBound']);
    expect(itemAt(series, 5, 'series').points).toEqual([
      { k: 1, average: 3.5 },
      { k: 2, average: 2.5 },
    ]);
    expect(itemAt(series, 1, 'series').points).toEqual([
      { k: 1, average: 4 },
      { k: 2, average: 2.9 },
    ]);
    expect(itemAt(sweepChartData(series).datasets, 4, 'datasets').data).toEqual([7, null]);
  });
});
