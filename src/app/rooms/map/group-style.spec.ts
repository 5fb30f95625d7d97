import { groupStyles, shapePath } from './group-style';

describe('group styles', () => {
  it('gives every group a distinct shape and colour pair, also past eight groups', () => {
    const names = Array.from({ length: 16 }, (_, i) => `Team ${i + 1}`);
    const styles = [...groupStyles(names).values()];
    const pairs = new Set(styles.map((s) => `${s.shape}/${s.fill}/${s.hollow}`));
    expect(pairs.size).toBe(16);
    // The first eight differ by shape alone, so the map reads in black and white.
    expect(new Set(styles.slice(0, 8).map((s) => s.shape)).size).toBe(8);
    for (const s of styles) expect(shapePath(s.shape, 10)).toMatch(/^M.*Z$/);
  });
});
