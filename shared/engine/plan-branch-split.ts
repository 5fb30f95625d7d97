/**
 * Cutting a branch and bound (plan-exhaustive.ts) into pieces: every root with at least three
 * starters to add is split into its children, each a piece with its own proven bound (the child
 * bound of docs/bounds.md, and the dual bound on big pieces), so the search closes many small
 * pieces in order of their bound and the pending lower bound rises steadily. Pieces whose bound
 * reaches the threshold are decided at once. O(|C|^2 r) per root.
 */
import { AbsorbingState } from './dense-state';
import type { CandState } from './plan-branch-state';
import { orderCandidates, type Level } from './plan-branch-steps';
import type { PlanContext } from './plan-context';
import type { Root } from './plan-roots';

/** Rooms up to this size are split into two-starter pieces before the search (memory O(n^3)). */
export const SPLIT_LIMIT = 150;

/**
 * Nodes with at least DUAL_R starters still to add and DUAL_MIN k-sets below them also get the
 * dual bound (O(m r^2)). Measured on 60-person six-group rooms at k = 9, 10: at r = 4 and 5 it
 * pruned almost nothing and cost 30-40 % of the search time; from r = 6 it pays for itself.
 */
export const DUAL_MIN = 5000;
export const DUAL_R = 6;

/** What the cut needs from the search. */
export interface SplitHost {
  readonly ctx: PlanContext;
  readonly k: number;
  readonly floor: number;
  sets(m: number, r: number): number;
  pruneAt(lb: number): boolean;
  close(sets: number): void;
  level(depth: number): Level;
  nodeBounds(s: CandState, lv: Level, r: number): boolean;
  dualOf(s: CandState, r: number): number;
}

/** The state of a root or item set (ergodic data for the first starter, then downdates). */
export function stateOfSet(ctx: PlanContext, set: readonly number[]): AbsorbingState | null {
  const e = ctx.ergodic();
  try {
    if (e && e.pi[set[0]] > 0) {
      const s = AbsorbingState.fromErgodic(e, set[0]);
      for (let q = 1; q < set.length; q++) s.add(set[q]);
      return s;
    }
    return AbsorbingState.fromStarters(ctx.room, set);
  } catch {
    return null; // a singular system: some people cannot reach this set
  }
}

/**
 * Splits every root with at least three starters to add into its children (one more starter,
 * the child bound of node()), so the search closes many small pieces in order of their bound
 * and the pending lower bound rises steadily. O(|C|^2 r) per root.
 */
export function splitRoots(host: SplitHost, roots: Root[]): Root[] {
  const out: Root[] = [];
  const lv = host.level(0);
  for (const root of roots) {
    const r = host.k - root.set.length;
    const size = host.sets(root.cand.length, r);
    if (r < 3 || size === 0) {
      if (size > 0) out.push(root);
      continue;
    }
    if (host.pruneAt(Math.max(host.floor, root.bound))) {
      host.close(size);
      continue;
    }
    const full = stateOfSet(host.ctx, root.set);
    if (!full) {
      host.close(size);
      continue;
    }
    const s = lv.state.load(full, root.cand);
    orderCandidates(s, lv);
    if (!host.nodeBounds(s, lv, r)) {
      host.close(size);
      continue;
    }
    for (let p = 0; p < s.m; p++) {
      const part = host.sets(s.m - p - 1, r - 1);
      if (part === 0) break;
      if (host.pruneAt(Math.max(host.floor, lv.childLb[p]))) {
        host.close(part);
        continue;
      }
      // Big pieces also carry their own dual bound (and are searched in the order of the stronger bound).
      let bound = Math.max(lv.childLb[p], root.bound);
      if (r - 1 >= DUAL_R && part >= DUAL_MIN) {
        const piece = host.level(1).state;
        s.childInto(piece, lv.order[p], lv.gain[p], lv.order, p + 1, s.m);
        bound = Math.max(bound, host.dualOf(piece, r - 1));
        if (host.pruneAt(Math.max(host.floor, bound))) {
          host.close(part);
          continue;
        }
      }
      const cand = new Int32Array(s.m - p - 1);
      for (let q = p + 1; q < s.m; q++) cand[q - p - 1] = s.ids[lv.order[q]];
      out.push({ set: [...root.set, s.ids[lv.order[p]]], cand, bound });
    }
  }
  return out;
}
