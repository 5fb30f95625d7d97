/**
 * The key under which plans share their proven bounds: the same room version, the same budget k
 * and the same constraints make the same planning problem, so a bound proven by any plan of the
 * key holds for every other plan of it.
 */
import { createHash } from 'node:crypto';

export interface BoundKeyInput {
  roomId: number;
  roomVersion: number;
  k: number;
  mustBrief: readonly number[];
  cannotBrief: readonly number[];
  /** Chance a starter does not show up (null or 0: the plain objective). */
  noShow: number | null;
}

export interface BoundKey {
  roomId: number;
  roomVersion: number;
  k: number;
  constraintsKey: string;
}

const sortedIds = (ids: readonly number[]) => [...new Set(ids)].sort((a, b) => a - b).join(',');

/** Canonical text of the constraints (order of the lists does not matter); hashed when long. */
export function constraintsKey(mustBrief: readonly number[], cannotBrief: readonly number[], noShow: number | null): string {
  const p = noShow && noShow > 0 ? `|p:${Number(noShow.toFixed(6))}` : '';
  const text = `m:${sortedIds(mustBrief)}|x:${sortedIds(cannotBrief)}${p}`;
  return text.length <= 120 ? text : `h:${createHash('sha256').update(text).digest('hex')}`;
}

export function boundKey(input: BoundKeyInput): BoundKey {
  return {
    roomId: input.roomId,
    roomVersion: input.roomVersion,
    k: input.k,
    constraintsKey: constraintsKey(input.mustBrief, input.cannotBrief, input.noShow),
  };
}

export function keyText(key: BoundKey): string {
  return `${key.roomVersion}/${key.k}/${key.constraintsKey}`;
}
