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
  const { n, csr } = prepareRoom(input);
  const { forced, adj } = coverGraph(n, csr.rowStart, csr.col);
  const inCover = (order: number[]): Uint8Array => {
    const c = Uint8Array.from(forced);
    for (const v of order) c[v] = 1;
    return c;
  };
  let best = pruneCover(inCover(matchingOrder(adj)), forced, adj);
  const greedy = pruneCover(inCover(maxDegreeOrder(adj)), forced, adj);
  if (countMembers(greedy) < countMembers(best)) best = greedy;
  let exact = adj.every((a) => a.length === 0);
  const active = adj.map((a, i) => (a.length > 0 ? i : -1)).filter((i) => i >= 0);
  if (!exact && active.length <= (options.exactLimit ?? 60)) {
    const r = exactCover(adj, active, countMembers(best) - countMembers(forced), options.nodeLimit ?? 2e6);
    if (r.cover) best = inCover(r.cover);
    exact = r.complete;
  }
  const cover: number[] = [];
  for (let i = 0; i < n; i++) if (best[i]) cover.push(i);
  return { size: cover.length, cover, exact };
}

/**
 * The people who must be in every cover (they ask nobody, or themselves) and, for the rest,
 * the ties still to cover as sorted neighbour lists (ties with a forced end are covered already).
 */
function coverGraph(n: number, rowStart: Int32Array, col: Int32Array): { forced: Uint8Array; adj: number[][] } {
  const forced = new Uint8Array(n);
  const nbr: Set<number>[] = Array.from({ length: n }, () => new Set());
  for (let i = 0; i < n; i++) {
    if (rowStart[i + 1] === rowStart[i]) forced[i] = 1;
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      const j = col[e];
      if (j === i) forced[i] = 1;
      else {
        nbr[i].add(j);
        nbr[j].add(i);
      }
    }
  }
  const adj: number[][] = Array.from({ length: n }, (_, i) =>
    forced[i] ? [] : [...nbr[i]].filter((j) => !forced[j]).sort((a, b) => a - b),
  );
  return { forced, adj };
}

function countMembers(c: Uint8Array): number {
  return c.reduce((s, x) => s + x, 0);
}

/** Drops members whose neighbours are all members, fewest ties first. Changes `c` in place. */
function pruneCover(c: Uint8Array, forced: Uint8Array, adj: number[][]): Uint8Array {
  const order = Array.from({ length: adj.length }, (_, i) => i)
    .filter((i) => c[i] && !forced[i])
    .sort((a, b) => adj[a].length - adj[b].length || a - b);
  for (const v of order) if (adj[v].every((u) => c[u])) c[v] = 0;
  return c;
}

/** Both ends of a maximal matching, taken in person order. */
function matchingOrder(adj: number[][]): number[] {
  const matched: number[] = [];
  const used = new Uint8Array(adj.length);
  for (let i = 0; i < adj.length; i++) {
    if (used[i]) continue;
    for (const j of adj[i])
      if (!used[j]) {
        used[i] = used[j] = 1;
        matched.push(i, j);
        break;
      }
  }
  return matched;
}

/** Max-degree greedy with a lazy max-heap (stale entries skipped): O(m log n). */
function maxDegreeOrder(adj: number[][]): number[] {
  const n = adj.length;
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
  return chosen;
}

function exactCover(adj: number[][], active: number[], upper: number, nodeLimit: number): { cover: number[] | null; complete: boolean } {
  const search = new CoverSearch(adj, active, upper, nodeLimit);
  search.run();
  return { cover: search.bestSet, complete: search.complete };
}

/** The branch and bound of `exactCover`: the people taken so far, with their degrees kept current. */
class CoverSearch {
  private readonly removed: Uint8Array;
  private readonly deg: number[];
  private readonly cur: number[] = [];
  private best: number;
  private nodes = 0;
  bestSet: number[] | null = null;
  complete = true;

  constructor(
    private readonly adj: number[][],
    private readonly active: number[],
    upper: number,
    private readonly nodeLimit: number,
  ) {
    this.removed = new Uint8Array(adj.length);
    this.deg = adj.map((a) => a.length);
    this.best = upper;
  }

  run(): void {
    if (++this.nodes > this.nodeLimit) {
      this.complete = false;
      return;
    }
    const { v, edges } = this.branchPerson();
    if (v < 0) {
      if (this.cur.length < this.best) {
        this.best = this.cur.length;
        this.bestSet = [...this.cur];
      }
      return;
    }
    if (this.cur.length + Math.ceil(edges / this.deg[v]) >= this.best) return;
    this.takePerson(v);
    if (!this.complete) return;
    this.takeNeighbours(v);
  }

  /** The uncovered person of largest degree (-1 when every tie is covered) and the ties left. */
  private branchPerson(): { v: number; edges: number } {
    let v = -1;
    let edges = 0;
    for (const i of this.active)
      if (!this.removed[i] && this.deg[i] > 0) {
        edges += this.deg[i];
        if (v < 0 || this.deg[i] > this.deg[v]) v = i;
      }
    return { v, edges: edges / 2 };
  }

  private takePerson(v: number): void {
    const undo: number[] = [];
    this.take(v, undo);
    this.cur.push(v);
    this.run();
    this.cur.pop();
    this.restore(undo);
  }

  private takeNeighbours(v: number): void {
    const undo: number[] = [];
    const ns = this.adj[v].filter((u) => !this.removed[u]);
    for (const u of ns) {
      this.take(u, undo);
      this.cur.push(u);
    }
    if (this.cur.length < this.best) this.run();
    for (let q = 0; q < ns.length; q++) this.cur.pop();
    this.restore(undo);
  }

  private take(v: number, undo: number[]): void {
    this.removed[v] = 1;
    undo.push(v);
    for (const u of this.adj[v]) if (!this.removed[u]) this.deg[u]--;
  }

  private restore(undo: number[]): void {
    for (let q = undo.length - 1; q >= 0; q--) {
      const v = undo[q];
      this.removed[v] = 0;
      for (const u of this.adj[v]) if (!this.removed[u]) this.deg[u]++;
    }
  }
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
