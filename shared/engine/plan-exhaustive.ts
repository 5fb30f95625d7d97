/**
 * Exhaustive planner: depth-first branch and bound over k-sets (Land & Doig 1960) that returns
 * a certified optimum, or at the time limit / on cancel the best plan found with a proven lower
 * bound and the share of the search space still open.
 *
 * Enumeration: a node is (S, C, r): the sets S ∪ B with B an r-subset of the ordered candidate
 * list C. Its children are S + C[p] with candidates C[p+1..] (each set is reached once). At
 * every node C is re-ordered by decreasing gain at S, so later children only see small gains.
 * The incumbent starts from the heuristic plan (widened greedy + swap polish), so the answer
 * is never worse than theirs; only a strictly better set (1e-12 relative) replaces it.
 *
 * Pruning (proofs in docs/bounds.md): F is non-increasing and supermodular (Borkar, Nair &
 * Sanketh 2010; Mavroforakis, Mathioudakis & Gionis, ICDM 2015), so with ρ_y(X) the gain of y
 * at X, for the child S + x with later candidates D:
 *   min over r-1 subsets B of D of F(S + x + B) >= F(S) - ρ_x(S) - top_{r-1} { ρ_y(S + x) : y in D }
 * (bound 2 of docs/bounds.md). ρ_y(S + x) for every pair (x, y) costs O(1) from the N, h, c of
 * S (identity 1 applied to one entry), so all child bounds of a node cost O(|C|^2) and no child
 * state is built for a pruned child; at r = 2 the same formula gives the exact totals of every
 * completion. Big subtrees also get the dual bound (bound 4: greedy completion Y, then
 * F(S ∪ Y) - top_r gains at S ∪ Y). Cost O(|C|^2) per expanded node plus O(|C| r) per child;
 * exponential in the worst case. A search stopped part-way leaves a state (plan-resume.ts) that a
 * later search of the same problem continues from.
 */
import { CandState } from './plan-branch-state';
import type { PlanContext } from './plan-context';
import { childBounds, orderCandidates, pairLeaves, tripleLeaves, type Level, type TripleScratch } from './plan-branch-steps';
import { insideOf, resumeFrom, savedSearch, workList, type FrontierInput, type OpenPiece, type Piece } from './plan-resume';
import type { RunTotals, SearchResume } from './plan-resume';
import { DUAL_MIN, DUAL_R, SPLIT_LIMIT, splitRoots, stateOfSet } from './plan-branch-split';
import { buildRoots, type Root } from './plan-roots';
import { SearchMeter, binomialTable } from './plan-search-meter';
import type { ExhaustiveOutcome, Incumbent, SearchLink } from './plan-search-types';

export type { ExhaustiveOutcome, Incumbent, SearchLink } from './plan-search-types';
export { resumeFrom } from './plan-resume';

export function exhaustiveSearch(ctx: PlanContext, start: Incumbent): ExhaustiveOutcome {
  const { saved, incumbent } = resumeFrom(ctx, start);
  const search = new BranchSearch(ctx, incumbent);
  const work = search.start(saved);
  let next = 0;
  search.searchItems(work, () => (next < work.length ? next++ : -1));
  const partial = search.partial ? [search.partial] : [];
  return search.outcome(search.saved(saved, { work, untakenFrom: next, partial }));
}

export class BranchSearch {
  readonly k: number;
  private readonly scale: number;
  /** Pruning threshold: the best raw total known to this thread, its own or another thread's (link). */
  private best: number;
  /** This thread's best set and its raw total (never another thread's total: the two must match). */
  private bestSet: number[];
  private ownBest: number;
  readonly floor: number;
  private readonly levels: Level[] = [];
  private readonly binom: Float64Array[];
  private readonly meter: SearchMeter;
  private roots: Root[] = [];
  private rootAt = 0;
  private readonly buf: Float64Array;
  private readonly scratch: CandState;
  private readonly picked: Uint8Array;
  private readonly trip: TripleScratch;
  /** Threshold the pieces were cut with, and their number (a resumed search cuts the same pieces). */
  private cutRaw = Infinity;
  private pieces = 0;
  /** The piece this thread stopped inside, if any. */
  partial: OpenPiece | null = null;
  /** Path of the node being left when the search halts (per depth), its length (-1: none) and the sets decided inside. */
  private readonly trail: number[] = [];
  private trailLen = -1;
  private trailInside = 0;
  /** Resuming a piece: the saved path, and how many of its depths are still being re-entered. */
  private replayPath: readonly number[] = [];
  private replayLen = 0;
  private searching = false;

