/**
 * A room prepared for computation: the CSR of out-strengths plus the walk options,
 * validated once. Every engine function accepts either a RoomGraph or a PreparedRoom.
 */
import { EngineError } from './errors';
import { type Csr, type RoomGraph, type WalkOptions, toCsr } from './graph';

export interface PreparedRoom {
  readonly kind: 'prepared-room';
  readonly n: number;
  readonly directed: boolean;
  readonly csr: Csr;
  /** Person ids in input order (the tie-break order); generated as "0".."n-1" when built from a bare CSR. */
  readonly ids: readonly string[];
  readonly laziness: number;
  readonly mixing: number;
}

export type RoomInput = RoomGraph | PreparedRoom;

function checkProbability(name: string, v: number | undefined): number {
  if (v === undefined) return 0;
  if (typeof v !== 'number' || !Number.isFinite(v) || v < 0 || v >= 1) {
    throw new EngineError('INVALID_OPTION', `${name} must be a number with 0 <= ${name} < 1 (got ${String(v)})`);
  }
  return v;
}

export function isPreparedRoom(r: RoomInput): r is PreparedRoom {
  return (r as PreparedRoom).kind === 'prepared-room';
}

/** Validates the walk options and builds the CSR once. */
export function prepareRoom(room: RoomInput, options: WalkOptions = {}): PreparedRoom {
  const laziness = checkProbability('laziness', options.laziness ?? (isPreparedRoom(room) ? room.laziness : 0));
  const mixing = checkProbability('mixing', options.mixing ?? (isPreparedRoom(room) ? room.mixing : 0));
  if (isPreparedRoom(room)) {
    if (laziness === room.laziness && mixing === room.mixing) return room;
    return { ...room, laziness, mixing };
  }
  const n = room.ids.length;
  if (n === 0) throw new EngineError('EMPTY_ROOM', 'The room has no people: add at least two people and one tie.');
  for (const t of room.ties) {
    if (!(t.strength > 0) || !Number.isFinite(t.strength)) {
      throw new EngineError(
        'INVALID_INPUT',
        `Tie ${room.ids[t.source] ?? t.source} -> ${room.ids[t.target] ?? t.target} has strength ${t.strength}; strengths must be positive numbers.`,
      );
    }
    if (!(t.source >= 0 && t.source < n && t.target >= 0 && t.target < n) || !Number.isInteger(t.source) || !Number.isInteger(t.target)) {
      throw new EngineError('INVALID_INPUT', `A tie refers to person index ${t.source} -> ${t.target}, outside the room of ${n} people.`);
    }
  }
  return { kind: 'prepared-room', n, directed: room.directed, csr: toCsr(room), ids: room.ids, laziness, mixing };
}

/** Wraps an existing CSR (benchmarks, generated rooms) without copying it. */
export function roomFromCsr(csr: Csr, directed: boolean, options: WalkOptions = {}): PreparedRoom {
  if (csr.n === 0) throw new EngineError('EMPTY_ROOM', 'The room has no people.');
  const ids = Array.from({ length: csr.n }, (_, i) => String(i));
  return prepareRoom({ kind: 'prepared-room', n: csr.n, directed, csr, ids, laziness: 0, mixing: 0 }, options);
}

/** Checks a list of person indices (starters, constraints) and returns them de-duplicated, in the given order. */
export function checkPeople(room: PreparedRoom, people: readonly number[], what: string): number[] {
  const seen = new Set<number>();
  const out: number[] = [];
  for (const p of people) {
    if (!Number.isInteger(p) || p < 0 || p >= room.n) {
      throw new EngineError('UNKNOWN_PERSON', `${what}: person index ${String(p)} is not in the room (valid: 0..${room.n - 1}).`, {
        index: p,
      });
    }
    if (!seen.has(p)) {
      seen.add(p);
      out.push(p);
    }
  }
  return out;
}

/** Maps person ids (as in the file) to indices, naming any id that is not in the room. */
export function indicesOf(room: { readonly ids: readonly string[] }, ids: readonly string[]): number[] {
  const map = new Map<string, number>();
  room.ids.forEach((id, i) => map.set(id, i));
  return ids.map((id) => {
    const i = map.get(id);
    if (i === undefined) throw new EngineError('UNKNOWN_PERSON', `Person "${id}" is not in the room.`, { id });
    return i;
  });
}
