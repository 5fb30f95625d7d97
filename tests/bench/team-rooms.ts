/**
 * 60-person rooms in six groups for the planner benchmarks and tests: the demo all-hands room
 * (seed-data/rooms.ts, rebuilt here as an engine graph) and seeded random six-group rooms of the
 * same shape (a ring of strong ties in each group, a few random ties inside, weak ties across).
 */
import type { RoomGraph, RoomTie } from '../../shared/engine/index';
import { allHandsContent } from '../../seed-data/rooms';
import { rng } from './bench-rooms';

export function allHandsRoom(): RoomGraph {
  const c = allHandsContent();
  return {
    ids: c.people.map((p) => p.key),
    directed: false,
    ties: c.ties.map((t) => ({ source: t.source, target: t.target, strength: t.strength })),
  };
}

/** `groups` groups of `size` people: ring + `inside` random ties per group, `across` weak ties between groups. */
export function groupRoom(seed: number, groups = 6, size = 10, inside = 8, across = 20): RoomGraph {
  const r = rng(seed);
  const n = groups * size;
  const ties: RoomTie[] = [];
  const seen = new Set<number>();
  const add = (s: number, t: number, strength: number) => {
    if (s === t || seen.has(Math.min(s, t) * n + Math.max(s, t))) return;
    seen.add(Math.min(s, t) * n + Math.max(s, t));
    ties.push({ source: s, target: t, strength: Math.round(strength * 10) / 10 });
  };
  for (let g = 0; g < groups; g++) {
    const base = g * size;
    for (let i = 0; i < size; i++) add(base + i, base + ((i + 1) % size), 2 + 2 * r());
    for (let q = 0; q < inside; q++) add(base + Math.floor(r() * size), base + Math.floor(r() * size), 1 + r());
  }
  for (let g = 0; g + 1 < groups; g++) add(g * size + Math.floor(r() * size), (g + 1) * size + Math.floor(r() * size), 1);
  for (let q = 0; q < across; q++) add(Math.floor(r() * n), Math.floor(r() * n), 0.3 + 0.7 * r());
  return { ids: Array.from({ length: n }, (_, i) => `p${i + 1}`), directed: false, ties };
}
