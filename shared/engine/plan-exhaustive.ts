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
import { firstStarterBounds } from './plan-bounds';
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

export interface Root {
  readonly set: number[];
  readonly cand: Int32Array;
  /** Proven bound (raw) on every set below this root. */
  readonly bound: number;
}

/** Per-depth scratch of one node: its state, the candidates by decreasing gain, the child bounds. */
interface Level {
  readonly state: CandState;
  readonly order: Int32Array;
  readonly gain: Float64Array;
  readonly childLb: Float64Array;
  readonly suffixMin: Float64Array;
  /** Position of the child being explored (for the pending lower bound). */
  at: number;
  size: number;
}

/** Rooms up to this size are split into two-starter pieces before the search (memory O(n^3)). */
const SPLIT_LIMIT = 150;
/** Nodes with at least this many k-sets below them also get the dual bound (O(r m^2)). */
const DUAL_MIN = 5000;

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
  private best: number;
  private bestSet: number[];
  private readonly floor: number;
  private readonly levels: Level[] = [];
  private readonly binom: Float64Array[];
  private readonly meter: SearchMeter;
  private roots: Root[] = [];
  private rootAt = 0;
  private readonly buf: Float64Array;
  private readonly scratch: CandState;
  private readonly picked: Uint8Array;
  private readonly trip: Record<'col' | 'row' | 'diag' | 'h' | 'c' | 'g' | 'sufMax', Float64Array>;

  constructor(
    private readonly ctx: PlanContext,
    incumbent: Incumbent,
    private readonly link?: SearchLink,
  ) {
    const n = ctx.n;
    this.k = ctx.k;
    this.scale = incumbent.scale;
    this.best = incumbent.rawTotal;
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

  private pruneAt(lb: number): boolean {
    return lb >= this.best - 1e-11 * Math.abs(this.best);
  }

  private leaf(total: number, set: () => number[]): void {
    if (total < this.best - 1e-12 * Math.abs(this.best)) {
      this.best = total;
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
      state: { starters: this.bestSet, total: this.best * this.scale },
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
        const cand = new Int32Array(s.m - p - 1);
        for (let q = p + 1; q < s.m; q++) cand[q - p - 1] = s.ids[lv.order[q]];
        out.push({ set: [...root.set, s.ids[lv.order[p]]], cand, bound: lv.childLb[p] });
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
    this.node(this.levels[0].state.load(s, root.cand), r, 0);
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

  private node(s: CandState, r: number, depth: number): void {
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
      else if (r === 3) this.tripleLeaves(s, lv, p);
      else {
        const next = this.levels[depth + 1];
        s.childInto(next.state, lv.order[p], lv.gain[p], lv.order, p + 1, m);
        this.node(next.state, r - 1, depth + 1);
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
   * r = 3: every completion S + x + y + z with x = order[p] and y, z later, evaluated in O(1)
   * each (identity 1 applied twice to the entries of y and z), skipping y when even the largest
   * later ρ_z(S + x) cannot bring the total below the best (supermodularity: ρ_z(S + x + y) <= ρ_z(S + x)).
   */
  private tripleLeaves(s: CandState, lv: Level, p: number): void {
    const { N, h, c, m } = s;
    const x = lv.order[p];
    const rx = x * m;
    const nxx = N[rx + x];
    const t = this.trip;
    const len = m - p - 1;
    // Entries of the state after adding x, for the later candidates (index q - p - 1).
    for (let q = 0; q < len; q++) {
      const a = lv.order[p + 1 + q];
      const fa = N[a * m + x] / nxx;
      t.col[q] = fa;
      t.row[q] = N[rx + a];
      t.diag[q] = N[a * m + a] - fa * N[rx + a];
      t.h[q] = h[a] - fa * h[x];
      t.c[q] = c[a] - (c[x] * N[rx + a]) / nxx;
      t.sufMax[q] = Math.max(0, (t.h[q] * t.c[q]) / t.diag[q]);
    }
    let run = 0;
    for (let q = len - 1; q >= 0; q--) {
      const g = t.sufMax[q];
      t.sufMax[q] = run; // now: largest ρ_z(S + x) over z after q
      t.g[q] = g;
      run = Math.max(run, g);
    }
    const base = s.F - lv.gain[p];
    const ids = s.ids;
    for (let qy = 0; qy + 1 < len; qy++) {
      const after = base - t.g[qy];
      if (this.pruneAt(Math.max(this.floor, after - t.sufMax[qy]))) continue;
      const y = lv.order[p + 1 + qy];
      const dy = t.diag[qy];
      const hy = t.h[qy];
      const cy = t.c[qy];
      const ry = y * m;
      for (let qz = qy + 1; qz < len; qz++) {
        const z = lv.order[p + 1 + qz];
        const nzy = N[z * m + y] - t.col[qz] * t.row[qy];
        const nyz = N[ry + z] - t.col[qy] * t.row[qz];
        const f = nzy / dy;
        const gz = ((t.h[qz] - f * hy) * (t.c[qz] - (cy * nyz) / dy)) / (t.diag[qz] - f * nyz);
        const total = after - gz;
        if (total < this.best - 1e-12 * Math.abs(this.best)) this.leaf(total, () => [...s.starters, ids[x], ids[y], ids[z]]);
      }
    }
  }

  /**
   * Child bounds, raised by the node's dual bound (bound 4 of docs/bounds.md) on big subtrees;
   * false when the dual bound prunes the whole node.
   */
  private nodeBounds(s: CandState, lv: Level, r: number): boolean {
    this.childBounds(s, lv, r);
    if (r < 4 || this.sets(s.m, r) < DUAL_MIN) return true;
    const dual = s.dualBound(r, this.scratch, this.picked);
    if (this.pruneAt(Math.max(this.floor, dual))) return false;
    const m = s.m;
    for (let p = 0; p < m; p++) if (lv.childLb[p] < dual) lv.childLb[p] = dual;
    for (let p = m - 1; p >= 0; p--) lv.suffixMin[p] = Math.min(lv.suffixMin[p + 1], lv.childLb[p]);
    return true;
  }

  /**
   * childLb[p] = F - ρ_x(S) - top_{r-1} { min(ρ_y(S + x), ρ_y(S)) : y after x }, x = order[p];
   * suffixMin[p] = min over children p.. of childLb. The scan of later candidates stops once
   * the r - 1 kept values are all at least the next ρ_y(S) (gains are sorted, and ρ_y(S + x) <= ρ_y(S)).
   */
  private childBounds(s: CandState, lv: Level, r: number): void {
    const m = s.m;
    const want = r - 1;
    const buf = this.buf;
    const gain = lv.gain;
    // Cheap bound first: with gains at S (sorted), child p's bound is at least
    // F - (gain[p] + ... + gain[p + r - 1]), which only grows with p; once it prunes, all later children are pruned.
    let window = 0;
    for (let q = 0; q < Math.min(r, m); q++) window += gain[q];
    for (let p = 0; p < m; p++) {
      if (p > 0) window += (p + r - 1 < m ? gain[p + r - 1] : 0) - gain[p - 1];
      if (p + r > m) {
        lv.childLb[p] = Infinity;
        continue;
      }
      const cheap = s.F - window;
      if (this.pruneAt(cheap)) {
        for (let q = p; q < m; q++) lv.childLb[q] = cheap;
        break;
      }
      const x = lv.order[p];
      let kept = 0;
      let sum = 0;
      for (let q = p + 1; q < m; q++) {
        const cap = gain[q];
        if (kept === want && buf[kept - 1] >= cap) break;
        const v = Math.min(cap, Math.max(0, s.pairGain(x, lv.order[q])));
        if (kept < want) {
          let at = kept++;
          while (at > 0 && buf[at - 1] < v) {
            buf[at] = buf[at - 1];
            at--;
          }
          buf[at] = v;
          sum += v;
        } else if (v > buf[kept - 1]) {
          sum += v - buf[kept - 1];
          let at = kept - 1;
          while (at > 0 && buf[at - 1] < v) {
            buf[at] = buf[at - 1];
            at--;
          }
          buf[at] = v;
        }
      }
      lv.childLb[p] = kept < want ? Infinity : s.F - gain[p] - sum;
    }
    lv.suffixMin[m] = Infinity;
    for (let p = m - 1; p >= 0; p--) lv.suffixMin[p] = Math.min(lv.suffixMin[p + 1], lv.childLb[p]);
  }
}

/**
 * Root nodes. One closed class holding everybody (ergodic data with pi > 0 everywhere) and no
 * required people: every first starter a, ordered by its single total, with the later people as
 * candidates; its bound comes from all pair totals (identity 4, bound 2 with S = {}). Otherwise:
 * the required people plus one representative per open closed group (its earliest member in
 * the set), with the later members of each group and everyone else as candidates.
 */
function buildRoots(ctx: PlanContext, k: number): Root[] {
  const { n, allowed } = ctx;
  const isMust = new Uint8Array(n);
  for (const p of ctx.mustInclude) isMust[p] = 1;
  const first = ctx.mustInclude.length === 0 ? firstStarterBounds(ctx, k) : null;
  if (first) {
    return first.order.map((a, p) => ({ set: [a], cand: Int32Array.from(first.order.slice(p + 1)), bound: first.bound[p] }));
  }
  const openClasses = ctx.classes.closedClasses.filter((c) => !c.some((p) => isMust[p]));
  const classOf = new Int32Array(n).fill(-1);
  openClasses.forEach((c, q) => c.forEach((p) => (classOf[p] = q)));
  const out: Root[] = [];
  const choices = openClasses.map((c) => c.filter((p) => allowed[p]));
  const cur: number[] = [];
  const rec = (q: number) => {
    if (q === choices.length) {
      const set = [...ctx.mustInclude, ...cur];
      const inSet = new Set(set);
      const cand: number[] = [];
      for (let x = 0; x < n; x++) {
        if (inSet.has(x) || !allowed[x]) continue;
        const c = classOf[x];
        if (c >= 0 && x < cur[c]) continue;
        cand.push(x);
      }
      out.push({ set, cand: Int32Array.from(cand), bound: -Infinity });
      return;
    }
    for (const p of choices[q]) {
      cur.push(p);
      rec(q + 1);
      cur.pop();
    }
  };
  rec(0);
  return out;
}
