import type { EditorPerson, EditorTie } from '../editor/room-model';
import { MapGraph, segmentDistance, structureOf } from './map-graph';

const person = (lid: string, x: number | null, y: number | null, extra: Partial<EditorPerson> = {}): EditorPerson => ({
  lid,
  key: lid,
  name: lid.toUpperCase(),
  group: null,
  email: null,
  x,
  y,
  pinned: false,
  ...extra,
});
const tie = (lid: string, source: string, target: string, strength = 1): EditorTie => ({ lid, source, target, strength });

describe('MapGraph', () => {
  it('keeps a person’s node between updates, takes saved places and reports people without one', () => {
    const g = new MapGraph();
    expect(g.update([person('a', 0, 0), person('b', null, null)], [], new Set()).newcomers).toBeTrue();
    const a = g.node('a');
    expect(g.update([person('a', 5, 6), person('b', null, null)], [], new Set()).newcomers)
      .withContext('b is known now')
      .toBeFalse();
    expect(g.node('a')).toBe(a);
    expect([a?.x, a?.y]).toEqual([5, 6]);
    g.update([person('a', 5, 6)], [], new Set());
    expect(g.node('b')).toBeUndefined();
    expect(g.size).toBe(1);
  });

  it('fixes pinned and held people where they are and frees the rest', () => {
    const g = new MapGraph();
    g.update([person('a', 1, 2, { pinned: true }), person('b', 3, 4), person('c', 5, 6)], [], new Set(['b']));
    expect([g.node('a')?.fx, g.node('a')?.fy]).toEqual([1, 2]);
    expect([g.node('b')?.fx, g.node('b')?.fy]).toEqual([3, 4]);
    expect([g.node('c')?.fx, g.node('c')?.fy]).toEqual([null, null]);
  });

  it('links ties to their ends, lists each person’s ties and drops ties to people who are gone', () => {
    const g = new MapGraph();
    g.update(
      [person('a', 0, 0), person('b', 10, 0), person('c', 0, 10)],
      [tie('t1', 'a', 'b', 2), tie('t2', 'b', 'c', 5), tie('t3', 'a', 'x')],
      new Set(),
    );
    expect(g.links.map((l) => l.lid)).toEqual(['t1', 't2']);
    expect(g.tiesOf('b').map((l) => l.lid)).toEqual(['t1', 't2']);
    expect(g.tiesOf('c').map((l) => l.lid)).toEqual(['t2']);
    expect(g.tiesAround(['a', 'b'].flatMap((lid) => g.node(lid) ?? [])).map((l) => l.lid)).toEqual(['t1', 't2']);
    expect(g.maxStrength()).toBe(5);
  });

  it('finds the person under a point (not the one excepted) and the tie near a point', () => {
    const g = new MapGraph();
    g.update([person('a', 0, 0), person('b', 100, 0)], [tie('t1', 'a', 'b')], new Set());
    expect(g.personAt(98, 3, 'a')?.lid).toBe('b');
    expect(g.personAt(2, 0, 'a')).toBeNull();
    expect(g.personAt(50, 50, 'a')).toBeNull();
    expect(g.tieAt(50, 4, 6)?.lid).toBe('t1');
    expect(g.tieAt(50, 8, 6)).toBeNull();
  });

  it('answers a free spot away from everyone, the middle itself when nobody is near', () => {
    const g = new MapGraph();
    g.update([person('a', 0, 0)], [], new Set());
    expect(g.freeSpotNear(500, 500)).toEqual([500, 500]);
    const [x, y] = g.freeSpotNear(0, 0);
    expect(Math.hypot(x, y)).toBeGreaterThan(55);
  });
});

describe('structureOf', () => {
  it('changes with names, groups, ties and direction, not with places or pins', () => {
    const base = structureOf([person('a', 0, 0)], [], false);
    expect(structureOf([person('a', 9, 9, { pinned: true })], [], false)).toBe(base);
    expect(structureOf([person('a', 0, 0, { name: 'Other' })], [], false)).not.toBe(base);
    expect(structureOf([person('a', 0, 0, { group: 'Ops' })], [], false)).not.toBe(base);
    expect(structureOf([person('a', 0, 0)], [], true)).not.toBe(base);
    expect(structureOf([person('a', 0, 0)], [tie('t', 'a', 'a')], false)).not.toBe(base);
  });
});

describe('segmentDistance', () => {
  it('measures to the nearest point of the segment, ends included', () => {
    expect(segmentDistance(5, 3, 0, 0, 10, 0)).toBe(3);
    expect(segmentDistance(13, 4, 0, 0, 10, 0)).toBe(5);
    expect(segmentDistance(3, 4, 0, 0, 0, 0)).toBe(5);
  });
});
