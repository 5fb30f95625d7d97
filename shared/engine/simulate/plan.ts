/**
 * What a rehearsal needs once per room: the prepared walk (room.ts), alias tables, who starts,
 * who walks, and who cannot reach any starter (reachability.ts; they are reported, not walked,
 * since their walks would never end).
 */
import { EngineError } from '../errors';
import type { WalkOptions } from '../graph';
import { unreachablePeople, type UnreachablePerson } from '../reachability';
import { checkPeople, prepareRoom, type PreparedRoom, type RoomInput } from '../room';
import { buildAliasRows, type AliasRows } from './alias';

export interface SimulateOptions extends WalkOptions {
  /** Longest walk before it is stopped and counted as capped (default 1 000 000 hops). */
  readonly hopCap?: number;
  /** Whole cascades kept with their paths for the replay: runs 0 .. samples-1 (default 3). */
  readonly samples?: number;
  /** Longest path stored per walk in a sample cascade (default 2000 positions). */
  readonly samplePathCap?: number;
}

export const SIMULATE_DEFAULTS = { hopCap: 1_000_000, samples: 3, samplePathCap: 2000 } as const;

export interface SimPlan {
  readonly room: PreparedRoom;
  readonly alias: AliasRows;
  readonly starters: readonly number[];
  readonly isStarter: Uint8Array;
  /** People who walk in each cascade, in input order. */
  readonly walkers: Int32Array;
  readonly unreachable: readonly UnreachablePerson[];
  /** 1 for people with no outgoing tie (under the walk they stay put). */
  readonly stay: Uint8Array;
  readonly hopCap: number;
  readonly samples: number;
  readonly samplePathCap: number;
}

const cache = new WeakMap<object, Map<string, SimPlan>>();

export function planSimulation(input: RoomInput, starters: readonly number[], options: SimulateOptions = {}): SimPlan {
  const key = JSON.stringify([
    starters,
    options.laziness ?? 0,
    options.mixing ?? 0,
    options.hopCap,
    options.samples,
    options.samplePathCap,
  ]);
  const hit = cache.get(input)?.get(key);
  if (hit) return hit;
  const room = prepareRoom(input, options);
  const list = checkPeople(room, starters, 'starters');
  if (list.length === 0) throw new EngineError('INVALID_STARTERS', 'A rehearsal needs at least one starter.');
  const hopCap = checkCount('hopCap', options.hopCap ?? SIMULATE_DEFAULTS.hopCap, 1, 2 ** 31 - 1);
  const samples = checkCount('samples', options.samples ?? SIMULATE_DEFAULTS.samples, 0, 1000);
  const samplePathCap = checkCount('samplePathCap', options.samplePathCap ?? SIMULATE_DEFAULTS.samplePathCap, 1, 1e7);
  const n = room.n;
  const isStarter = new Uint8Array(n);
  for (const s of list) isStarter[s] = 1;
  const unreachable = unreachablePeople(room, list);
  const skip = new Uint8Array(n);
  for (const u of unreachable) skip[u.index] = 1;
  const walkers: number[] = [];
  for (let i = 0; i < n; i++) if (!isStarter[i] && !skip[i]) walkers.push(i);
  const stay = new Uint8Array(n);
  for (let i = 0; i < n; i++) if (room.csr.rowStart[i + 1] === room.csr.rowStart[i]) stay[i] = 1;
  const plan: SimPlan = {
    room,
    alias: buildAliasRows(room.csr),
    starters: list,
    isStarter,
    walkers: Int32Array.from(walkers),
    unreachable,
    stay,
    hopCap,
    samples,
    samplePathCap,
  };
  if (!cache.has(input)) cache.set(input, new Map());
  cache.get(input)!.set(key, plan);
  return plan;
}

function checkCount(name: string, v: number, min: number, max: number): number {
  if (!Number.isInteger(v) || v < min || v > max) {
    throw new EngineError('INVALID_OPTION', `${name} must be a whole number from ${min} to ${max} (got ${String(v)})`);
  }
  return v;
}
