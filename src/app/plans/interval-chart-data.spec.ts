import { insideCount, intervalPointsFrom, niceAxis, rangePlot } from './interval-chart-data';
import { itemAt } from '../../../shared/checked';

describe('rangePlot', () => {
  // Path 0-1-2-3-4 with starters {0, 4}: h_i = i (n - i) = 3, 4, 3 (gambler's ruin; Levin, Peres,
  // Wilmer, Markov Chains and Mixing Times, 2009). Simulated values are invented around them.
  const points = [
    { name: 'Bea', analytic: 4, simulated: 4.05, low: 3.9, high: 4.2 },
    { name: 'Ari', analytic: 3, simulated: 2.97, low: 2.85, high: 3.09 },
    { name: 'Cy', analytic: 3, simulated: 3.3, low: 3.15, high: 3.45 },
  ];

  it('sorts people by analytic hops and places each interval on a round axis', () => {
    const plot = rangePlot(points);
    expect(plot.rows.map((r) => r.name)).toEqual(['Ari', 'Cy', 'Bea']);
    expect(plot.max).toBe(5);
    expect(plot.ticks.map((t) => t.value)).toEqual([0, 1, 2, 3, 4, 5]);
    const ari = itemAt(plot.rows, 0, 'rows');
    expect(ari.lowPct).toBeCloseTo(57, 6);
    expect(ari.lowPct + ari.widthPct).toBeCloseTo(61.8, 6);
    expect(ari.analyticPct).toBeCloseTo(60, 6);
  });

  it('flags the rows whose analysis lies outside the interval', () => {
    const plot = rangePlot(points);
    expect(plot.rows.map((r) => r.inside)).toEqual([true, false, true]);
    expect(plot.outside).toBe(1);
    expect(insideCount(points)).toEqual({ inside: 2, of: 3 });
  });

  it('chooses steps of 1, 2 or 5 times a power of ten', () => {
    expect(niceAxis(47)).toEqual({ max: 50, step: 10 });
    expect(niceAxis(0.7)).toEqual({ max: 0.8, step: 0.2 });
    expect(niceAxis(0)).toEqual({ max: 1, step: 0.2 });
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
