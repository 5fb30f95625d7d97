/**
 * Reach-time distribution (engine.md section 1): P(T_i > t) = (Q^t 1)_i, where Q is the walk
 * (laziness and mixing included) restricted to the non-starters. The room's reach curve is the
 * expected share of non-starters reached by hop t; quantiles give "90% reached by hop 7".
 * Repeated sparse products: O((m + n) t). Since E[T_i] = sum_t P(T_i > t), the curve's area
 * reproduces the exact reach.
 */
import { EngineError } from './errors';
import type { WalkOptions } from './graph';
import { unreachablePeople, type UnreachablePerson } from './reachability';
import { checkPeople, prepareRoom, type PreparedRoom, type RoomInput } from './room';
import { sparseWalk } from './walk';

export interface ReachCurveOptions extends WalkOptions {
  /** Last hop computed (default: enough for the share not yet reached to fall below `tolerance`, capped by the room size). */
  readonly maxHops?: number;
  /** Stop once the expected share not yet reached is below this (default 1e-6). */
  readonly tolerance?: number;
  /** Shares for which the hop is reported (default 0.5, 0.9, 0.99). */
  readonly quantiles?: readonly number[];
  /** Minutes per hop, to express hops as minutes. */
  readonly minutesPerHop?: number;
  /** People whose own curve P(reached by hop t) is returned. */
  readonly people?: readonly number[];
}

export interface ReachQuantile {
  readonly share: number;
  /** First hop by which at least `share` of the non-starters are expected to have heard; null if not within the hops computed. */
  readonly hop: number | null;
  readonly minutes: number | null;
}

export interface ReachCurve {
  readonly starters: number[];
  /** shareReached[t]: expected share of non-starters who have heard by hop t (t = 0 .. hops). */
  readonly shareReached: Float64Array;
  /** roomShare[t]: the same counted over the whole room, starters included. */
  readonly roomShare: Float64Array;
  readonly hops: number;
  /** True when the share not yet reached fell below the tolerance. */
  readonly complete: boolean;
  readonly quantiles: ReachQuantile[];
  readonly minutesPerHop?: number;
  /** Per requested person: P(reached by hop t), t = 0 .. hops. */
  readonly people: { readonly index: number; readonly reachedBy: Float64Array }[];
  readonly unreachable: UnreachablePerson[];
}

export function reachCurve(input: RoomInput, starterList: readonly number[], options: ReachCurveOptions = {}): ReachCurve {
  const room = prepareRoom(input, options);
  const starters = checkPeople(room, starterList, 'Starters');
  if (starters.length === 0) throw new EngineError('INVALID_STARTERS', 'Choose at least one starter.');
  const people = checkPeople(room, options.people ?? [], 'People');
  const minutesPerHop = options.minutesPerHop;
  if (minutesPerHop !== undefined && !(minutesPerHop > 0 && Number.isFinite(minutesPerHop)))
    throw new EngineError('INVALID_OPTION', 'Minutes per hop must be a positive number.');
  const cap = options.maxHops ?? Math.min(20_000, Math.max(200, Math.floor(4e8 / (room.csr.col.length + room.n))));
  if (!(Number.isInteger(cap) && cap >= 1)) throw new EngineError('INVALID_OPTION', 'maxHops must be a whole number of at least 1.');
  const tol = options.tolerance ?? 1e-6;
  const { share, perPerson, hops, remaining } = walkHops(room, starters, people, cap, tol);
  const shareReached = Float64Array.from(share);
  const others = room.n - starters.length;
  const roomShare = shareReached.map((v) => (starters.length + others * v) / room.n);
  return {
    starters,
    shareReached,
    roomShare,
    hops,
    complete: remaining <= tol,
    quantiles: reachQuantiles(shareReached, options.quantiles ?? [0.5, 0.9, 0.99], minutesPerHop),
    minutesPerHop,
    people: people.map((p, q) => ({ index: p, reachedBy: Float64Array.from(perPerson[q]) })),
    unreachable: unreachablePeople(room, starters),
  };
}

/**
 * Steps s = Q^t 1 (the lazy walk's survival vector) until the share not yet reached is at most
 * `tol` or `cap` hops are done; collects the share reached by each hop and each person's curve.
 */
function walkHops(room: PreparedRoom, starters: number[], people: number[], cap: number, tol: number) {
  const { n } = room;
  const walk = sparseWalk(room, starters);
  const a = room.laziness;
  const others = n - starters.length;
  let s = new Float64Array(n);
  for (let i = 0; i < n; i++) if (walk.inT[i]) s[i] = 1;
  let t2 = new Float64Array(n);
  const share: number[] = [0];
  const perPerson = people.map(() => [0]);
  people.forEach((p, q) => (perPerson[q][0] = walk.inT[p] ? 0 : 1));
  let hops = 0;
  let remaining = others > 0 ? 1 : 0;
  while (remaining > tol && hops < cap) {
    walk.mulQ(s, t2);
    let sum = 0;
    if (a > 0)
      for (let i = 0; i < n; i++) {
        t2[i] = (1 - a) * t2[i] + a * s[i];
        sum += t2[i];
      }
    else for (let i = 0; i < n; i++) sum += t2[i];
    [s, t2] = [t2, s];
    hops++;
    remaining = sum / others;
    share.push(1 - remaining);
    people.forEach((p, q) => perPerson[q].push(walk.inT[p] ? 1 - s[p] : 1));
  }
  return { share, perPerson, hops, remaining };
}

/** The first hop by which each share of the non-starters is reached (null beyond the hops computed). */
function reachQuantiles(shareReached: Float64Array, shares: readonly number[], minutesPerHop: number | undefined): ReachQuantile[] {
  return shares.map((q) => {
    if (!(q > 0 && q <= 1)) throw new EngineError('INVALID_OPTION', `Quantile shares must be in (0, 1] (got ${q}).`);
    let hop: number | null = null;
    for (let t = 0; t < shareReached.length; t++)
      if (shareReached[t] >= q - 1e-12) {
        hop = t;
        break;
      }
    return { share: q, hop, minutes: hop !== null && minutesPerHop !== undefined ? hop * minutesPerHop : null };
  });
}

/** Hops expressed as minutes. */
export function hopsToMinutes(hops: number, minutesPerHop: number): number {
  return hops * minutesPerHop;
}
