/**
 * The absorbing chain of a partial plan S restricted to its remaining candidates C, as used by
 * the branch and bound: N_CC, h_C, c_C and F(S). Adding a candidate x and keeping only the
 * candidates D after it costs O(|D|^2) (identity 1 of docs/engine.md applied to the D x D block:
 * N'_ab = N_ab - N_ax N_xb / N_xx, h'_a = h_a - N_ax h_x / N_xx, c'_b = c_b - c_x N_xb / N_xx,
 * F' = F - ρ_x with ρ_x = h_x c_x / N_xx, identity 2). Rows and columns of people who can no
 * longer be chosen are never needed again, so the search never pays O(n^2) below its roots.
 */
import type { AbsorbingState } from './dense-state';

export class CandState {
  m = 0;
  /** F(S), raw hops. */
  F = 0;
  readonly ids: Int32Array;
  readonly N: Float64Array;
  readonly h: Float64Array;
  readonly c: Float64Array;
  /** The people of S. */
  starters: number[] = [];

  constructor(capacity: number) {
    this.ids = new Int32Array(capacity);
    this.N = new Float64Array(capacity * capacity);
    this.h = new Float64Array(capacity);
    this.c = new Float64Array(capacity);
  }

  /** Loads the state of S (full dense form) restricted to the candidates `cand`. O(|cand|^2). */
  load(s: AbsorbingState, cand: Int32Array): this {
    const m = cand.length;
    const n = s.n;
    this.m = m;
    this.F = s.rawTotal;
    this.starters = [...s.starters];
    for (let a = 0; a < m; a++) {
      const ga = cand[a];
      this.ids[a] = ga;
      this.h[a] = s.h[ga];
      this.c[a] = s.c[ga];
      const src = ga * n;
      const dst = a * m;
      for (let b = 0; b < m; b++) this.N[dst + b] = s.N[src + cand[b]];
    }
    return this;
  }

  /** ρ_a(S) for local candidate a. */
  gain(a: number): number {
    return (this.h[a] * this.c[a]) / this.N[a * this.m + a];
  }

  /** ρ_b(S + a), local indices, O(1). */
  pairGain(a: number, b: number): number {
    const { N, h, c, m } = this;
    const naa = N[a * m + a];
    const nba = N[b * m + a];
    const nab = N[a * m + b];
    const nbb = N[b * m + b] - (nba * nab) / naa;
    return ((h[b] - (nba * h[a]) / naa) * (c[b] - (c[a] * nab) / naa)) / nbb;
  }

  /**
   * Writes into `dst` the state of S + x (x local) restricted to the local candidates
   * order[from..to-1]; `gx` is ρ_x(S). O((to - from)^2).
   */
  childInto(dst: CandState, x: number, gx: number, order: Int32Array, from: number, to: number): void {
    const { N, h, c, m } = this;
    const len = to - from;
    const nxx = N[x * m + x];
    const hx = h[x];
    const cx = c[x];
    const rx = x * m;
    dst.m = len;
    dst.F = this.F - gx;
    dst.starters = [...this.starters, this.ids[x]];
    const col = dst.h; // reuse as scratch for N_ax / N_xx before h is written
    for (let q = 0; q < len; q++) col[q] = N[order[from + q] * m + x] / nxx;
    const D = dst.N;
    for (let q = 0; q < len; q++) {
      const a = order[from + q];
      const ra = a * m;
      const fa = col[q];
      const out = q * len;
      for (let t = 0; t < len; t++) {
        const b = order[from + t];
        D[out + t] = N[ra + b] - fa * N[rx + b];
      }
    }
    for (let q = 0; q < len; q++) {
      const a = order[from + q];
      dst.ids[q] = this.ids[a];
      dst.c[q] = c[a] - (cx * N[rx + a]) / nxx;
      dst.h[q] = h[a] - col[q] * hx;
    }
  }

