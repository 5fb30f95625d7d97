import { insideCount, intervalChartData } from './interval-chart-data';

describe('intervalChartData', () => {
  // Path 0-1-2-3-4 with starters {0, 4}: h_i = i (n - i) = 3, 4, 3 (gambler's ruin; Levin, Peres,
  // Wilmer, Markov Chains and Mixing Times, 2009). Simulated values are invented around them.
  const points = [
    { name: 'Bea', analytic: 4, simulated: 4.05, low: 3.9, high: 4.2 },
    { name: 'Ari', analytic: 3, simulated: 2.97, low: 2.85, high: 3.09 },
    { name: 'Cy', analytic: 3, simulated: 3.3, low: 3.15, high: 3.45 },
  ];

  it('sorts people by analytic hops and makes floating interval bars', () => {
    const data = intervalChartData(points);
    expect(data.labels).toEqual(['Ari', 'Cy', 'Bea']);
    const [interval, simulated, analytic] = data.datasets;
    expect(interval.type).toBe('bar');
    expect(interval.data).toEqual([
      [2.85, 3.09],
      [3.15, 3.45],
      [3.9, 4.2],
    ]);
    expect(simulated.data).toEqual([2.97, 3.3, 4.05]);
    expect(analytic.data).toEqual([3, 3, 4]);
  });

  it('counts the people whose analytic value lies inside their interval', () => {
    expect(insideCount(points)).toEqual({ inside: 2, of: 3 });
  });
});
