/**
 * Vertex cover of the room: a set A such that every non-starter asks only starters, so each
 * non-starter hears in exactly one hop and total(A) = n - |A| (engine.md identity 6).
 * People who ask nobody (or only themselves) must be in it. Heuristics: maximal matching
 * (Gavril's 2-approximation, Garey & Johnson 1979) and max-degree greedy, each followed by
 * pruning of redundant people; O(m log n). Exact branch and bound (branch on a person of
 * largest degree: take it, or take all its neighbours) for rooms up to `exactLimit` people.
 */
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

export function vertexCover(input: RoomInput, options: CoverOptions = {}): CoverResult {
  const room = prepareRoom(input);
  const { n, csr } = room;
  const forced = new Uint8Array(n);
  const nbr: Set<number>[] = Array.from({ length: n }, () => new Set());
  for (let i = 0; i < n; i++) {
    if (csr.rowStart[i + 1] === csr.rowStart[i]) forced[i] = 1;
    for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) {
      const j = csr.col[e];
      if (j === i) forced[i] = 1;
      else {
        nbr[i].add(j);
        nbr[j].add(i);
      }
    }
  }
  // Edges still to cover: those with no forced end.
  const adj: number[][] = Array.from({ length: n }, (_, i) =>
    forced[i] ? [] : [...nbr[i]].filter((j) => !forced[j]).sort((a, b) => a - b),
  );
  const inCover = (order: number[]): Uint8Array => {
    const c = Uint8Array.from(forced);
    for (const v of order) c[v] = 1;
    return c;
  };
  const prune = (c: Uint8Array): Uint8Array => {
    const order = Array.from({ length: n }, (_, i) => i)
      .filter((i) => c[i] && !forced[i])
      .sort((a, b) => adj[a].length - adj[b].length || a - b);
    for (const v of order) if (adj[v].every((u) => c[u])) c[v] = 0;
    return c;
  };
  // Maximal matching.
  const matched: number[] = [];
  const used = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (used[i]) continue;
    for (const j of adj[i])
      if (!used[j]) {
        used[i] = used[j] = 1;
        matched.push(i, j);
        break;
      }
  }
  let best = prune(inCover(matched));
  // Max-degree greedy with a lazy max-heap (stale entries skipped): O(m log n).
  const deg = adj.map((a) => a.length);
  const chosen: number[] = [];
  const covered = new Uint8Array(n);
  const heap = new MaxHeap();
  for (let i = 0; i < n; i++) if (deg[i] > 0) heap.push(deg[i], i);
  while (heap.size > 0) {
    const [d, v] = heap.pop();
    if (covered[v] || d !== deg[v] || d === 0) continue;
    chosen.push(v);
    covered[v] = 1;
    for (const u of adj[v]) {
      if (covered[u]) continue;
      deg[u]--;
      if (deg[u] > 0) heap.push(deg[u], u);
    }
    deg[v] = 0;
  }
  const greedy = prune(inCover(chosen));
  const count = (c: Uint8Array) => c.reduce((s, x) => s + x, 0);
  if (count(greedy) < count(best)) best = greedy;
  let exact = adj.every((a) => a.length === 0);
  const active = adj.map((a, i) => (a.length > 0 ? i : -1)).filter((i) => i >= 0);
  if (!exact && active.length <= (options.exactLimit ?? 60)) {
    const r = exactCover(adj, active, count(best) - count(forced), options.nodeLimit ?? 2e6);
    if (r.cover) best = inCover(r.cover);
    exact = r.complete;
  }
  const cover: number[] = [];
  for (let i = 0; i < n; i++) if (best[i]) cover.push(i);
  return { size: cover.length, cover, exact };
}

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

/** Binary max-heap of (key, person); ties pop the earlier person first. */
class MaxHeap {
  private keys: number[] = [];
  private vals: number[] = [];
  get size(): number {
    return this.keys.length;
  }
  private above(a: number, b: number): boolean {
    return this.keys[a] > this.keys[b] || (this.keys[a] === this.keys[b] && this.vals[a] < this.vals[b]);
  }
  private swap(a: number, b: number): void {
    [this.keys[a], this.keys[b]] = [this.keys[b], this.keys[a]];
    [this.vals[a], this.vals[b]] = [this.vals[b], this.vals[a]];
  }
  push(key: number, val: number): void {
    this.keys.push(key);
    this.vals.push(val);
    let i = this.keys.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!this.above(i, p)) break;
      this.swap(i, p);
      i = p;
    }
  }
  pop(): [number, number] {
    const top: [number, number] = [this.keys[0], this.vals[0]];
    const lastK = this.keys.pop()!;
    const lastV = this.vals.pop()!;
    if (this.keys.length > 0) {
      this.keys[0] = lastK;
      this.vals[0] = lastV;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < this.keys.length && this.above(l, m)) m = l;
        if (r < this.keys.length && this.above(r, m)) m = r;
        if (m === i) break;
        this.swap(i, m);
        i = m;
      }
    }
    return top;
  }
}
