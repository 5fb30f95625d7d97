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
  // Max-degree greedy.
  const deg = adj.map((a) => a.length);
  const chosen: number[] = [];
  const covered = new Uint8Array(n);
  for (;;) {
    let v = -1;
    for (let i = 0; i < n; i++) if (!covered[i] && deg[i] > 0 && (v < 0 || deg[i] > deg[v])) v = i;
    if (v < 0) break;
    chosen.push(v);
    covered[v] = 1;
    for (const u of adj[v]) if (!covered[u]) deg[u]--;
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
