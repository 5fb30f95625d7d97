/**
 * Nested dissection ordering (George, "Nested dissection of a regular finite element mesh",
 * SIAM J. Numer. Anal. 10, 1973; the level-structure bisection of George & Liu, Computer
 * Solution of Large Sparse Positive Definite Systems, 1981, chapter 8): split the people into
 * two halves by a small separator, order each half recursively, then the separator last. A 2-D
 * grid of n people then has O(n log n) fill and O(n^1.5) factorisation work.
 *
 * Bisection: a breadth-first level structure from a pseudo-peripheral person (the end of a
 * longest shortest path found by repeated searches), the separator taken from the level that
 * halves the part (among the levels near the middle, the smallest), and refined by keeping only
 * the separator people with a tie into the far side. Parts of at most LEAF people (or parts the
 * bisection cannot split) are ordered by approximate minimum degree (amd.ts). Deterministic.
 * Returns order[k] = the person eliminated k-th.
 */
import { amdOrder, type SymmetricPattern } from './amd';

/** Parts at most this large are ordered by minimum degree. */
export const LEAF = 256;

interface Work {
  readonly g: SymmetricPattern;
  /** Part label of every person (people of the current part share one label). */
  readonly label: Int32Array;
  readonly level: Int32Array;
  readonly queue: Int32Array;
  readonly local: Int32Array;
  readonly out: Int32Array;
  readonly leaf: number;
  nextLabel: number;
}

/** `leaf`: parts at most this large are ordered by minimum degree (smaller values only in tests). */
export function nestedDissectionOrder(g: SymmetricPattern, leaf = LEAF): Int32Array {
  const n = g.n;
  const w: Work = {
    g,
    label: new Int32Array(n),
    level: new Int32Array(n).fill(-1),
    queue: new Int32Array(n),
    local: new Int32Array(n).fill(-1),
    out: new Int32Array(n),
    leaf: Math.max(1, leaf),
    nextLabel: 1,
  };
  // Explicit stack of parts, each with the start of its slice of the order.
  const stack: { members: Int32Array; at: number }[] = [{ members: Int32Array.from({ length: n }, (_, i) => i), at: 0 }];
  while (stack.length > 0) {
    const { members, at } = stack.pop()!;
    for (const part of dissect(w, members, at)) stack.push(part);
  }
  return w.out;
}

/**
 * Orders one part occupying order[at .. at + size): a leaf by minimum degree, or its separator at
 * the end of the slice; returns the sub-parts (connected parts, or the two sides) with their slices.
 */
function dissect(w: Work, members: Int32Array, at: number): { members: Int32Array; at: number }[] {
  const lab = w.nextLabel++;
  for (const v of members) w.label[v] = lab;
  if (members.length <= w.leaf) {
    w.out.set(leafOrder(w, members, lab), at);
    return [];
  }
  const comps = components(w, members, lab);
  if (comps.length > 1) {
    let offset = at;
    return comps.map((c) => {
      const part = { members: c, at: offset };
      offset += c.length;
      return part;
    });
  }
  const split = bisect(w, members, lab);
  if (!split) {
    w.out.set(leafOrder(w, members, lab), at);
    return [];
  }
  const { a, b, sep } = split;
  w.out.set(sep, at + a.length + b.length);
  return [
    { members: a, at },
    { members: b, at: at + a.length },
  ];
}

/** Minimum-degree order of the part's induced pattern. */
function leafOrder(w: Work, members: Int32Array, lab: number): Int32Array {
  const { g, label, local } = w;
  const m = members.length;
  for (let q = 0; q < m; q++) local[members[q]] = q;
  const rowStart = new Int32Array(m + 1);
  for (let q = 0; q < m; q++) {
    const v = members[q];
    let c = 0;
    for (let e = g.rowStart[v]; e < g.rowStart[v + 1]; e++) if (label[g.col[e]] === lab && g.col[e] !== v) c++;
    rowStart[q + 1] = rowStart[q] + c;
  }
  const col = new Int32Array(rowStart[m]);
  for (let q = 0; q < m; q++) {
    const v = members[q];
    let p = rowStart[q];
    for (let e = g.rowStart[v]; e < g.rowStart[v + 1]; e++) {
      const u = g.col[e];
      if (label[u] === lab && u !== v) col[p++] = local[u];
    }
  }
  const sub = amdOrder({ n: m, rowStart, col });
  return sub.map((q) => members[q]);
}

