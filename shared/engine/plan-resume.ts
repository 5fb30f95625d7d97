/**
 * What a branch and bound (plan-exhaustive.ts) leaves behind when it stops at its time limit, its
 * node budget or on "stop, keep the best", so that a later search of the same problem continues
 * where it stopped instead of starting over.
 *
 * The pieces the search is cut into (roots split into two-starter pieces, sorted by bound) are
 * the same for the same room, k, constraints and cutting threshold, so a piece is named by its
 * position in that list. A depth-first search leaves little open: every piece after the last one
 * taken, and in each piece a thread was inside, the path it was on (per depth, the position of the
 * child it was exploring among the node's children in their deterministic order: the children
 * before it are decided). With the incumbent and its total, the resumed search visits exactly the
 * nodes the uninterrupted one would have visited after the stop. O(pieces) to build and to read.
 */
import { AbsorbingState } from './dense-state';
import type { PlanContext } from './plan-context';
import type { Root } from './plan-roots';
import type { Incumbent } from './plan-search-types';

/** A piece of the search: a root (or part of one) at its place in the prepared list. */
export interface Piece extends Root {
  readonly index: number;
  /** Resumed pieces: per depth, the position of the first child not yet decided; the last one is started afresh. */
  readonly path?: readonly number[];
  /** Resumed pieces: k-sets already decided inside the piece (counted in the saved `closed`). */
  readonly inside?: number;
}

/** A piece a thread stopped inside. */
export interface OpenPiece {
  readonly index: number;
  readonly path: readonly number[];
  readonly inside: number;
}

/** The saved state of a stopped (or finished) search; plain JSON. */
export interface SearchResume {
  readonly version: 1;
  readonly n: number;
  readonly k: number;
  /** Sorted required and excluded people: a saved search only continues under the same constraints. */
  readonly mustInclude: readonly number[];
  readonly exclude: readonly number[];
  /** Raw total the pieces were cut with (their pruning threshold): the same threshold cuts the same pieces. */
  readonly cutRaw: number;
  /** Number of pieces that cut gave. */
  readonly pieces: number;
  /** k-sets in the whole search space, and those decided so far over all runs. */
  readonly space: number;
  readonly closed: number;
  /** Search nodes visited over all runs, and the number of runs. */
  readonly nodes: number;
  readonly runs: number;
  /** The best set found over all runs (engine indices) and its raw total. */
  readonly best: readonly number[];
  readonly bestRaw: number;
  /** Proven lower bound on the optimum (raw). */
  readonly lowerRaw: number;
  /** Pieces a thread stopped inside, and untouched pieces before `from`, by index. */
  readonly open: readonly OpenPiece[];
  /** Every piece from this index on is still open and untouched. */
  readonly from: number;
}

const sortedIds = (xs: readonly number[]) => [...new Set(xs)].sort((a, b) => a - b);
const sameList = (a: readonly number[], b: readonly number[]) => a.length === b.length && a.every((x, i) => x === b[i]);

/**
 * The saved state when it belongs to this problem and its best set checks out (its total is
 * solved again); otherwise null and a note says the search starts afresh.
 */
export function usableResume(ctx: PlanContext): SearchResume | null {
  const r = ctx.options.resume;
  if (!r) return null;
  const fits =
    r.version === 1 &&
    r.n === ctx.n &&
    r.k === ctx.k &&
    sameList(r.mustInclude, sortedIds(ctx.mustInclude)) &&
    sameList(r.exclude, sortedIds(ctx.exclude)) &&
    r.best.length === ctx.k &&
    r.best.every((p) => Number.isInteger(p) && p >= 0 && p < ctx.n && ctx.allowed[p] === 1) &&
    new Set(r.best).size === ctx.k &&
    r.from <= r.pieces &&
    r.open.every((o) => o.index >= 0 && o.index < r.from);
  if (fits) {
    try {
      const raw = AbsorbingState.fromStarters(ctx.room, [...r.best]).rawTotal;
      if (Math.abs(raw - r.bestRaw) <= 1e-9 * Math.abs(raw)) return r;
    } catch {
      // a singular system: the saved set cannot be this room's
    }
  }
  ctx.notes.push('A saved search did not match this room, budget or constraints: the search started afresh.');
  return null;
}

