/**
 * Node-only: dense inversion split over worker threads (rows of each elimination step shared
 * between threads over a SharedArrayBuffer, one barrier per pivot). Same arithmetic as
 * linalg/dense.ts: the sweep operator for symmetric positive definite matrices (n^3 / 2) or
 * Gauss-Jordan with partial pivoting (n^3); results equal the single-thread kernels bit for bit
 * because every row is updated by the same operations in the same order.
 * Not for the browser bundle: it imports node:worker_threads.
 */
import { Worker } from 'node:worker_threads';
import { EngineError } from '../errors';
import { gaussJordanPivot } from '../linalg/dense';

const WORKER_SOURCE = `
const { workerData } = require('node:worker_threads');
const { sab, colSab, ctrlSab, n, from, to } = workerData;
const a = new Float64Array(sab);
const col = new Float64Array(colSab);
const ctrl = new Int32Array(ctrlSab);
let seen = 0;
for (;;) {
  while (Atomics.load(ctrl, 1) === seen) Atomics.wait(ctrl, 1, seen, 50);
  seen = Atomics.load(ctrl, 1);
  const k = ctrl[0];
  if (k < 0) break;
  const sym = ctrl[3] === 1;
  const inv = col[n];
  for (let i = from; i < to; i++) {
    if (i === k) continue;
    const ri = i * n;
    if (sym) {
      const f = col[i] * inv;
      if (f === 0) continue;
      let j = i; const end = n - 3;
      for (; j < end; j += 4) { a[ri + j] -= f * col[j]; a[ri + j + 1] -= f * col[j + 1]; a[ri + j + 2] -= f * col[j + 2]; a[ri + j + 3] -= f * col[j + 3]; }
      for (; j < n; j++) a[ri + j] -= f * col[j];
    } else {
      const f = a[ri + k];
      if (f === 0) continue;
      a[ri + k] = 0;
      let j = 0; const end = n - 3;
      for (; j < end; j += 4) { a[ri + j] -= f * col[j]; a[ri + j + 1] -= f * col[j + 1]; a[ri + j + 2] -= f * col[j + 2]; a[ri + j + 3] -= f * col[j + 3]; }
      for (; j < n; j++) a[ri + j] -= f * col[j];
    }
  }
  Atomics.add(ctrl, 2, 1);
  Atomics.notify(ctrl, 2);
}
`;

/** Inverts the n x n row-major matrix `src` using `threads` threads (this one included). */
export async function invertParallel(src: Float64Array, n: number, symmetric: boolean, threads = 2): Promise<Float64Array> {
  const sab = new SharedArrayBuffer(n * n * 8);
  const a = new Float64Array(sab);
  a.set(src);
  const colSab = new SharedArrayBuffer((n + 1) * 8);
  const col = new Float64Array(colSab);
  const ctrl = new Int32Array(new SharedArrayBuffer(16));
  ctrl[3] = symmetric ? 1 : 0;
  const helpers = Math.max(0, Math.min(threads, 8) - 1);
  const cuts = rowCuts(n, helpers, symmetric);
  const workers: Worker[] = [];
  for (let t = 0; t < helpers; t++) {
    workers.push(
      new Worker(WORKER_SOURCE, { eval: true, workerData: { sab, colSab, ctrlSab: ctrl.buffer, n, from: cuts[t + 1], to: cuts[t + 2] } }),
    );
  }
  const perm = new Int32Array(n);
  for (let i = 0; i < n; i++) perm[i] = i;
  try {
    await Promise.all(
      workers.map(
        (w) =>
          new Promise<void>((res, rej) => {
            w.once('online', () => res());
            w.once('error', rej);
          }),
      ),
    );
    for (let k = 0; k < n; k++) {
      const inv = symmetric ? sweepPivot(a, col, n, k) : gaussJordanPivot(a, col, perm, n, k);
      col[n] = inv;
      ctrl[0] = k;
      Atomics.store(ctrl, 2, 0);
      Atomics.add(ctrl, 1, 1);
      Atomics.notify(ctrl, 1);
      updateRows(a, col, n, k, 0, cuts[1], symmetric, inv);
      while (Atomics.load(ctrl, 2) < helpers) Atomics.wait(ctrl, 2, Atomics.load(ctrl, 2), 50);
      if (symmetric) {
        const rk = k * n;
        for (let j = 0; j < k; j++) a[j * n + k] = col[j] * inv;
        for (let j = k + 1; j < n; j++) a[rk + j] = col[j] * inv;
        a[rk + k] = -inv;
      }
    }
  } finally {
    await stopHelpers(ctrl, workers);
  }
  return unpackInverse(a, perm, n, symmetric);
}

