/**
 * Vertex cover of the room: a set A such that every non-starter asks only starters, so each
 * non-starter hears in exactly one hop and total(A) = n - |A| (engine.md identity 6).
 * People who ask nobody (or only themselves) must be in it. Heuristics: maximal matching
 * (Gavril's 2-approximation, Garey & Johnson 1979) and max-degree greedy, each followed by
 * pruning of redundant people; O(m log n). Exact branch and bound (branch on a person of
 * largest degree: take it, or take all its neighbours) for rooms up to `exactLimit` people.
 */
import type { Csr } from './graph';
import { prepareRoom, type RoomInput } from './room';

export interface CoverResult {
  readonly size: number;
  /** Cover members in input order. */
  readonly cover: number[];
  /** True when the size is proven minimal. */
  readonly exact: boolean;
}

export interface CoverOptions {
  /** Largest room solved exactly (default 60 people with ties). */
  readonly exactLimit?: number;
  /** Node budget for the exact search (default 2e6). */
  readonly nodeLimit?: number;
}

/**
 * Covers of rooms asked with the default options, per CSR (a prepared room's ties never change):
 * a planning run, a k-sweep and the quality rank of every plan of a room share one computation.
 */
const coverCache = new WeakMap<object, CoverResult>();

export function vertexCover(input: RoomInput, options: CoverOptions = {}): CoverResult {
  const room = prepareRoom(input);
  const cacheable = options.exactLimit === undefined && options.nodeLimit === undefined;
  const hit = cacheable ? coverCache.get(room.csr) : undefined;
  if (hit) return { ...hit, cover: hit.cover.slice() };
  const result = computeCover(room.csr, options);
  if (cacheable) coverCache.set(room.csr, { ...result, cover: result.cover.slice() });
  return result;
}

/** The remaining ties as symmetric CSR over people not forced into the cover, rows sorted, no repeats. */
interface CoverGraph {
  readonly forced: Uint8Array;
  readonly start: Int32Array;
  readonly adj: Int32Array;
}

function coverGraph(csr: Csr): CoverGraph {
  const { n, rowStart, col } = csr;
  const forced = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (rowStart[i + 1] === rowStart[i]) forced[i] = 1;
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) if (col[e] === i) forced[i] = 1;
  }
  // Both directions of every tie between people not forced, then each row sorted and deduplicated.
  const count = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) {
    if (forced[i]) continue;
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      const j = col[e];
      if (forced[j]) continue;
      count[i + 1]++;
      count[j + 1]++;
    }
  }
  for (let i = 0; i < n; i++) count[i + 1] += count[i];
  const at = count.slice(0, n);
  const raw = new Int32Array(count[n]);
  for (let i = 0; i < n; i++) {
    if (forced[i]) continue;
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      const j = col[e];
      if (forced[j]) continue;
      raw[at[i]++] = j;
      raw[at[j]++] = i;
    }
  }
  const start = new Int32Array(n + 1);
  let q = 0;
  for (let i = 0; i < n; i++) {
    const row = raw.subarray(count[i], count[i + 1]).sort();
    let last = -1;
    for (let t = 0; t < row.length; t++)
      if (row[t] !== last) {
        last = row[t];
        raw[q++] = last;
      }
    start[i + 1] = q;
  }
  return { forced, start, adj: raw.subarray(0, q) };
}

function computeCover(csr: Csr, options: CoverOptions): CoverResult {
  const n = csr.n;
  const g = coverGraph(csr);
  const { forced, start, adj } = g;
  const degreeOf = (i: number) => start[i + 1] - start[i];
  const inCover = (order: ArrayLike<number>, len: number): Uint8Array => {
    const c = Uint8Array.from(forced);
    for (let q = 0; q < len; q++) c[order[q]] = 1;
    return c;
  };
  const prune = (c: Uint8Array): Uint8Array => {
    const order: number[] = [];
    for (let i = 0; i < n; i++) if (c[i] && !forced[i]) order.push(i);
    order.sort((a, b) => degreeOf(a) - degreeOf(b) || a - b);
    for (const v of order) {
      let all = true;
      for (let e = start[v]; e < start[v + 1]; e++)
        if (!c[adj[e]]) {
          all = false;
          break;
        }
      if (all) c[v] = 0;
    }
    return c;
  };
  const matched = maximalMatching(g);
  let best = prune(inCover(matched, matched.length));
  const count = (c: Uint8Array) => {
    let s = 0;
    for (let i = 0; i < n; i++) s += c[i];
    return s;
  };
  const greedy = prune(maxDegreeGreedy(g));
  if (count(greedy) < count(best)) best = greedy;
  let exact = adj.length === 0;
  const active: number[] = [];
  for (let i = 0; i < n; i++) if (degreeOf(i) > 0) active.push(i);
  if (!exact && active.length <= (options.exactLimit ?? 60)) {
    const lists: number[][] = Array.from({ length: n }, (_, i) => Array.from(adj.subarray(start[i], start[i + 1])));
    const r = exactCover(lists, active, count(best) - count(forced), options.nodeLimit ?? 2e6);
    if (r.cover) best = inCover(r.cover, r.cover.length);
    exact = r.complete;
  }
  const cover: number[] = [];
  for (let i = 0; i < n; i++) if (best[i]) cover.push(i);
  return { size: cover.length, cover, exact };
}

