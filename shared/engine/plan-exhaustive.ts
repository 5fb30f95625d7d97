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
 * completion. Cost O(n^2) per expanded node plus O(|C| r) per child; exponential in the worst case.
 */
import { AbsorbingState } from './dense-state';
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

interface Root {
  readonly set: number[];
  readonly cand: Int32Array;
  /** Proven bound (raw) on every set below this root. */
  readonly bound: number;
}

/** Per-depth scratch arrays of one node. */
interface Level {
  state: AbsorbingState | null;
  order: Int32Array;
  gain: Float64Array;
  childLb: Float64Array;
  suffixMin: Float64Array;
  /** Position of the child being explored (for the pending lower bound). */
  at: number;
  size: number;
}

export function exhaustiveSearch(ctx: PlanContext, incumbent: { starters: number[]; rawTotal: number; scale: number }): ExhaustiveOutcome {
  const search = new BranchSearch(ctx, incumbent);
  return search.run();
}

class BranchSearch {
  private readonly n: number;
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
  private readonly gainOf: Float64Array;
  private readonly idx: number[] = [];

  constructor(
    private readonly ctx: PlanContext,
    incumbent: { starters: number[]; rawTotal: number; scale: number },
  ) {
    this.n = ctx.n;
    this.k = ctx.k;
    this.scale = incumbent.scale;
    this.best = incumbent.rawTotal;
    this.bestSet = [...incumbent.starters];
    this.floor = ctx.n - ctx.k; // raw hops: every non-starter needs at least one (identity 6)
    this.binom = binomialTable(ctx.n, ctx.k);
    this.meter = new SearchMeter(
      ctx,
      () => this.pendingBound() * this.scale,
      () => this.best * this.scale,
    );
    this.buf = new Float64Array(ctx.k + 1);
    this.gainOf = new Float64Array(ctx.n);
    for (let d = 0; d <= ctx.k; d++)
      this.levels.push({
        state: null,
        order: new Int32Array(ctx.n),
        gain: new Float64Array(ctx.n),
        childLb: new Float64Array(ctx.n),
        suffixMin: new Float64Array(ctx.n + 1),
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
    }
  }

  run(): ExhaustiveOutcome {
    this.roots = buildRoots(this.ctx, this.k);
    let space = 0;
    for (const r of this.roots) space += this.sets(r.cand.length, this.k - r.set.length);
    this.meter.begin(space);
    const order = this.roots.map((_, q) => q).sort((a, b) => this.roots[a].bound - this.roots[b].bound || a - b);
    const sortedRoots = order.map((q) => this.roots[q]);
    this.roots = sortedRoots;
    const e = this.ctx.ergodic();
    for (this.rootAt = 0; this.rootAt < this.roots.length; this.rootAt++) {
      const root = this.roots[this.rootAt];
      const r = this.k - root.set.length;
      const size = this.sets(root.cand.length, r);
      if (this.pruneAt(Math.max(this.floor, root.bound)) || size === 0) {
        this.meter.close(size);
        continue;
      }
      let s: AbsorbingState;
      try {
        s = e && root.set.length === 1 ? AbsorbingState.fromErgodic(e, root.set[0]) : AbsorbingState.fromStarters(this.ctx.room, root.set);
      } catch {
        this.meter.close(size);
        continue;
      }
      if (r === 0) {
        this.leaf(s.rawTotal, () => [...s.starters]);
        this.meter.close(1);
        continue;
      }
      this.node(s, root.cand, root.cand.length, r, 0);
      if (this.meter.halted) break;
    }
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

  /** Smallest bound over everything not yet decided (raw): pending roots and pending children on the stack. */
  private pendingBound(): number {
    let lb = this.best;
    for (let q = this.rootAt + 1; q < this.roots.length; q++) lb = Math.min(lb, this.roots[q].bound);
    for (const lv of this.levels) {
      if (lv.size === 0) break;
      lb = Math.min(lb, lv.suffixMin[lv.at + 1]);
    }
    return Math.max(this.floor, lb);
  }

  /** Gains at s over the candidates, sorted by decreasing gain (ties: earlier person first). */
  private orderCandidates(s: AbsorbingState, cand: Int32Array, m: number, lv: Level): void {
    const g = this.gainOf;
    const idx = this.idx;
    idx.length = m;
    for (let q = 0; q < m; q++) {
      const x = cand[q];
      idx[q] = x;
      g[x] = Math.max(0, s.rawGain(x));
    }
    idx.sort((a, b) => g[b] - g[a] || a - b);
    for (let q = 0; q < m; q++) {
      lv.order[q] = idx[q];
      lv.gain[q] = g[idx[q]];
    }
  }

  private node(s: AbsorbingState, cand: Int32Array, m: number, r: number, depth: number): void {
    if (this.meter.tick()) return;
    const lv = this.levels[depth];
    this.orderCandidates(s, cand, m, lv);
    const F = s.rawTotal;
    if (r === 1) {
      for (let q = 0; q < m; q++) this.leaf(F - lv.gain[q], () => [...s.starters, lv.order[q]]);
      this.meter.close(m);
      return;
    }
    this.childBounds(s, lv, m, r);
    lv.size = m;
    let child: AbsorbingState | null = null;
    for (let p = 0; p < m; p++) {
      lv.at = p;
      const rest = m - p - 1;
      const size = this.sets(rest, r - 1);
      if (size === 0) break;
      const lb = Math.max(this.floor, lv.childLb[p]);
      if (this.pruneAt(lb)) {
        this.meter.close(size);
        continue;
      }
      const x = lv.order[p];
      if (r === 2) {
        this.pairLeaves(s, lv, p, m);
        this.meter.close(size);
        continue;
      }
      const next = this.levels[depth + 1];
      child = next.state ? next.state.copyFrom(s) : (next.state = s.clone());
      child.add(x);
      this.node(child, lv.order.subarray(p + 1, m), rest, r - 1, depth + 1);
      next.size = 0;
      if (this.meter.halted) return;
    }
    lv.size = 0;
  }

  /** Exact totals of S + x + y for every later y (r = 2): F - ρ_x(S) - ρ_y(S + x). */
  private pairLeaves(s: AbsorbingState, lv: Level, p: number, m: number): void {
    const x = lv.order[p];
    const base = s.rawTotal - lv.gain[p];
    for (let q = p + 1; q < m; q++) {
      const y = lv.order[q];
      this.leaf(base - pairGain(s, x, y), () => [...s.starters, x, y]);
    }
  }

  /**
   * childLb[p] = F - ρ_x(S) - top_{r-1} { min(ρ_y(S + x), ρ_y(S)) : y after x }, x = order[p];
   * suffixMin[p] = min over children p.. of childLb. The scan of later candidates stops once
   * the r - 1 kept values are all at least the next ρ_y(S) (gains are sorted, and ρ_y(S + x) <= ρ_y(S)).
   */
  private childBounds(s: AbsorbingState, lv: Level, m: number, r: number): void {
    const F = s.rawTotal;
    const want = r - 1;
    const buf = this.buf;
    for (let p = 0; p < m; p++) {
      const x = lv.order[p];
      let kept = 0;
      let sum = 0;
      for (let q = p + 1; q < m; q++) {
        const cap = lv.gain[q];
        if (kept === want && buf[kept - 1] >= cap) break;
        const v = Math.min(cap, Math.max(0, pairGain(s, x, lv.order[q])));
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
      lv.childLb[p] = kept < want ? Infinity : F - lv.gain[p] - sum;
    }
    lv.suffixMin[m] = Infinity;
    for (let p = m - 1; p >= 0; p--) lv.suffixMin[p] = Math.min(lv.suffixMin[p + 1], lv.childLb[p]);
  }
}

/**
 * ρ_y(S + x), the gain of y after x joins S, from the state of S in O(1) (identity 1 on the
 * entries of y): N'_yy = N_yy - N_yx N_xy / N_xx, h'_y = h_y - N_yx h_x / N_xx,
 * c'_y = c_y - c_x N_xy / N_xx, and ρ_y = h'_y c'_y / N'_yy (identity 2).
 */
export function pairGain(s: AbsorbingState, x: number, y: number): number {
  const { N, h, c, n } = s;
  const nxx = N[x * n + x];
  const nyx = N[y * n + x];
  const nxy = N[x * n + y];
  const nyy = N[y * n + y] - (nyx * nxy) / nxx;
  const hy = h[y] - (nyx * h[x]) / nxx;
  const cy = c[y] - (c[x] * nxy) / nxx;
  return (hy * cy) / nyy;
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