/** Breadth-first levels from `root` within the part; fills w.level and w.queue, returns the level starts in the queue. */
function levels(w: Work, members: Int32Array, lab: number, root: number): number[] {
  const { g, label, level, queue } = w;
  for (const v of members) level[v] = -1;
  level[root] = 0;
  queue[0] = root;
  let head = 0;
  let tail = 1;
  const starts = [0];
  while (head < tail) {
    const v = queue[head++];
    for (let e = g.rowStart[v]; e < g.rowStart[v + 1]; e++) {
      const u = g.col[e];
      if (label[u] !== lab || level[u] >= 0) continue;
      level[u] = level[v] + 1;
      if (level[u] === starts.length) starts.push(tail);
      queue[tail++] = u;
    }
  }
  starts.push(tail);
  return starts;
}

/** Connected parts of the members (in the order met), each a list of people. */
function components(w: Work, members: Int32Array, lab: number): Int32Array[] {
  const { g, label, level } = w;
  for (const v of members) level[v] = -1;
  const comps: Int32Array[] = [];
  let reached = 0;
  for (const s of members) {
    if (level[s] >= 0) continue;
    const list = [s];
    level[s] = 0;
    for (let h = 0; h < list.length; h++) {
      const v = list[h];
      for (let e = g.rowStart[v]; e < g.rowStart[v + 1]; e++) {
        const u = g.col[e];
        if (label[u] === lab && level[u] < 0) {
          level[u] = 0;
          list.push(u);
        }
      }
    }
    reached += list.length;
    comps.push(Int32Array.from(list));
    if (comps.length === 1 && reached === members.length) break;
  }
  return comps;
}

/** A person far from everyone (George & Liu 1979): restart from the least-connected person of the last level while the depth grows. */
function pseudoPeripheral(w: Work, members: Int32Array, lab: number): { root: number; starts: number[] } {
  const { g, queue } = w;
  let root = members[0];
  let starts = levels(w, members, lab, root);
  for (let tries = 0; tries < 8; tries++) {
    const depth = starts.length - 2;
    let best = -1;
    let bestDeg = Infinity;
    for (let q = starts[depth]; q < starts[depth + 1]; q++) {
      const v = queue[q];
      const d = g.rowStart[v + 1] - g.rowStart[v];
      if (d < bestDeg) {
        best = v;
        bestDeg = d;
      }
    }
    const next = levels(w, members, lab, best);
    if (next.length <= starts.length) {
      starts = levels(w, members, lab, root);
      break;
    }
    root = best;
    starts = next;
  }
  return { root, starts };
}

/**
 * Separator from the level structure: among the levels whose removal leaves each side at least
 * a third of the part, the smallest (ties: nearest the middle), then refined to the people with a
 * tie into the far side. Null when no level splits the part (depth below 3).
 */
function bisect(w: Work, members: Int32Array, lab: number): { a: Int32Array; b: Int32Array; sep: Int32Array } | null {
  const { g, level, queue, label } = w;
  const { starts } = pseudoPeripheral(w, members, lab);
  const depth = starts.length - 1;
  if (depth < 3) return null;
  const m = members.length;
  let pick = -1;
  let pickScore = Infinity;
  for (let l = 1; l < depth - 1; l++) {
    const below = starts[l];
    const above = m - starts[l + 1];
    if (3 * below < m || 3 * above < m) continue;
    const size = starts[l + 1] - starts[l];
    const score = size * m + Math.abs(below - above);
    if (score < pickScore) {
      pick = l;
      pickScore = score;
    }
  }
  if (pick < 0) {
    // No level leaves a third each side: take the level holding the median person.
    for (let l = 1; l < depth - 1 && pick < 0; l++) if (starts[l + 1] > m / 2) pick = l;
    if (pick < 0) return null;
  }
  const a: number[] = [];
  const b: number[] = [];
  const sep: number[] = [];
  for (let q = 0; q < starts[pick]; q++) a.push(queue[q]);
  for (let q = starts[pick + 1]; q < m; q++) b.push(queue[q]);
  for (let q = starts[pick]; q < starts[pick + 1]; q++) {
    const v = queue[q];
    let far = false;
    for (let e = g.rowStart[v]; e < g.rowStart[v + 1] && !far; e++) {
      const u = g.col[e];
      far = label[u] === lab && level[u] === pick + 1;
    }
    (far ? sep : a).push(v);
  }
  if (a.length === 0 || b.length === 0) return null;
  return { a: Int32Array.from(a), b: Int32Array.from(b), sep: Int32Array.from(sep) };
}
