/**
 * Random streams of a rehearsal. Run r of seed s draws from its own xor128 generator
 * (Marsaglia 2003, "Xorshift RNGs", as implemented by seedrandom's `xor128`), whose 128-bit
 * state is the cyrb128 hash (a public-domain string hash, from memory) of "s/r". So every run
 * has the same stream whichever worker runs it, and nearby runs get unrelated states.
 *
 * The hot loop in walks.ts inlines the same xor128 step for speed; a test checks that it draws
 * exactly what seedrandom's generator draws from the same state.
 */
import seedrandom from 'seedrandom';

export interface Xor128State {
  x: number;
  y: number;
  z: number;
  w: number;
}

export function runState(seed: string | number, run: number): Xor128State {
  const key = `${seed}/${run}`;
  let h1 = 1779033703;
  let h2 = 3144134277;
  let h3 = 1013904242;
  let h4 = 2773480762;
  for (let i = 0; i < key.length; i++) {
    const k = key.charCodeAt(i);
    h1 = h2 ^ Math.imul(h1 ^ k, 597399067);
    h2 = h3 ^ Math.imul(h2 ^ k, 2869860233);
    h3 = h4 ^ Math.imul(h3 ^ k, 951274213);
    h4 = h1 ^ Math.imul(h4 ^ k, 2716044179);
  }
  h1 = Math.imul(h3 ^ (h1 >>> 18), 597399067);
  h2 = Math.imul(h4 ^ (h2 >>> 22), 2869860233);
  h3 = Math.imul(h1 ^ (h3 >>> 17), 951274213);
  h4 = Math.imul(h2 ^ (h4 >>> 19), 2716044179);
  h1 ^= h2 ^ h3 ^ h4;
  h2 ^= h1;
  h3 ^= h1;
  h4 ^= h1;
  // xor128 must not start from the all-zero state.
  if ((h1 | h2 | h3 | h4) === 0) h4 = 1;
  return { x: h1 | 0, y: h2 | 0, z: h3 | 0, w: h4 | 0 };
}

/** seedrandom's xor128 generator started from the run's state: uniform doubles in [0, 1). */
export function runGenerator(seed: string | number, run: number): () => number {
  return seedrandom.xor128('', { state: runState(seed, run) });
}