/** The saved search of ctx.options.resume when it fits, and the better of its best set and `start`. */
export function resumeFrom(ctx: PlanContext, start: Incumbent): { saved: SearchResume | null; incumbent: Incumbent } {
  const saved = usableResume(ctx);
  if (!saved || !(saved.bestRaw < start.rawTotal)) return { saved, incumbent: start };
  return { saved, incumbent: { starters: [...saved.best], rawTotal: saved.bestRaw, scale: start.scale } };
}

/** The pieces still to search: the saved open ones (in list order), then every piece from `from` on. */
export function workList(items: readonly Root[], resume: SearchResume | null): Piece[] {
  if (!resume) return items.map((root, index) => ({ ...root, index }));
  const open = [...resume.open].sort((a, b) => a.index - b.index);
  const out: Piece[] = open.map((o) => ({ ...items[o.index], index: o.index, path: o.path, inside: o.inside }));
  for (let q = resume.from; q < items.length; q++) out.push({ ...items[q], index: q });
  return out;
}

/** k-sets already decided inside the open pieces of a saved state (the resumed search decides them again). */
export function insideOf(resume: SearchResume | null): number {
  return resume ? resume.open.reduce((t, o) => t + o.inside, 0) : 0;
}

export interface FrontierInput {
  readonly work: readonly Piece[];
  /** Positions of `work` from here on were never taken. */
  readonly untakenFrom: number;
  /** The pieces threads stopped inside. */
  readonly partial: readonly OpenPiece[];
  readonly pieces: number;
}

/** The open part after a run: pieces stopped inside, pieces never taken, as (open list, from). */
export function frontier(f: FrontierInput): { open: OpenPiece[]; from: number } {
  const byIndex = new Map<number, OpenPiece>();
  for (let q = f.untakenFrom; q < f.work.length; q++) {
    const w = f.work[q];
    byIndex.set(w.index, { index: w.index, path: w.path ?? [], inside: w.inside ?? 0 });
  }
  for (const p of f.partial) byIndex.set(p.index, p);
  let from = f.pieces;
  while (from > 0) {
    const o = byIndex.get(from - 1);
    if (!o || o.path.length > 0) break;
    from--;
  }
  const open = [...byIndex.values()].filter((o) => o.index < from).sort((a, b) => a.index - b.index);
  return { open, from };
}

export interface SavedBase {
  readonly ctx: PlanContext;
  readonly cutRaw: number;
  readonly pieces: number;
  readonly space: number;
  readonly prior: SearchResume | null;
}

export interface RunTotals {
  /** k-sets decided over all runs (the meter started from the saved count). */
  readonly closed: number;
  /** Nodes of this run. */
  readonly nodes: number;
  readonly best: readonly number[];
  readonly bestRaw: number;
  readonly lowerRaw: number;
}

/** The saved state after a run: its open part, the best set, and counts added to the earlier runs'. */
export function savedSearch(base: SavedBase, run: RunTotals, f: FrontierInput): SearchResume {
  const { open, from } = frontier(f);
  const done = open.length === 0 && from === f.pieces;
  return {
    version: 1,
    n: base.ctx.n,
    k: base.ctx.k,
    mustInclude: sortedIds(base.ctx.mustInclude),
    exclude: sortedIds(base.ctx.exclude),
    cutRaw: base.cutRaw,
    pieces: base.pieces,
    space: base.space,
    closed: run.closed,
    nodes: (base.prior?.nodes ?? 0) + run.nodes,
    runs: (base.prior?.runs ?? 0) + 1,
    best: [...run.best],
    bestRaw: run.bestRaw,
    lowerRaw: done ? run.bestRaw : Math.min(run.bestRaw, Math.max(base.prior?.lowerRaw ?? -Infinity, run.lowerRaw)),
    open,
    from,
  };
}
