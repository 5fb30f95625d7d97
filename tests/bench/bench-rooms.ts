/** Seeded rooms for the benchmarks: dense-ish random weighted rooms and large sparse CSR rooms built directly. */
import { roomFromCsr, type Csr, type PreparedRoom } from '../../shared/engine/index';

export function rng(seed: number): () => number {
  let x = seed >>> 0 || 1;
  return () => {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    return x / 4294967296;
  };
}

/** n people, m ties (a spanning cycle plus random ties), strengths in [0.1, 2.1), CSR built by counting sort. */
export function sparseRoom(n: number, m: number, directed: boolean, seed: number): PreparedRoom {
  const r = rng(seed);
  const src = new Int32Array(m);
  const dst = new Int32Array(m);
  const w = new Float64Array(m);
  for (let e = 0; e < m; e++) {
    let s: number;
    let t: number;
    if (e < n) {
      s = e;
      t = (e + 1) % n;
    } else {
      s = Math.floor(r() * n);
      t = Math.floor(r() * n);
      if (t === s) t = (s + 1) % n;
    }
    src[e] = s;
    dst[e] = t;
    w[e] = 0.1 + 2 * r();
  }
  return roomFromTieArrays(n, src, dst, w, directed);
}

/**
 * A prepared room from parallel tie arrays (tie q asks from src[q] to dst[q] with strength w[q]; an
 * undirected room stores each tie both ways), CSR built by counting sort with rows sorted by column.
 */
export function roomFromTieArrays(n: number, src: Int32Array, dst: Int32Array, w: Float64Array, directed: boolean): PreparedRoom {
  const m = src.length;
  const entries = directed ? m : 2 * m;
  const rowStart = new Int32Array(n + 1);
  for (let e = 0; e < m; e++) {
    rowStart[src[e] + 1]++;
    if (!directed) rowStart[dst[e] + 1]++;
  }
  for (let i = 0; i < n; i++) rowStart[i + 1] += rowStart[i];
  const fill = rowStart.slice(0, n);
  const col = new Int32Array(entries);
  const weight = new Float64Array(entries);
  const outStrength = new Float64Array(n);
  const put = (a: number, b: number, x: number) => {
    const p = fill[a]++;
    col[p] = b;
    weight[p] = x;
    outStrength[a] += x;
  };
  for (let e = 0; e < m; e++) {
    put(src[e], dst[e], w[e]);
    if (!directed) put(dst[e], src[e], w[e]);
  }
  // Sort each row by column (the engine's CSR convention).
  for (let i = 0; i < n; i++) {
    const a = rowStart[i];
    const b = rowStart[i + 1];
    const idx = Array.from({ length: b - a }, (_, q) => a + q).sort((x, y) => col[x] - col[y]);
    const c2 = idx.map((q) => col[q]);
    const w2 = idx.map((q) => weight[q]);
    for (let q = 0; q < c2.length; q++) {
      col[a + q] = c2[q];
      weight[a + q] = w2[q];
    }
  }
  const csr: Csr = mergeRepeats(n, rowStart, col, weight, outStrength);
  return roomFromCsr(csr, directed);
}

/**
 * A tie listed twice becomes one tie with the summed strength, as prepareRoom does for files: the
 * engine's CSR has each column once per row (the fill-reducing orders rely on it).
 */
function mergeRepeats(n: number, rowStart: Int32Array, col: Int32Array, weight: Float64Array, outStrength: Float64Array): Csr {
  const start = new Int32Array(n + 1);
  let at = 0;
  for (let i = 0; i < n; i++) {
    start[i] = at;
    for (let p = rowStart[i]; p < rowStart[i + 1]; p++) {
      if (at > start[i] && col[at - 1] === col[p]) weight[at - 1] += weight[p];
      else {
        col[at] = col[p];
        weight[at++] = weight[p];
      }
    }
  }
  start[n] = at;
  return { n, rowStart: start, col: col.slice(0, at), weight: weight.slice(0, at), outStrength };
}