  /**
   * Bound 4 of docs/bounds.md for every set S ∪ B, B an r-subset of the candidates: with Y the
   * greedy r-completion of S within the candidates, F(S ∪ B) >= F(S ∪ B ∪ Y) >= F(S ∪ Y) - (sum of
   * the r largest gains at S ∪ Y) (monotonicity, then the completion lemma). Strong when r is
   * large, where the plain top-r sum at S is weak. The greedy steps keep N as N_CC minus r
   * rank-one terms (identity 1 applied once per step: N'_ab = N_ab - u_a v_b with u = N_·x / N_xx,
   * v = N_x·), so only the diagonal, h, c and one column and row per step are formed:
   * O(m r^2) using `scratch`'s buffers, instead of O(r m^2).
   */
  // eslint-disable-next-line max-lines-per-function -- runs at every search node over one set of scratch buffers (h, c, the diagonal, the rank-one terms); split, each greedy step would pass them all around.
  dualBound(r: number, scratch: CandState, picked: Uint8Array): number {
    const m = this.m;
    const N = this.N;
    const { h, c } = scratch;
    const store = scratch.lowRankBuf(2 * r * m); // u_s at [2 s m, ..), v_s at [(2 s + 1) m, ..)
    const d = scratch.diagBuf(m);
    for (let a = 0; a < m; a++) {
      h[a] = this.h[a];
      c[a] = this.c[a];
      d[a] = N[a * m + a];
    }
    picked.fill(0, 0, m);
    let F = this.F;
    for (let step = 0; step < r; step++) {
      let x = -1;
      let gx = -Infinity;
      for (let q = 0; q < m; q++) {
        if (picked[q]) continue;
        const g = (h[q] * c[q]) / d[q];
        if (g > gx) {
          gx = g;
          x = q;
        }
      }
      if (x < 0) return -Infinity;
      picked[x] = 1;
      F -= Math.max(0, gx);
      const uo = 2 * step * m;
      const vo = uo + m;
      // Column and row of x in the current N: the original entries minus the earlier rank-one terms.
      const rx = x * m;
      for (let a = 0; a < m; a++) {
        store[uo + a] = N[a * m + x];
        store[vo + a] = N[rx + a];
      }
      for (let s = 0; s < step; s++) {
        const us = 2 * s * m;
        const vs = us + m;
        const ux = store[us + x];
        const vx = store[vs + x];
        for (let a = 0; a < m; a++) {
          store[uo + a] -= store[us + a] * vx;
          store[vo + a] -= ux * store[vs + a];
        }
      }
      const nxx = d[x];
      const hx = h[x];
      const cx = c[x];
      for (let a = 0; a < m; a++) {
        const ua = store[uo + a] / nxx;
        store[uo + a] = ua;
        if (picked[a]) continue;
        const va = store[vo + a];
        d[a] -= ua * va;
        h[a] -= ua * hx;
        c[a] -= (cx * va) / nxx;
      }
    }
    // The r largest gains at S ∪ Y among the others (people of Y gain nothing).
    const top = scratch.topBuf(r);
    top.fill(0);
    for (let q = 0; q < m; q++) {
      if (picked[q]) continue;
      const g = Math.max(0, (h[q] * c[q]) / d[q]);
      if (g <= top[r - 1]) continue;
      let at = r - 1;
      while (at > 0 && top[at - 1] < g) {
        top[at] = top[at - 1];
        at--;
      }
      top[at] = g;
    }
    let sum = 0;
    for (let q = 0; q < r; q++) sum += top[q];
    return F - sum;
  }

  private diag?: Float64Array;
  private top?: Float64Array;

  private lowRank?: Float64Array;

  lowRankBuf(size: number): Float64Array {
    if (!this.lowRank || this.lowRank.length < size) this.lowRank = new Float64Array(Math.max(size, 2 * this.ids.length));
    return this.lowRank;
  }

  diagBuf(m: number): Float64Array {
    if (!this.diag || this.diag.length < m) this.diag = new Float64Array(this.ids.length);
    return this.diag;
  }

  topBuf(r: number): Float64Array {
    if (!this.top || this.top.length < r) this.top = new Float64Array(Math.max(r, 16));
    return this.top.subarray(0, r);
  }
}