/** Row ranges of roughly equal work, this thread's first: symmetric rows shrink with i (upper triangle only). */
function rowCuts(n: number, helpers: number, symmetric: boolean): number[] {
  const cuts = [0];
  for (let t = 1; t <= helpers; t++)
    cuts.push(symmetric ? Math.round(n * (1 - Math.sqrt(1 - t / (helpers + 1)))) : Math.round((n * t) / (helpers + 1)));
  cuts.push(n);
  return cuts;
}

/** Sweep step k: copies pivot column k (upper triangle) into `col` and returns 1 / pivot. */
function sweepPivot(a: Float64Array, col: Float64Array, n: number, k: number): number {
  const rk = k * n;
  const d = a[rk + k];
  if (!(d > 0)) throw new EngineError('SOLVER_FAILED', 'The matrix is not positive definite.');
  for (let j = 0; j < k; j++) col[j] = a[j * n + k];
  for (let j = k; j < n; j++) col[j] = a[rk + j];
  return 1 / d;
}

/** Tells the helper threads to leave and waits until they have. */
async function stopHelpers(ctrl: Int32Array, workers: Worker[]): Promise<void> {
  ctrl[0] = -1;
  Atomics.add(ctrl, 1, 1);
  Atomics.notify(ctrl, 1);
  await Promise.all(
    workers.map(
      (w) =>
        new Promise((res) => {
          w.once('exit', res);
        }),
    ),
  );
}

/** The inverse from the eliminated matrix: the negated upper triangle mirrored, or the columns put back in order. */
function unpackInverse(a: Float64Array, perm: Int32Array, n: number, symmetric: boolean): Float64Array {
  const out = new Float64Array(n * n);
  if (symmetric) {
    for (let i = 0; i < n; i++)
      for (let j = i; j < n; j++) {
        const v = -a[i * n + j];
        out[i * n + j] = v;
        out[j * n + i] = v;
      }
  } else {
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[i * n + perm[j]] = a[i * n + j];
  }
  return out;
}

function updateRows(a: Float64Array, col: Float64Array, n: number, k: number, from: number, to: number, sym: boolean, inv: number): void {
  for (let i = from; i < to; i++) {
    if (i === k) continue;
    const ri = i * n;
    if (sym) {
      const f = col[i] * inv;
      if (f === 0) continue;
      let j = i;
      const end = n - 3;
      for (; j < end; j += 4) {
        a[ri + j] -= f * col[j];
        a[ri + j + 1] -= f * col[j + 1];
        a[ri + j + 2] -= f * col[j + 2];
        a[ri + j + 3] -= f * col[j + 3];
      }
      for (; j < n; j++) a[ri + j] -= f * col[j];
    } else {
      const f = a[ri + k];
      if (f === 0) continue;
      a[ri + k] = 0;
      let j = 0;
      const end = n - 3;
      for (; j < end; j += 4) {
        a[ri + j] -= f * col[j];
        a[ri + j + 1] -= f * col[j + 1];
        a[ri + j + 2] -= f * col[j + 2];
        a[ri + j + 3] -= f * col[j + 3];
      }
      for (; j < n; j++) a[ri + j] -= f * col[j];
    }
  }
}