  constructor(
    readonly ctx: PlanContext,
    incumbent: Incumbent,
    private readonly link?: SearchLink,
  ) {
    const n = ctx.n;
    this.k = ctx.k;
    this.scale = incumbent.scale;
    this.best = incumbent.rawTotal;
    this.ownBest = incumbent.rawTotal;
    this.bestSet = [...incumbent.starters];
    this.floor = n - ctx.k; // raw hops: every non-starter needs at least one (identity 6)
    this.binom = binomialTable(n, ctx.k);
    this.meter = new SearchMeter(
      ctx,
      () => this.pendingBound() * this.scale,
      () => this.best * this.scale,
    );
    this.buf = new Float64Array(ctx.k + 1);
    this.scratch = new CandState(n);
    this.picked = new Uint8Array(n);
    const vec = () => new Float64Array(n + 1);
    this.trip = { col: vec(), row: vec(), diag: vec(), h: vec(), c: vec(), g: vec(), sufMax: vec() };
    for (let d = 0; d <= ctx.k; d++)
      this.levels.push({
        state: new CandState(n),
        order: new Int32Array(n),
        gain: new Float64Array(n),
        childLb: new Float64Array(n),
        suffixMin: new Float64Array(n + 1),
        at: 0,
        size: 0,
      });
  }

  sets(m: number, r: number): number {
    return r < 0 || m < r ? 0 : this.binom[m][r];
  }

  pruneAt(lb: number): boolean {
    return lb >= this.best - 1e-11 * Math.abs(this.best);
  }

  improves(total: number): boolean {
    return total < this.best - 1e-12 * Math.abs(this.best);
  }

  leaf(total: number, set: () => number[]): void {
    if (total < this.best - 1e-12 * Math.abs(this.best)) {
      this.best = total;
      this.ownBest = total;
      this.bestSet = set();
      this.link?.offer(total);
    }
  }

  /** Takes the other threads' best total and publishes this thread's state. */
  private sync(): void {
    if (!this.link) return;
    this.best = Math.min(this.best, this.link.best());
    this.link.publish(this.pendingBound(), this.meter.closedSets(), this.meter.nodes);
  }

  closedSets(): number {
    return this.meter.closedSets();
  }

  close(sets: number): void {
    this.meter.close(sets);
  }

  level(depth: number): Level {
    return this.levels[depth];
  }

  /** Bound 4 of docs/bounds.md for the sets below `s` with r starters to add. */
  dualOf(s: CandState, r: number): number {
    return s.dualBound(r, this.scratch, this.picked);
  }

  /** Nodes of the earlier runs of a resumed search. */
  priorNodes(): number {
    return this.meter.priorNodeCount;
  }

  space(): number {
    return this.meter.spaceSize();
  }

  get halted(): boolean {
    return this.meter.halted;
  }

  /**
   * Roots, split into pieces on small rooms, sorted by bound (so the pending bound rises as they
   * close). Pieces are pruned against `cutRaw` (default: the incumbent), so the same threshold
   * always gives the same list.
   */
  prepare(cutRaw = this.best): Root[] {
    const roots = buildRoots(this.ctx, this.k);
    let space = 0;
    for (const r of roots) space += this.sets(r.cand.length, this.k - r.set.length);
    this.meter.begin(space);
    const best = this.best;
    this.cutRaw = cutRaw;
    this.best = cutRaw;
    const items = this.ctx.n <= SPLIT_LIMIT ? splitRoots(this, roots) : roots;
    this.best = best;
    this.pieces = items.length;
    return items
      .map((_, q) => q)
      .sort((a, b) => items[a].bound - items[b].bound || a - b)
      .map((q) => items[q]);
  }

