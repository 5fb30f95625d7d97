/**
 * Steps of the branch and bound (plan-exhaustive.ts) that need no search state beyond one node:
 * the child bounds of a node (bound 2 per child and the window bound, docs/bounds.md section 5)
 * in O(|C| r) per child, and the exact totals of every three-starter completion in O(1) each
 * (identity 1 applied twice).
 */
import type { CandState } from './plan-branch-state';

/** Per-depth scratch of one node: its state, the candidates by decreasing gain, the child bounds. */
export interface Level {
  readonly state: CandState;
  readonly order: Int32Array;
  readonly gain: Float64Array;
  readonly childLb: Float64Array;
  readonly suffixMin: Float64Array;
  /** Position of the child being explored (for the pending lower bound). */
  at: number;
  size: number;
}

/** What the steps need from the search: the floor, pruning, and the incumbent. */
export interface LeafHost {
  readonly floor: number;
  pruneAt(lb: number): boolean;
  improves(total: number): boolean;
  leaf(total: number, set: () => number[]): void;
}

export type TripleScratch = Record<'col' | 'row' | 'diag' | 'h' | 'c' | 'g' | 'sufMax', Float64Array>;

/**
 * r = 3: every completion S + x + y + z with x = order[p] and y, z later, evaluated in O(1)
 * each (identity 1 applied twice to the entries of y and z), skipping y when even the largest
 * later ρ_z(S + x) cannot bring the total below the best (supermodularity: ρ_z(S + x + y) <= ρ_z(S + x)).
 */
export function tripleLeaves(s: CandState, lv: Level, p: number, trip: TripleScratch, host: LeafHost): void {
  const { N, h, c, m } = s;
  const x = lv.order[p];
  const rx = x * m;
  const nxx = N[rx + x];
  const t = trip;
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
    if (host.pruneAt(Math.max(host.floor, after - t.sufMax[qy]))) continue;
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
      if (host.improves(total)) host.leaf(total, () => [...s.starters, ids[x], ids[y], ids[z]]);
    }
  }
}

/**
 * childLb[p] = F - ρ_x(S) - top_{r-1} { min(ρ_y(S + x), ρ_y(S)) : y after x }, x = order[p];
 * suffixMin[p] = min over children p.. of childLb. The scan of later candidates stops once
 * the r - 1 kept values are all at least the next ρ_y(S) (gains are sorted, and ρ_y(S + x) <= ρ_y(S)).
 */
export function childBounds(s: CandState, lv: Level, r: number, buf: Float64Array, host: LeafHost): void {
  const m = s.m;
  const want = r - 1;
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
    if (host.pruneAt(cheap)) {
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

/** Local candidates sorted by decreasing gain at S (ties: earlier person first); insertion sort, m <= n. */
export function orderCandidates(s: CandState, lv: Level): void {
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

/** Exact totals of S + x + y for every later y (r = 2): F - ρ_x(S) - ρ_y(S + x), x = order[p]. */
export function pairLeaves(s: CandState, lv: Level, p: number, host: LeafHost): void {
  const x = lv.order[p];
  const base = s.F - lv.gain[p];
  for (let q = p + 1; q < s.m; q++) {
    const y = lv.order[q];
    const t = base - s.pairGain(x, y);
    if (host.improves(t)) host.leaf(t, () => [...s.starters, s.ids[x], s.ids[y]]);
  }
}
