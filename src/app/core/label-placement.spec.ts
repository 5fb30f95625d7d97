import { overlaps, placeLabels } from './label-placement';
import { itemAt } from '../../../shared/checked';

describe('name placement on the map', () => {
  it('gives crowded people spots that overlap no other name and no person', () => {
    // A ring of ten people 40 apart (the demo room's teams), names about 80 wide.
    const items = Array.from({ length: 10 }, (_, i) => ({
      x: 100 + 64 * Math.cos((i / 10) * 2 * Math.PI),
      y: 100 + 64 * Math.sin((i / 10) * 2 * Math.PI),
      width: 80,
    }));
    const spots = placeLabels(items, 12);
    const placed = spots.filter((s) => s !== null);
    expect(placed.length).toBe(10);
    for (let i = 0; i < placed.length; i++) {
      for (let j = i + 1; j < placed.length; j++)
        expect(overlaps(itemAt(placed, i, 'placed').box, itemAt(placed, j, 'placed').box)).toBeFalse();
      for (const p of items) {
        const shape = { x0: p.x - 12, y0: p.y - 12, x1: p.x + 12, y1: p.y + 12 };
        expect(overlaps(itemAt(placed, i, 'placed').box, shape)).toBeFalse();
      }
    }
  });

  it('leaves a name out rather than overlap when people sit on top of each other', () => {
    const items = Array.from({ length: 30 }, () => ({ x: 0, y: 0, width: 60 }));
    const spots = placeLabels(items, 12);
    expect(spots.some((s) => s === null)).toBeTrue();
    const placed = spots.filter((s) => s !== null);
    for (let i = 0; i < placed.length; i++)
      for (let j = i + 1; j < placed.length; j++)
        expect(overlaps(itemAt(placed, i, 'placed').box, itemAt(placed, j, 'placed').box)).toBeFalse();
  });

  it('keeps the first choice (the name below the person) when there is room', () => {
    const [spot] = placeLabels([{ x: 0, y: 0, width: 50 }], 11);
    expect(spot?.anchor).toBe('middle');
    expect(spot!.dy).toBeGreaterThan(0);
  });
});