  /**
   * The pieces to search: all of them, or those a saved search left open (cut with its threshold;
   * the sets it decided stay counted, those inside its open pieces are decided again on the way).
   */
  start(saved: SearchResume | null): Piece[] {
    const items = this.prepare(saved?.cutRaw ?? this.best);
    if (saved && items.length !== saved.pieces) throw new Error('a saved search cut a different number of pieces');
    if (saved) this.meter.restore(saved.closed - insideOf(saved), saved.nodes);
    return workList(items, saved);
  }

  /** The state a later search continues from; `run` replaces this thread's counts (several threads). */
  saved(prior: SearchResume | null, f: Omit<FrontierInput, 'pieces'>, run?: RunTotals): SearchResume {
    const own = run ?? {
      closed: this.meter.closedSets(),
      nodes: this.meter.nodes,
      best: this.bestSet,
      bestRaw: this.ownBest,
      lowerRaw: this.outcomeCore().lowerRaw,
    };
    return savedSearch({ ctx: this.ctx, cutRaw: this.cutRaw, pieces: this.pieces, space: this.meter.spaceSize(), prior }, own, {
      ...f,
      pieces: this.pieces,
    });
  }

  /** Searches items[take()] until take() returns -1 or the search halts; a halt inside a piece leaves `partial`. */
  searchItems(items: Piece[], take: () => number): void {
    this.roots = items;
    this.searching = true;
    for (;;) {
      const q = this.meter.halted ? -1 : take();
      if (q < 0) break;
      this.rootAt = q;
      const piece = items[q];
      this.replayPath = piece.path ?? [];
      this.replayLen = this.replayPath.length;
      this.trailLen = -1;
      this.trailInside = 0;
      this.root(piece);
      this.replayLen = 0;
      if (this.meter.halted)
        this.partial = { index: piece.index, path: this.trail.slice(0, Math.max(0, this.trailLen)), inside: this.trailInside };
      this.sync();
    }
    this.rootAt = this.link ? items.length : this.rootAt;
  }

  private outcomeCore(): { complete: boolean; lowerRaw: number } {
    const complete = !this.meter.halted;
    return { complete, lowerRaw: Math.max(this.floor, complete ? this.best : Math.min(this.best, this.pendingBound())) };
  }

  /** What a worker thread reports (parallel/branch-worker.ts). */
  threadResult(): { starters: number[]; rawTotal: number; nodes: number; halted: boolean; pendingRaw: number; partial: OpenPiece | null } {
    return {
      starters: this.bestSet,
      rawTotal: this.ownBest,
      nodes: this.meter.nodes,
      halted: this.meter.halted,
      pendingRaw: this.pendingBound(),
      partial: this.partial,
    };
  }

  outcome(resume: SearchResume): ExhaustiveOutcome {
    const { complete } = this.outcomeCore();
    this.meter.finish();
    return {
      state: { starters: this.bestSet, total: this.ownBest * this.scale },
      complete,
      stopped: this.meter.stopped,
      nodes: this.meter.nodes,
      lowerBound: resume.lowerRaw * this.scale,
      searchLeft: complete ? 0 : this.meter.left(),
      resume,
      resumed: resume.runs > 1,
    };
  }

  private root(root: Root): void {
    const r = this.k - root.set.length;
    const size = this.sets(root.cand.length, r);
    if (size === 0 || this.pruneAt(Math.max(this.floor, root.bound))) {
      this.meter.close(size);
      return;
    }
    const s = stateOfSet(this.ctx, root.set);
    if (!s) {
      this.meter.close(size);
      return;
    }
    if (r === 0) {
      this.leaf(s.rawTotal, () => [...s.starters]);
      this.meter.close(1);
      return;
    }
    this.node(this.levels[0].state.load(s, root.cand), r, 0, root.bound);
  }

  /** Smallest bound over everything not yet decided (raw): pending roots and pending children on the stack. */
  pendingBound(): number {
    // Before the pieces are known nothing below the incumbent is proven but the floor.
    if (!this.searching) return this.floor;
    let lb = this.best;
    // Alone, the items after the current one are pending too (with a link, the caller tracks them).
    if (!this.link) for (let q = this.rootAt + 1; q < this.roots.length; q++) lb = Math.min(lb, this.roots[q].bound);
    for (const lv of this.levels) {
      if (lv.size === 0) break;
      lb = Math.min(lb, lv.suffixMin[lv.at + 1]);
    }
    return Math.max(this.floor, lb);
  }

