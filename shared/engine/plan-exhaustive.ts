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
 * exponential in the worst case.
 */
import { AbsorbingState } from './dense-state';
import { CandState } from './plan-branch-state';
import type { PlanContext } from './plan-context';
import { childBounds, tripleLeaves, type Level, type TripleScratch } from './plan-branch-steps';
import { buildRoots, type Root } from './plan-roots';
import { SearchMeter, binomialTable } from './plan-search-meter';

export interface ExhaustiveOutcome {
  readonly state: { starters: number[]; total: number };
  readonly complete: boolean;
  readonly stopped: boolean;
  readonly nodes: number;
  /** Proven lower bound on the optimum (scaled hops). */
  readonly lowerBound: number;
  /** Share of the k-sets not decided (0 when complete). */
  readonly searchLeft: number;
}

/** Rooms up to this size are split into two-starter pieces before the search (memory O(n^3)). */
const SPLIT_LIMIT = 150;
/**
 * Nodes with at least DUAL_R starters still to add and DUAL_MIN k-sets below them also get the
 * dual bound (O(m r^2)). Measured on 60-person six-group rooms at k = 9, 10: at r = 4 and 5 it
 * pruned almost nothing and cost 30-40 % of the search time; from r = 6 it pays for itself.
 */
const DUAL_MIN = 5000;
const DUAL_R = 6;

export interface Incumbent {
  readonly starters: readonly number[];
  readonly rawTotal: number;
  readonly scale: number;
}

/**
 * What a search running on several threads shares (parallel/parallel-branch.ts): the best raw
 * total of all threads, and this thread's pending bound, closed share and node count.
 */
export interface SearchLink {
  best(): number;
  offer(raw: number): void;
  publish(pendingRaw: number, closed: number, nodes: number): void;
}

export function exhaustiveSearch(ctx: PlanContext, incumbent: Incumbent): ExhaustiveOutcome {
  const search = new BranchSearch(ctx, incumbent);
  const items = search.prepare();
  let next = 0;
  search.searchItems(items, () => (next < items.length ? next++ : -1));
  return search.outcome();
}

export class BranchSearch {
  private readonly k: number;
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

