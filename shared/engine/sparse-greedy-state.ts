/**
 * The state of the sparse exact greedy (docs/sparse-greedy.md section 1) and its per-pick
 * operations: u = G d_T, v = G 1_T, diag(G) and sigma = 1^T u, with G the inverse from one sparse
 * factor minus the signed corrections w_p w_p^T of the people picked since. Scoring a candidate
 * is O(1); adding one costs one solve and O(n) per correction.
 */
import { beats, tieTolerance } from './dense-state';
import type { GroundedFactor } from './grounded-factor';

/*
 * A class, not an object literal, and loops in functions of their own, so the per-pick code stays
 * compiled from one plan to the next (linalg/sparse-ldl.ts says why).
 */
export class GreedyState {
  readonly u: Float64Array;
  readonly v: Float64Array;
  /** G = (inverse from f) - sum_p sign_p w_p w_p^T on T. */
  readonly cols: Float64Array[] = [];
  readonly signs: number[] = [];
  /** Work space for unit right-hand sides (all zero between uses). */
  readonly unit: Float64Array;
  sigma = 0;
  constructor(
    readonly f: GroundedFactor,
    /** People grounded in `f` who are not starters (their rows of the base inverse are zero). */
    readonly groundedFree: number[],
    readonly inT: Uint8Array,
    readonly dg: Float64Array,
  ) {
    const n = inT.length;
    this.u = new Float64Array(n);
    this.v = new Float64Array(n);
    this.unit = new Float64Array(n);
  }
}

/** The room total from sigma (identity 1 with mixing beta = b / n). */
export function totalOf(sigma: number, beta: number): number {
  return sigma / (1 - beta * sigma);
}

export function worstSingle(s: GreedyState, beta: number): number {
  let w = 0;
  for (let j = 0; j < s.inT.length; j++) w = Math.max(w, totalOf(s.sigma - (s.u[j] * s.v[j]) / s.dg[j], beta));
  return w;
}

export function bestCandidate(s: GreedyState, allowed: Uint8Array, beta: number): number {
  const { inT, u, v, dg } = s;
  const tol = tieTolerance(inT.length);
  let best = -1;
  let bestTotal = Infinity;
  for (let j = 0; j < inT.length; j++) {
    if (!inT[j] || !allowed[j]) continue;
    const t = totalOf(s.sigma - (u[j] * v[j]) / dg[j], beta);
    if (beats(t, j, bestTotal, best, tol)) {
      best = j;
      bestTotal = t;
    }
  }
  return best;
}

/** Sum of the r largest gains total(A) - total(A + j) among allowed people in T (a bounded min-heap). */
export function topGains(s: GreedyState, allowed: Uint8Array, r: number, beta: number): number {
  const heap = new Float64Array(Math.max(1, r));
  const size = largestGains(s, allowed, r, beta, heap);
  return sumFirst(heap, size);
}

/** Fills `heap` (a min-heap) with the r largest gains; returns how many it holds. */
function largestGains(s: GreedyState, allowed: Uint8Array, r: number, beta: number, heap: Float64Array): number {
  const base = totalOf(s.sigma, beta);
  let size = 0;
  for (let j = 0; j < s.inT.length; j++) {
    if (!s.inT[j] || !allowed[j]) continue;
    const g = base - totalOf(s.sigma - (s.u[j] * s.v[j]) / s.dg[j], beta);
    if (size < r) siftUp(heap, size++, g);
    else if (r > 0 && g > heap[0]) siftDown(heap, size, g);
  }
  return size;
}

function sumFirst(x: Float64Array, size: number): number {
  let t = 0;
  for (let q = 0; q < size; q++) t += x[q];
  return t;
}

/** Adds g at position i (the heap's size) and restores the min-heap order. */
function siftUp(heap: Float64Array, i: number, g: number): void {
  while (i > 0 && heap[(i - 1) >> 1] > g) {
    heap[i] = heap[(i - 1) >> 1];
    i = (i - 1) >> 1;
  }
  heap[i] = g;
}

/** Replaces the heap's smallest entry by g and restores the min-heap order. */
function siftDown(heap: Float64Array, size: number, g: number): void {
  let i = 0;
  for (;;) {
    const l = 2 * i + 1;
    if (l >= size) break;
    const c = l + 1 < size && heap[l + 1] < heap[l] ? l + 1 : l;
    if (heap[c] >= g) break;
    heap[i] = heap[c];
    i = c;
  }
  heap[i] = g;
}