  /** `inherited`: a proven bound on every set below this node (its own bound as a child). */
  private node(s: CandState, r: number, depth: number, inherited: number): void {
    // A node of a resumed path was visited (and counted) by an earlier run.
    const resumed = depth < this.replayLen;
    if (!resumed && this.halts()) return;
    const lv = this.levels[depth];
    const m = s.m;
    orderCandidates(s, lv);
    if (r === 1) {
      for (let q = 0; q < m; q++) this.leaf(s.F - lv.gain[q], () => [...s.starters, s.ids[lv.order[q]]]);
      this.meter.close(m);
      return;
    }
    if (!this.nodeBounds(s, lv, r)) {
      this.meter.close(this.sets(m, r));
      return;
    }
    // A child's sets are the node's sets, so the node's bound holds for them too (inherited bound).
    for (let p = 0; p < m; p++) lv.childLb[p] = Math.max(lv.childLb[p], inherited);
    for (let p = 0; p < m; p++) lv.suffixMin[p] = Math.max(lv.suffixMin[p], inherited);
    lv.size = m;
    let start = 0;
    if (resumed) {
      // The children before the saved position were decided by an earlier run.
      start = this.replayPath[depth];
      this.meter.close(this.sets(m, r) - this.sets(m - start, r));
    }
    for (let p = start; p < m; p++) {
      if (!(resumed && p === start && depth + 1 < this.replayLen)) this.replayLen = Math.min(this.replayLen, depth + 1);
      lv.at = p;
      const rest = m - p - 1;
      const size = this.sets(rest, r - 1);
      if (size === 0) break;
      if (this.pruneAt(Math.max(this.floor, lv.childLb[p]))) {
        this.meter.close(size);
        continue;
      }
      if (r === 2) pairLeaves(s, lv, p, this);
      else if (r === 3) tripleLeaves(s, lv, p, this.trip, this);
      else {
        const next = this.levels[depth + 1];
        s.childInto(next.state, lv.order[p], lv.gain[p], lv.order, p + 1, m);
        this.node(next.state, r - 1, depth + 1, lv.childLb[p]);
        next.size = 0;
        if (this.meter.halted) {
          this.mark(depth, p, m, r);
          return;
        }
        continue;
      }
      this.meter.close(size);
      if (r === 3 && this.meter.tick()) {
        this.mark(depth, p + 1, m, r);
        return;
      }
    }
    lv.size = 0;
  }

  /** Counts a node; true when the search halts here (the node is then not counted: a resumed search visits it). */
  private halts(): boolean {
    const was = this.meter.halted;
    if (this.meter.tick()) {
      if (!was) this.meter.nodes--;
      return true;
    }
    if ((this.meter.nodes & 255) === 0) this.sync();
    return false;
  }

  /** On a halt: the node at `depth` has decided its children before `next` (the one after is open). */
  private mark(depth: number, next: number, m: number, r: number): void {
    if (this.trailLen < 0) this.trailLen = depth + 1;
    this.trail[depth] = next;
    this.trailInside += this.sets(m, r) - this.sets(m - next, r);
  }

  /**
   * Child bounds, raised by the node's dual bound (bound 4 of docs/bounds.md) on big subtrees;
   * false when the dual bound prunes the whole node.
   */
  nodeBounds(s: CandState, lv: Level, r: number): boolean {
    childBounds(s, lv, r, this.buf, this);
    if (r < DUAL_R || this.sets(s.m, r) < DUAL_MIN) return true;
    const dual = s.dualBound(r, this.scratch, this.picked);
    if (this.pruneAt(Math.max(this.floor, dual))) return false;
    const m = s.m;
    for (let p = 0; p < m; p++) if (lv.childLb[p] < dual) lv.childLb[p] = dual;
    for (let p = m - 1; p >= 0; p--) lv.suffixMin[p] = Math.min(lv.suffixMin[p + 1], lv.childLb[p]);
    return true;
  }
}
