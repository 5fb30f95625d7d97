import { insideCount, intervalChartData, intervalPointsFrom } from './interval-chart-data';

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

describe('intervalPointsFrom', () => {
  it('keeps the people who walked and uses the 99% interval the verdict reads', () => {
    const base = { group: null, sd: 1, stderr: 0.1, low95: 0, high95: 0, capped: 0, inInterval99: true };
    const pts = intervalPointsFrom([
      { ...base, personId: 1, name: 'Starter', starter: true, walked: false, mean: 0, low99: 0, high99: 0, analytic: 0 },
      { ...base, personId: 2, name: 'Walker', starter: false, walked: true, mean: 3.1, low99: 2.8, high99: 3.4, analytic: 3 },
    ]);
    expect(pts).toEqual([{ name: 'Walker', analytic: 3, simulated: 3.1, low: 2.8, high: 3.4 }]);
  });
});