/** G b on T (0 elsewhere; b is overwritten): one solve with the state's factor, then the signed corrections. */
export function applyG(s: GreedyState, b: Float64Array): Float64Array {
  const dots = signedDots(s.cols, s.signs, b);
  // The base inverse is zero on the grounded people who are not starters.
  for (const r of s.groundedFree) b[r] = 0;
  const y = s.f.solve(b);
  for (let p = 0; p < s.cols.length; p++) if (dots[p] !== 0) subtractOne(y, s.cols[p], dots[p]);
  zeroOutside(y, s.inT);
  return y;
}

/** sign_p (w_p . b) for every correction p. */
function signedDots(cols: Float64Array[], signs: number[], b: Float64Array): Float64Array {
  const dots = new Float64Array(cols.length);
  for (let p = 0; p < cols.length; p++) dots[p] = dot(cols[p], b) * signs[p];
  return dots;
}

function dot(w: Float64Array, b: Float64Array): number {
  let c = 0;
  for (let i = 0; i < w.length; i++) c += w[i] * b[i];
  return c;
}

function zeroOutside(y: Float64Array, inT: Uint8Array): void {
  for (let i = 0; i < y.length; i++) if (!inT[i]) y[i] = 0;
}

/** g -= c w. */
function subtractOne(g: Float64Array, w: Float64Array, c: number): void {
  for (let i = 0; i < g.length; i++) g[i] -= c * w[i];
}

/** g = g - c0 w0 - c1 w1 (the two corrections in one sweep, in that order). */
function subtractTwo(g: Float64Array, w0: Float64Array, c0: number, w1: Float64Array, c1: number): void {
  for (let i = 0; i < g.length; i++) g[i] = g[i] - c0 * w0[i] - c1 * w1[i];
}

/** Column j of the current G: one solve with the state's factor, minus the corrections. */
function currentColumn(s: GreedyState, j: number): Float64Array {
  const e = s.unit;
  e[j] = 1;
  for (const r of s.groundedFree) e[r] = 0;
  const g = s.f.solve(e);
  e[j] = 0;
  const { cols, signs } = s;
  // Two corrections per sweep over g (the same operations in the same order as one at a time).
  let p = 0;
  for (; p + 1 < cols.length; p += 2) {
    const c0 = cols[p][j] * signs[p];
    const c1 = cols[p + 1][j] * signs[p + 1];
    if (c0 !== 0 && c1 !== 0) subtractTwo(g, cols[p], c0, cols[p + 1], c1);
    else if (c0 !== 0) subtractOne(g, cols[p], c0);
    else if (c1 !== 0) subtractOne(g, cols[p + 1], c1);
  }
  if (p < cols.length) {
    const c = cols[p][j] * signs[p];
    if (c !== 0) subtractOne(g, cols[p], c);
  }
  return g;
}

export function addStarter(s: GreedyState, j: number): void {
  const g = currentColumn(s, j);
  const sigma = downdate(s, g, j);
  s.inT[j] = 0;
  s.u[j] = 0;
  s.v[j] = 0;
  s.dg[j] = 0;
  s.cols.push(g);
  s.signs.push(1);
  s.sigma = sigma;
}

/**
 * One sweep for the pick j with g = G e_j: the updates of identity 3 on T, and g turned into the
 * stored correction g / sqrt(g_j) (0 off T). Returns sigma over T without j.
 */
function downdate(s: GreedyState, g: Float64Array, j: number): number {
  const { inT, u, v, dg } = s;
  const gjj = g[j];
  const fu = u[j] / gjj;
  const fv = v[j] / gjj;
  const sq = 1 / Math.sqrt(gjj);
  let sigma = 0;
  for (let i = 0; i < inT.length; i++) {
    const gi = g[i];
    if (!inT[i]) {
      g[i] = 0;
      continue;
    }
    if (gi !== 0) {
      u[i] -= gi * fu;
      v[i] -= gi * fv;
      dg[i] -= (gi * gi) / gjj;
      g[i] = gi * sq;
    }
    if (i !== j) sigma += u[i];
  }
  return sigma;
}
