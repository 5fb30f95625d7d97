import { EARLY_STOP_ABOVE, layoutMode, type MapNode, placeUnplaced, STATIC_FROM } from './map-layout';
import { itemAt } from '../../../../shared/checked';

describe('map layout limits', () => {
  it('runs the layout fully, stops it early, or shows a fixed layout by room size', () => {
    expect(layoutMode(300)).toBe('full');
    expect(layoutMode(EARLY_STOP_ABOVE)).toBe('full');
    expect(layoutMode(EARLY_STOP_ABOVE + 1)).toBe('early-stop');
    expect(layoutMode(STATIC_FROM)).toBe('static');
    expect(layoutMode(3000)).toBe('static');
  });

  it('places only people without a position, in one cluster per group, without overlaps', () => {
    const nodes: MapNode[] = [
      { lid: 'a', group: 'X', pinned: false, x: 10, y: 10 },
      ...Array.from({ length: 40 }, (_, i) => ({ lid: `n${i}`, group: i % 2 ? 'X' : 'Y', pinned: false })),
    ];
    expect(placeUnplaced(nodes)).toBeTrue();
    expect(itemAt(nodes, 0, 'nodes').x).toBe(10);
    for (const n of nodes) expect(Number.isFinite(n.x!) && Number.isFinite(n.y!)).toBeTrue();
    for (let i = 1; i < nodes.length; i++) {
      for (let j = i + 1; j < nodes.length; j++) {
        expect(
          Math.hypot(
            itemAt(nodes, i, 'nodes').x! - itemAt(nodes, j, 'nodes').x!,
            itemAt(nodes, i, 'nodes').y! - itemAt(nodes, j, 'nodes').y!,
          ),
        ).toBeGreaterThan(10);
      }
    }
    expect(placeUnplaced(nodes)).toBeFalse();
  });
});
