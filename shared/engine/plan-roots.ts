/**
 * Roots of the branch and bound (plan-exhaustive.ts): the pieces every k-set falls into once,
 * each with a proven bound on the sets below it. O(n^2 log n) with ergodic data, else O(roots n).
 */
import { firstStarterBounds } from './plan-bounds';
import type { PlanContext } from './plan-context';

/** The sets `set` ∪ B with B a subset of `cand` of the remaining size. */
export interface Root {
  readonly set: number[];
  readonly cand: Int32Array;
  /** Proven bound (raw) on every set below this root. */
  readonly bound: number;
}

/**
 * Root nodes. One closed class holding everybody (ergodic data with pi > 0 everywhere) and no
 * required people: every first starter a, ordered by its single total, with the later people as
 * candidates; its bound comes from all pair totals (identity 4, bound 2 with S = {}). Otherwise:
 * the required people plus one representative per open closed group (its earliest member in
 * the set), with the later members of each group and everyone else as candidates.
 */
export function buildRoots(ctx: PlanContext, k: number): Root[] {
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
