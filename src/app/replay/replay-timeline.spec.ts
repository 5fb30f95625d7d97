import { buildTimeline, chainFronts, clampTime, hasHeard, heardAtHop, reachedCount, stepHop, type TimelineInput } from './replay-timeline';

/**
 * A hand-made cascade on the path 0 - 1 - 2 - 3 with starter 1 (worked by hand): person 0's
 * question reaches 1 in one hop, person 2 wanders 2 -> 3 -> 2 -> 1 (3 hops), person 3 goes
 * 3 -> 2 -> 1 (2 hops). Person 4 is cut off and never hears.
 */
const input: TimelineInput = {
  n: 5,
  starters: [1],
  heardAt: [1, 0, 3, 2, null],
  chains: [
    { person: 0, path: [0, 1], hops: 1, capped: false },
    { person: 2, path: [2, 3, 2, 1], hops: 3, capped: false },
    { person: 3, path: [3, 2, 1], hops: 2, capped: false },
  ],
};

describe('replay timeline', () => {
  const tl = buildTimeline(input);

  it('counts who has heard by each hop', () => {
    expect(tl.lastHop).toBe(3);
    expect(Array.from(tl.reachedBy)).toEqual([1, 2, 3, 4]);
    expect(tl.never).toBe(1);
    expect([0, 0.5, 1, 1.99, 2, 3, 99].map((t) => reachedCount(tl, t))).toEqual([1, 1, 2, 2, 3, 4, 4]);
  });

  it('marks a person as reached from their hop on, never before', () => {
    expect(hasHeard(tl, 1, 0)).toBeTrue();
    expect(hasHeard(tl, 0, 0.99)).toBeFalse();
    expect(hasHeard(tl, 0, 1)).toBeTrue();
    expect(hasHeard(tl, 2, 2.5)).toBeFalse();
    expect(hasHeard(tl, 4, 3)).toBeFalse();
    expect(heardAtHop(tl, 2)).toEqual([3]);
  });

  it('moves each travelling chain along its path and drops it once it arrives', () => {
    const at = chainFronts(tl, 1.5);
    expect(at.map((f) => f.person)).toEqual([2, 3]);
    const two = at.find((f) => f.person === 2)!;
    expect([two.from, two.to, two.along]).toEqual([3, 2, 0.5]);
    expect(two.trail).toEqual([2, 3]);
    expect(chainFronts(tl, 3)).toEqual([]);
    expect(chainFronts(tl, 0).length).toBe(3);
  });

  it('waits on the last stored person when a path was cut short', () => {
    const cut = buildTimeline({
      n: 3,
      starters: [0],
      heardAt: [0, 5, null],
      chains: [{ person: 1, path: [1, 2], hops: 5, capped: false }],
    });
    const f = chainFronts(cut, 3.2)[0];
    expect([f?.from, f?.to, f?.along]).toEqual([2, 2, 0]);
  });

  it('clamps and steps whole hops for the keyboard and the scrubber', () => {
    expect(clampTime(tl, -2)).toBe(0);
    expect(clampTime(tl, Number.NaN)).toBe(0);
    expect(clampTime(tl, 10)).toBe(3);
    expect(stepHop(tl, 0, 1)).toBe(1);
    expect(stepHop(tl, 1.4, 1)).toBe(2);
    expect(stepHop(tl, 1.4, -1)).toBe(1);
    expect(stepHop(tl, 2, -1)).toBe(1);
    expect(stepHop(tl, 3, 1)).toBe(3);
  });

  it('rejects a cascade whose arrays do not match the room', () => {
    expect(() => buildTimeline({ ...input, n: 4 })).toThrowError(/5 entries for 4 people/);
  });
});
