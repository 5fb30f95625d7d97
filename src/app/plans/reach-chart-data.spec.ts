import { reachChartData, reachedBy } from './reach-chart-data';
import { itemAt } from '../../../shared/checked';

describe('reachChartData', () => {
  // Complete graph K_4 with one starter: each of the 3 others hears at each hop with probability 1/3
  // (h = (n - 1)/a = 3, Lovász, Random walks on graphs: a survey, 1993), so the share reached by hop t
  // is 1 - (2/3)^t.
  const k4 = Array.from({ length: 8 }, (_, t) => 1 - Math.pow(2 / 3, t));

  it('maps shares by hop to percentages on a hop axis', () => {
    const data = reachChartData([{ label: 'Plan', share: k4 }], 'hop', 5);
    const pts = itemAt(data.datasets, 0, 'datasets').data;
    expect(pts.length).toBe(8);
    expect(pts[0]).toEqual({ x: 0, y: 0 });
    expect(itemAt(pts, 1, 'pts').x).toBe(1);
    expect(itemAt(pts, 1, 'pts').y).toBeCloseTo(33.333, 2);
    expect(itemAt(pts, 2, 'pts').y).toBeCloseTo(55.556, 2);
  });

  it('turns hops into minutes with the room setting', () => {
    const data = reachChartData([{ label: 'Plan', share: k4 }], 'minute', 2.5);
    expect(
      itemAt(data.datasets, 0, 'datasets')
        .data.map((p) => p.x)
        .slice(0, 4),
    ).toEqual([0, 2.5, 5, 7.5]);
    expect(itemAt(itemAt(data.datasets, 0, 'datasets').data, 3, 'data').y).toBeCloseTo(100 * (1 - 8 / 27), 2);
  });

  it('pads a shorter curve with its final share and dashes the second series', () => {
    const data = reachChartData(
      [
        { label: 'A', share: [0, 0.5, 1] },
        { label: 'B', share: [0, 0.25, 0.5, 0.75, 0.9], dashed: true },
      ],
      'hop',
      1,
    );
    expect(itemAt(data.datasets, 0, 'datasets').data.map((p) => p.y)).toEqual([0, 50, 100, 100, 100]);
    expect(itemAt(data.datasets, 1, 'datasets').borderDash).toEqual([6, 4]);
    expect(itemAt(data.datasets, 0, 'datasets').borderDash).toBeUndefined();
  });

  it('cuts a long thin tail once every curve has reached 99.5%', () => {
    // 1 - (2/3)^t first reaches 0.995 at t = 14 (0.9966); 13 gives 0.9949.
    const long = Array.from({ length: 60 }, (_, t) => 1 - Math.pow(2 / 3, t));
    expect(reachChartData([{ label: 'Plan', share: long }], 'hop', 1).datasets.map((d) => d.data.length)).toEqual([17]);
    // A curve that never gets there keeps the whole length.
    expect(
      reachChartData(
        [
          { label: 'A', share: long },
          { label: 'B', share: long.map((v) => v / 2) },
        ],
        'hop',
        1,
      ).datasets.map((d) => d.data.length),
    ).toEqual([60, 60]);
    expect(reachChartData([{ label: 'Plan', share: long }], 'hop', 1, 1).datasets.map((d) => d.data.length)).toEqual([60]);
  });

  it('finds the hop and minute by which a share has heard', () => {
    // 1 - (2/3)^t >= 0.9 first at t = 6 (0.912), not at t = 5 (0.868).
    expect(reachedBy(k4, 0.9, 5)).toEqual({ hop: 6, minutes: 30 });
    expect(reachedBy([0, 0.4, 0.6], 0.9, 5)).toEqual({ hop: null, minutes: null });
  });
});
