/**
 * Starting set of lazy greedy on large rooms: the required people, then one person per closed
 * group not yet covered (the member with the largest strength of ties pointing at them, a
 * common-practice proxy for the stationary weight); with one closed group and nothing
 * required, the best of the five members with the largest such strength, each checked by one
 * exact sparse solve. O(m + 5 solves).
 */
import type { PlanContext } from './plan-context';
import { SparseSystem } from './sparse-system';

export function classPickSparse(ctx: PlanContext): { set: number[]; evaluated: number[] } {
  const { room, n } = ctx;
  const { csr } = room;
  const inStrength = new Float64Array(n);
  for (let i = 0; i < n; i++) for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) inStrength[csr.col[e]] += csr.weight[e];
  const set = [...ctx.mustInclude];
  const isIn = new Uint8Array(n);
  for (const p of set) isIn[p] = 1;
  const evaluated: number[] = [];
  const open = ctx.classes.closedClasses.filter((cls) => !cls.some((p) => isIn[p]));
  if (open.length === 1 && set.length === 0) {
    const cands = open[0]
      .filter((p) => ctx.allowed[p])
      .sort((a, b) => inStrength[b] - inStrength[a] || a - b)
      .slice(0, 5);
    // Include the least-connected member too: its total estimates the worst single starter.
    const weakest = open[0].reduce((w, p) => (inStrength[p] < inStrength[w] ? p : w), open[0][0]);
    const ones = new Float64Array(n).fill(1);
    let best = -1;
    let bestT = Infinity;
    for (const p of [...cands, weakest]) {
      const sys = new SparseSystem(room, [p], 1e-8);
      const h = sys.solve(ones);
      let t = 0;
      for (let i = 0; i < n; i++) if (sys.active[i]) t += h[i];
      evaluated.push(t);
      if (cands.includes(p) && (best < 0 || t < bestT - 1e-12 * bestT || (Math.abs(t - bestT) <= 1e-12 * bestT && p < best))) {
        best = p;
        bestT = t;
      }
    }
    set.push(best);
    return { set, evaluated };
  }
  for (const cls of open) {
    let best = -1;
    for (const p of cls) if (ctx.allowed[p] && (best < 0 || inStrength[p] > inStrength[best])) best = p;
    set.push(best);
    isIn[best] = 1;
  }
  return { set, evaluated };
}