/** Both ends of each edge of a maximal matching (people in order, first free neighbour). */
function maximalMatching(g: CoverGraph): Int32Array {
  const { start, adj } = g;
  const n = g.forced.length;
  const matched = new Int32Array(n);
  let nm = 0;
  const used = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (used[i]) continue;
    for (let e = start[i]; e < start[i + 1]; e++) {
      const j = adj[e];
      if (!used[j]) {
        used[i] = used[j] = 1;
        matched[nm++] = i;
        matched[nm++] = j;
        break;
      }
    }
  }
  return matched.subarray(0, nm);
}

/** Max-degree greedy with a lazy max-heap (stale entries skipped): O(m log n). The chosen people plus the forced ones. */
function maxDegreeGreedy(g: CoverGraph): Uint8Array {
  const { forced, start, adj } = g;
  const n = forced.length;
  const deg = new Int32Array(n);
  for (let i = 0; i < n; i++) deg[i] = start[i + 1] - start[i];
  const c = Uint8Array.from(forced);
  const covered = new Uint8Array(n);
  const heap = new MaxHeap(n + adj.length);
  for (let i = 0; i < n; i++) if (deg[i] > 0) heap.push(deg[i], i);
  while (heap.size > 0) {
    const v = heap.pop();
    const d = heap.poppedKey;
    if (covered[v] || d !== deg[v] || d === 0) continue;
    c[v] = 1;
    covered[v] = 1;
    for (let e = start[v]; e < start[v + 1]; e++) {
      const u = adj[e];
      if (covered[u]) continue;
      deg[u]--;
      if (deg[u] > 0) heap.push(deg[u], u);
    }
    deg[v] = 0;
  }
  return c;
}

// eslint-disable-next-line max-lines-per-function -- the branch and bound's recursion shares its undo stacks, degrees and best set as closures; split, each step would pass them all around.
function exactCover(adj: number[][], active: number[], upper: number, nodeLimit: number): { cover: number[] | null; complete: boolean } {
  const n = adj.length;
  const removed = new Uint8Array(n);
  const deg = adj.map((a) => a.length);
  let best = upper;
  let bestSet: number[] | null = null;
  let nodes = 0;
  let complete = true;
  const cur: number[] = [];
  const take = (v: number, undo: number[]) => {
    removed[v] = 1;
    undo.push(v);
    for (const u of adj[v]) if (!removed[u]) deg[u]--;
  };
  const restore = (undo: number[]) => {
    for (let q = undo.length - 1; q >= 0; q--) {
      const v = undo[q];
      removed[v] = 0;
      for (const u of adj[v]) if (!removed[u]) deg[u]++;
    }
  };
  const rec = () => {
    if (++nodes > nodeLimit) {
      complete = false;
      return;
    }
    let v = -1;
    let edges = 0;
    for (const i of active)
      if (!removed[i] && deg[i] > 0) {
        edges += deg[i];
        if (v < 0 || deg[i] > deg[v]) v = i;
      }
    if (v < 0) {
      if (cur.length < best) {
        best = cur.length;
        bestSet = [...cur];
      }
      return;
    }
    edges /= 2;
    if (cur.length + Math.ceil(edges / deg[v]) >= best) return;
    const u1: number[] = [];
    take(v, u1);
    cur.push(v);
    rec();
    cur.pop();
    restore(u1);
    if (!complete) return;
    const u2: number[] = [];
    const ns = adj[v].filter((u) => !removed[u]);
    for (const u of ns) {
      take(u, u2);
      cur.push(u);
    }
    if (cur.length < best) rec();
    for (let q = 0; q < ns.length; q++) cur.pop();
    restore(u2);
  };
  rec();
  return { cover: bestSet, complete };
}

/** Binary max-heap of (key, person) on typed arrays of a fixed capacity; ties pop the earlier person first. */
class MaxHeap {
  private readonly keys: Int32Array;
  private readonly vals: Int32Array;
  size = 0;
  /** Key of the entry the last pop returned. */
  poppedKey = 0;
  constructor(capacity: number) {
    this.keys = new Int32Array(Math.max(1, capacity));
    this.vals = new Int32Array(Math.max(1, capacity));
  }
  private above(ka: number, va: number, kb: number, vb: number): boolean {
    return ka > kb || (ka === kb && va < vb);
  }
  push(key: number, val: number): void {
    const { keys, vals } = this;
    let i = this.size++;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!this.above(key, val, keys[p], vals[p])) break;
      keys[i] = keys[p];
      vals[i] = vals[p];
      i = p;
    }
    keys[i] = key;
    vals[i] = val;
  }
  /** Removes the top entry and returns its person (its key in `poppedKey`). */
  pop(): number {
    const { keys, vals } = this;
    const top = vals[0];
    this.poppedKey = keys[0];
    const size = --this.size;
    if (size > 0) {
      const k = keys[size];
      const v = vals[size];
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= size) break;
        const r = l + 1;
        const m = r < size && this.above(keys[r], vals[r], keys[l], vals[l]) ? r : l;
        if (!this.above(keys[m], vals[m], k, v)) break;
        keys[i] = keys[m];
        vals[i] = vals[m];
        i = m;
      }
      keys[i] = k;
      vals[i] = v;
    }
    return top;
  }
}
