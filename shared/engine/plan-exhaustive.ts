/**
 * Exhaustive planner: branch and bound over k-sets (Land & Doig 1960) with the supermodular
 * bound of identity 6: below a partial set S with r starters still to add, no completion
 * beats total(S) - (sum of the r largest gains at S) (Borkar, Nair & Sanketh 2010; Nemhauser,
 * Wolsey & Fisher 1978). Sets are enumerated once each: the required people, one
 * representative per closed group (its earliest member in the set), then the other members
 * in increasing input order. The incumbent starts from greedy + swap. Returns a certified
 * optimum, or at the time limit the best found with a proven gap. Exponential, pruned;
 * O(n^2) per node.
 */
import { AbsorbingState } from './dense-state';
import { recordBound, type PlanContext } from './plan-context';

export interface ExhaustiveOutcome {
  readonly state: { starters: number[]; total: number };
  readonly complete: boolean;
  readonly nodes: number;
}

export function exhaustiveSearch(ctx: PlanContext, incumbent: AbsorbingState): ExhaustiveOutcome {
  const { n, k, allowed } = ctx;
  const scale = incumbent.scale;
  let bestRaw = incumbent.rawTotal;
  let bestSet = [...incumbent.starters];
  const isMust = new Uint8Array(n);
  for (const p of ctx.mustInclude) isMust[p] = 1;
  const openClasses = ctx.classes.closedClasses.filter((c) => !c.some((p) => isMust[p]));
  const openIndex = new Int32Array(n).fill(-1);
  openClasses.forEach((c, q) => c.forEach((p) => (openIndex[p] = q)));
  const e = ctx.ergodic();
  let nodes = 0;
  let aborted = false;
  const coverFloor = n - k;
  const stateAt: AbsorbingState[] = [];
  const pruneAt = (lbRaw: number) => lbRaw >= bestRaw - 1e-11 * Math.abs(bestRaw);

  const dfs = (s: AbsorbingState, from: number, rep: Int32Array, depth: number): void => {
    if (aborted) return;
    if ((++nodes & 63) === 0 && performance.now() > ctx.deadline) {
      aborted = true;
      return;
    }
    const r = k - s.starters.length;
    const elig: number[] = [];
    for (let x = from; x < n; x++) {
      if (!s.inT[x] || !allowed[x]) continue;
      const q = openIndex[x];
      if (q >= 0 && x < rep[q]) continue;
      elig.push(x);
    }
    if (elig.length < r) return;
    const gains = elig.map((x) => s.rawGain(x));
    // suffixTop[p] = sum of the (r - 1) largest gains among elig[p + 1 ..].
    const suffixTop = new Float64Array(elig.length + 1);
    const heap: number[] = [];
    let heapSum = 0;
    for (let p = elig.length - 1; p >= 0; p--) {
      suffixTop[p] = heapSum;
      if (r - 1 > 0) {
        if (heap.length < r - 1) {
          heap.push(gains[p]);
          heapSum += gains[p];
          heap.sort((a, b) => a - b);
        } else if (gains[p] > heap[0]) {
          heapSum += gains[p] - heap[0];
          heap[0] = gains[p];
          heap.sort((a, b) => a - b);
        }
      }
    }
    const floor = coverFloor / scale;
    for (let p = 0; p + r <= elig.length; p++) {
      const x = elig[p];
      const lb = Math.max(floor, s.rawTotal - gains[p] - suffixTop[p]);
      if (pruneAt(lb)) continue;
      if (r === 1) {
        const t = s.rawTotal - gains[p];
        if (t < bestRaw - 1e-12 * Math.abs(bestRaw)) {
          bestRaw = t;
          bestSet = [...s.starters, x];
        }
        continue;
      }
      let child = stateAt[depth];
      if (!child) child = stateAt[depth] = s.clone();
      else child.copyFrom(s);
      child.add(x);
      dfs(child, x + 1, rep, depth + 1);
      if (aborted) return;
    }
  };

  if (k === 1 && e && ctx.mustInclude.length === 0) {
    // Identity 3 scores every single starter exactly: the best allowed one is the optimum.
    let best = -1;
    for (let j = 0; j < n; j++) if (allowed[j] && (best < 0 || e.singleTotals[j] < e.singleTotals[best] * (1 - 1e-12))) best = j;
    return { state: { starters: [best], total: e.singleTotals[best] }, complete: true, nodes: n };
  }
  const roots = enumerateRoots(ctx, openClasses);
  for (const root of roots) {
    if (aborted) break;
    const rep = new Int32Array(openClasses.length);
    root.reps.forEach((p, q) => (rep[q] = p));
    let s: AbsorbingState;
    try {
      s = e && root.set.length === 1 ? AbsorbingState.fromErgodic(e, root.set[0]) : AbsorbingState.fromStarters(ctx.room, root.set);
    } catch {
      continue;
    }
    if (s.starters.length === k) {
      if (s.rawTotal < bestRaw - 1e-12 * Math.abs(bestRaw)) {
        bestRaw = s.rawTotal;
        bestSet = [...s.starters];
      }
      continue;
    }
    dfs(s, 0, rep, 0);
  }
  if (aborted) recordBound(ctx, AbsorbingState.fromStarters(ctx.room, bestSet));
  return { state: { starters: bestSet, total: bestRaw * scale }, complete: !aborted, nodes };
}

/** Root sets: the required people plus one allowed representative per open closed group. */
function enumerateRoots(ctx: PlanContext, openClasses: number[][]): { set: number[]; reps: number[] }[] {
  const out: { set: number[]; reps: number[] }[] = [];
  const choices = openClasses.map((c) => c.filter((p) => ctx.allowed[p]));
  const cur: number[] = [];
  const rec = (q: number) => {
    if (q === choices.length) {
      out.push({ set: [...ctx.mustInclude, ...cur], reps: [...cur] });
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