  constructor(
    private readonly ctx: PlanContext,
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

  private sets(m: number, r: number): number {
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

  space(): number {
    return this.meter.spaceSize();
  }

  get halted(): boolean {
    return this.meter.halted;
  }

  /** Roots, split into pieces on small rooms, sorted by bound (so the pending bound rises as they close). */
  prepare(): Root[] {
    const roots = buildRoots(this.ctx, this.k);
    let space = 0;
    for (const r of roots) space += this.sets(r.cand.length, this.k - r.set.length);
    this.meter.begin(space);
    const items = this.ctx.n <= SPLIT_LIMIT ? this.split(roots) : roots;
    return items
      .map((_, q) => q)
      .sort((a, b) => items[a].bound - items[b].bound || a - b)
      .map((q) => items[q]);
  }

  /** Searches items[take()] until take() returns -1 or the search halts. */
  searchItems(items: Root[], take: () => number): void {
    this.roots = items;
    for (;;) {
      const q = this.meter.halted ? -1 : take();
      if (q < 0) break;
      this.rootAt = q;
      this.root(items[q]);
      this.sync();
    }
    this.rootAt = this.link ? items.length : this.rootAt;
  }

  outcome(): ExhaustiveOutcome {
    const complete = !this.meter.halted;
    const lowerRaw = complete ? this.best : Math.min(this.best, this.pendingBound());
    this.meter.finish();
    return {
      state: { starters: this.bestSet, total: this.ownBest * this.scale },
      complete,
      stopped: this.meter.stopped,
      nodes: this.meter.nodes,
      lowerBound: Math.max(this.floor, lowerRaw) * this.scale,
      searchLeft: complete ? 0 : this.meter.left(),
    };
  }

  /** The state of a root or item set (ergodic data for the first starter, then downdates). */
  private stateOf(set: readonly number[]): AbsorbingState | null {
    const e = this.ctx.ergodic();
    try {
      if (e && e.pi[set[0]] > 0) {
        const s = AbsorbingState.fromErgodic(e, set[0]);
        for (let q = 1; q < set.length; q++) s.add(set[q]);
        return s;
      }
      return AbsorbingState.fromStarters(this.ctx.room, set);
    } catch {
      return null; // a singular system: some people cannot reach this set
    }
  }

  /**
   * Splits every root with at least three starters to add into its children (one more starter,
   * the child bound of node()), so the search closes many small pieces in order of their bound
   * and the pending lower bound rises steadily. O(|C|^2 r) per root.
   */
  private split(roots: Root[]): Root[] {
    const out: Root[] = [];
    const lv = this.levels[0];
    for (const root of roots) {
      const r = this.k - root.set.length;
      const size = this.sets(root.cand.length, r);
      if (r < 3 || size === 0) {
        if (size > 0) out.push(root);
        continue;
      }
      if (this.pruneAt(Math.max(this.floor, root.bound))) {
        this.meter.close(size);
        continue;
      }
      const full = this.stateOf(root.set);
      if (!full) {
        this.meter.close(size);
        continue;
      }
      const s = lv.state.load(full, root.cand);
      this.orderCandidates(s, lv);
      if (!this.nodeBounds(s, lv, r)) {
        this.meter.close(size);
        continue;
      }
      for (let p = 0; p < s.m; p++) {
        const part = this.sets(s.m - p - 1, r - 1);
        if (part === 0) break;
        if (this.pruneAt(Math.max(this.floor, lv.childLb[p]))) {
          this.meter.close(part);
          continue;
        }
        // Big pieces also carry their own dual bound (and are searched in the order of the stronger bound).
        let bound = Math.max(lv.childLb[p], root.bound);
        if (r - 1 >= DUAL_R && part >= DUAL_MIN) {
          const piece = this.levels[1].state;
          s.childInto(piece, lv.order[p], lv.gain[p], lv.order, p + 1, s.m);
          bound = Math.max(bound, piece.dualBound(r - 1, this.scratch, this.picked));
          if (this.pruneAt(Math.max(this.floor, bound))) {
            this.meter.close(part);
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

  private root(root: Root): void {
    const r = this.k - root.set.length;
    const size = this.sets(root.cand.length, r);
    if (size === 0 || this.pruneAt(Math.max(this.floor, root.bound))) {
      this.meter.close(size);
      return;
    }
    const s = this.stateOf(root.set);
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
    let lb = this.best;
    // Alone, the items after the current one are pending too (with a link, the caller tracks them).
    if (!this.link) for (let q = this.rootAt + 1; q < this.roots.length; q++) lb = Math.min(lb, this.roots[q].bound);
    for (const lv of this.levels) {
      if (lv.size === 0) break;
      lb = Math.min(lb, lv.suffixMin[lv.at + 1]);
    }
    return Math.max(this.floor, lb);
  }

  /** Local candidates sorted by decreasing gain at S (ties: earlier person first); insertion sort, m <= n. */
  private orderCandidates(s: CandState, lv: Level): void {
    const m = s.m;
    const { order, gain } = lv;
    const ids = s.ids;
    for (let q = 0; q < m; q++) {
      const v = Math.max(0, s.gain(q));
      let at = q;
      while (at > 0 && (gain[at - 1] < v || (gain[at - 1] === v && ids[order[at - 1]] > ids[q]))) {
        gain[at] = gain[at - 1];
        order[at] = order[at - 1];
        at--;
      }
      gain[at] = v;
      order[at] = q;
    }
  }

  /** `inherited`: a proven bound on every set below this node (its own bound as a child). */
  private node(s: CandState, r: number, depth: number, inherited: number): void {
    if (this.meter.tick()) return;
    if ((this.meter.nodes & 255) === 0) this.sync();
    const lv = this.levels[depth];
    const m = s.m;
    this.orderCandidates(s, lv);
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
    for (let p = 0; p < m; p++) {
      lv.at = p;
      const rest = m - p - 1;
      const size = this.sets(rest, r - 1);
      if (size === 0) break;
      if (this.pruneAt(Math.max(this.floor, lv.childLb[p]))) {
        this.meter.close(size);
        continue;
      }
      if (r === 2) this.pairLeaves(s, lv, p);
      else if (r === 3) tripleLeaves(s, lv, p, this.trip, this);
      else {
        const next = this.levels[depth + 1];
        s.childInto(next.state, lv.order[p], lv.gain[p], lv.order, p + 1, m);
        this.node(next.state, r - 1, depth + 1, lv.childLb[p]);
        next.size = 0;
        if (this.meter.halted) return;
        continue;
      }
      this.meter.close(size);
      if (r === 3 && this.meter.tick()) return;
    }
    lv.size = 0;
  }

  /** Exact totals of S + x + y for every later y (r = 2): F - ρ_x(S) - ρ_y(S + x). */
  private pairLeaves(s: CandState, lv: Level, p: number): void {
    const x = lv.order[p];
    const base = s.F - lv.gain[p];
    for (let q = p + 1; q < s.m; q++) {
      const y = lv.order[q];
      const t = base - s.pairGain(x, y);
      if (t < this.best - 1e-12 * Math.abs(this.best)) this.leaf(t, () => [...s.starters, s.ids[x], s.ids[y]]);
    }
  }

  /**
   * Child bounds, raised by the node's dual bound (bound 4 of docs/bounds.md) on big subtrees;
   * false when the dual bound prunes the whole node.
   */
  private nodeBounds(s: CandState, lv: Level, r: number): boolean {
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
