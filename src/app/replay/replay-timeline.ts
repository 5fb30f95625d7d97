/**
 * The replay's timeline, pure and DOM-free: which people have heard by (fractional) hop t, and
 * where each still-travelling chain has got to. A chain is one person's question walking from
 * them to a starter (path[0] = the person, path[hops] = the starter); the person hears at hop
 * `hops`. Stored paths may be cut short (truncated): the front then waits on the last stored
 * person until the hop the walk really reached a starter.
 */
import { itemAt } from '../../../shared/checked';

export interface TimelineChain {
  readonly person: number;
  readonly path: readonly number[];
  readonly hops: number;
  readonly capped: boolean;
}

export interface TimelineInput {
  readonly n: number;
  /** Indices of the starters. */
  readonly starters: readonly number[];
  /** heardAt[i]: hop at which person i heard; null when they never do in this cascade. */
  readonly heardAt: readonly (number | null)[];
  readonly chains: readonly TimelineChain[];
}

export interface Timeline {
  readonly n: number;
  readonly lastHop: number;
  /** -1 for people who never hear in this cascade. */
  readonly heardAt: Int32Array;
  readonly starters: ReadonlySet<number>;
  /** reachedBy[t] = people who have heard by hop t, for t = 0..lastHop. */
  readonly reachedBy: Int32Array;
  readonly chains: readonly TimelineChain[];
  /** People who never hear (cut off, or their walk hit the hop cap). */
  readonly never: number;
}

export interface ChainFront {
  readonly person: number;
  /** Current segment from -> to, and how far along it (0..1). */
  readonly from: number;
  readonly to: number;
  readonly along: number;
  /** People already passed, newest last (at most `tail` of them). */
  readonly trail: readonly number[];
}

export function buildTimeline(input: TimelineInput): Timeline {
  if (input.heardAt.length !== input.n) throw new Error(`heardAt has ${input.heardAt.length} entries for ${input.n} people.`);
  const heardAt = new Int32Array(input.n).fill(-1);
  let lastHop = 0;
  input.heardAt.forEach((h, i) => {
    if (h !== null && Number.isFinite(h) && h >= 0) {
      heardAt[i] = Math.floor(h);
      if (h > lastHop) lastHop = Math.floor(h);
    }
  });
  for (const s of input.starters) if (s >= 0 && s < input.n) heardAt[s] = 0;
  const reachedBy = new Int32Array(lastHop + 1);
  let never = 0;
  for (const h of heardAt) {
    if (h < 0) never++;
    else reachedBy[h] = itemAt(reachedBy, h, 'hop count') + 1;
  }
  let soFar = 0;
  reachedBy.forEach((count, t) => (reachedBy[t] = soFar += count)); // counts by hop -> reached by hop
  return { n: input.n, lastHop, heardAt, starters: new Set(input.starters), reachedBy, chains: input.chains, never };
}

/** Clamps any time (scrubber, keyboard, animation) to the timeline. */
export function clampTime(tl: Timeline, t: number): number {
  if (!Number.isFinite(t) || t < 0) return 0;
  return Math.min(t, tl.lastHop);
}

/** True when person i has heard by time t (a person hears the moment their hop is reached). */
export function hasHeard(tl: Timeline, i: number, t: number): boolean {
  const h = tl.heardAt[i];
  return h !== undefined && h >= 0 && h <= clampTime(tl, t) + 1e-9;
}

/** How many have heard by time t. */
export function reachedCount(tl: Timeline, t: number): number {
  const k = Math.floor(clampTime(tl, t) + 1e-9);
  return tl.reachedBy[k] ?? 0;
}

/** The people who hear exactly at hop t. */
export function heardAtHop(tl: Timeline, hop: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < tl.n; i++) if (tl.heardAt[i] === hop) out.push(i);
  return out;
}

/** Where each chain that is still travelling at time t has got to. */
export function chainFronts(tl: Timeline, t: number, tail = 4): ChainFront[] {
  const time = clampTime(tl, t);
  const out: ChainFront[] = [];
  for (const c of tl.chains) {
    if (c.capped || c.hops <= 0 || time >= c.hops || c.path.length === 0) continue;
    const k = Math.floor(time);
    const along = time - k;
    const last = c.path.length - 1;
    const from = itemAt(c.path, Math.min(k, last), 'chain path');
    const to = k + 1 <= last ? itemAt(c.path, k + 1, 'chain path') : from;
    const trail = c.path.slice(Math.max(0, Math.min(k, last) - tail + 1), Math.min(k, last) + 1);
    out.push({ person: c.person, from, to, along: to === from ? 0 : along, trail });
  }
  return out;
}

/** The next or previous whole hop from t (for step buttons and arrow keys). */
export function stepHop(tl: Timeline, t: number, direction: 1 | -1): number {
  const time = clampTime(tl, t);
  const next = direction === 1 ? Math.floor(time + 1e-9) + 1 : Math.ceil(time - 1e-9) - 1;
  return clampTime(tl, next);
}
