import { Selection } from './selection';

describe('map selection', () => {
  const points = [
    { lid: 'a', x: 0, y: 0 },
    { lid: 'b', x: 10, y: 10 },
    { lid: 'c', x: 100, y: 100 },
  ];

  it('a click selects one person; shift-click adds and removes', () => {
    const s = new Selection();
    s.only('a');
    s.toggle('b');
    expect(s.ids().sort()).toEqual(['a', 'b']);
    s.toggle('a');
    expect(s.ids()).toEqual(['b']);
    s.only('c');
    expect(s.ids()).toEqual(['c']);
  });

  it('a rubber band selects who is inside, in any drag direction, and can add to the selection', () => {
    const s = new Selection();
    s.box(points, 20, 20, -5, -5, false);
    expect(s.ids().sort()).toEqual(['a', 'b']);
    s.box(points, 90, 90, 110, 110, true);
    expect(s.ids().sort()).toEqual(['a', 'b', 'c']);
    s.box(points, 90, 90, 110, 110, false);
    expect(s.ids()).toEqual(['c']);
  });

  it('a tie and people are not selected together; stale ids are dropped', () => {
    const s = new Selection();
    s.only('a');
    s.selectTie('t1');
    expect(s.size).toBe(0);
    expect(s.tie).toBe('t1');
    s.toggle('b');
    expect(s.tie).toBeNull();
    s.toggle('c');
    s.keepOnly(
      (l) => l !== 'c',
      () => true,
    );
    expect(s.ids()).toEqual(['b']);
  });
});
