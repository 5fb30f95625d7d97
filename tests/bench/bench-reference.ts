/**
 * Plain reference implementations run in the same process for the ratio column: every
 * candidate evaluated by a fresh dense solve with a general-purpose library (ml-matrix LU),
 * and plain unpreconditioned conjugate gradient for the sparse case. Long references are timed
 * on a sample of solves and extrapolated (the table says so).
 */
import { Matrix, solve } from 'ml-matrix';
import { denseWalk, type PreparedRoom } from '../../shared/engine/index';

/** Total for starter set A by a fresh ml-matrix dense solve. */
export function referenceTotal(room: PreparedRoom, p1: Float64Array, starters: readonly number[]): number {
  const n = room.n;
  const isA = new Uint8Array(n);
  for (const s of starters) isA[s] = 1;
  const T: number[] = [];
  for (let i = 0; i < n; i++) if (!isA[i]) T.push(i);
  const f = T.length;
  const rows: number[][] = new Array(f);
  for (let r = 0; r < f; r++) {
    const row = new Array<number>(f);
    const base = T[r] * n;
    for (let c = 0; c < f; c++) row[c] = (r === c ? 1 : 0) - p1[base + T[c]];
    rows[r] = row;
  }
  const x = solve(new Matrix(rows), Matrix.ones(f, 1));
  let t = 0;
  for (let r = 0; r < f; r++) t += x.get(r, 0);
  return t / (1 - room.laziness);
}

/** Mean time of one reference solve with |A| = a, from `samples` solves. */
export function referenceSolveMs(room: PreparedRoom, a: number, samples: number): number {
  const p1 = denseWalk(room);
  const A = Array.from({ length: a }, (_, i) => i);
  const t = performance.now();
  for (let s = 0; s < samples; s++) referenceTotal(room, p1, A);
  return (performance.now() - t) / samples;
}

/** Plain CG (no preconditioner) on L_T h = d_T, the same system as the engine's CG. */
export function plainCg(room: PreparedRoom, starters: readonly number[], tol: number): { ms: number; iterations: number } {
  const { n, csr } = room;
  const act = new Uint8Array(n).fill(1);
  for (const s of starters) act[s] = 0;
  const mul = (x: Float64Array, y: Float64Array) => {
    for (let i = 0; i < n; i++) {
      if (!act[i]) {
        y[i] = 0;
        continue;
      }
      let acc = csr.outStrength[i] * x[i];
      for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) if (act[csr.col[e]]) acc -= csr.weight[e] * x[csr.col[e]];
      y[i] = acc;
    }
  };
  const t0 = performance.now();
  const b = new Float64Array(n);
  for (let i = 0; i < n; i++) if (act[i]) b[i] = csr.outStrength[i];
  const x = new Float64Array(n);
  const r = Float64Array.from(b);
  const p = Float64Array.from(b);
  const q = new Float64Array(n);
  let rr = r.reduce((s, v) => s + v * v, 0);
  const bn = Math.sqrt(rr);
  let it = 0;
  while (Math.sqrt(rr) > tol * bn && it < 100_000) {
    mul(p, q);
    let pq = 0;
    for (let i = 0; i < n; i++) pq += p[i] * q[i];
    const al = rr / pq;
    let rr2 = 0;
    for (let i = 0; i < n; i++) {
      x[i] += al * p[i];
      r[i] -= al * q[i];
      rr2 += r[i] * r[i];
    }
    const be = rr2 / rr;
    rr = rr2;
    for (let i = 0; i < n; i++) p[i] = r[i] + be * p[i];
    it++;
  }
  return { ms: performance.now() - t0, iterations: it };
}
