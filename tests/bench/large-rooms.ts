/**
 * Seeded large rooms for the sparse benchmarks and tests: a 2-D grid and a small-world ring
 * (Watts & Strogatz, "Collective dynamics of 'small-world' networks", Nature 1998: a ring where
 * each person is tied to the `half` nearest on each side, every tie rewired to a random person
 * with probability p). Strengths in [0.5, 1.5) unless `unit`. Also writes the edge list so the
 * Python peers read the very same room.
 */
import type { PreparedRoom } from '../../shared/engine/index';
import { rng, roomFromTieArrays } from './bench-rooms';

export interface EdgeList {
  readonly n: number;
  readonly src: Int32Array;
  readonly dst: Int32Array;
  readonly w: Float64Array;
}

export function roomFromEdges(e: EdgeList): PreparedRoom {
  return roomFromTieArrays(e.n, e.src, e.dst, e.w, false);
}

export function gridEdges(side: number, seed: number, unit = false): EdgeList {
  const r = rng(seed);
  const n = side * side;
  const src: number[] = [];
  const dst: number[] = [];
  const w: number[] = [];
  const tie = (a: number, b: number) => {
    src.push(a);
    dst.push(b);
    w.push(unit ? 1 : 0.5 + r());
  };
  for (let y = 0; y < side; y++)
    for (let x = 0; x < side; x++) {
      const i = y * side + x;
      if (x + 1 < side) tie(i, i + 1);
      if (y + 1 < side) tie(i, i + side);
    }
  return { n, src: Int32Array.from(src), dst: Int32Array.from(dst), w: Float64Array.from(w) };
}

/** Small-world ring; rewired ties never make self-loops, and a rewiring onto an existing tie is dropped. */
export function smallWorldEdges(n: number, half: number, p: number, seed: number): EdgeList {
  const r = rng(seed);
  const src: number[] = [];
  const dst: number[] = [];
  const w: number[] = [];
  const seen = new Set<number>();
  for (let i = 0; i < n; i++)
    for (let s = 1; s <= half; s++) {
      let j = (i + s) % n;
      if (r() < p) {
        j = Math.floor(r() * n);
        if (j === i) j = (i + s) % n;
      }
      const key = Math.min(i, j) * n + Math.max(i, j);
      if (seen.has(key)) continue;
      seen.add(key);
      src.push(i);
      dst.push(j);
      w.push(0.5 + r());
    }
  return { n, src: Int32Array.from(src), dst: Int32Array.from(dst), w: Float64Array.from(w) };
}

/** Edge list as text: "n m" then one "i j w" line per tie (17 significant digits). */
export function edgesText(e: EdgeList): string {
  const lines = [`${e.n} ${e.src.length}`];
  for (let q = 0; q < e.src.length; q++) lines.push(`${e.src[q]} ${e.dst[q]} ${e.w[q].toPrecision(17)}`);
  return lines.join('\n') + '\n';
}
