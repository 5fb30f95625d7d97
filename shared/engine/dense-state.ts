/**
 * The absorbing chain of a starter set A kept in dense form, with the O(n^2) updates every
 * dense planner uses (engine.md identities 1-2):
 *   add j:     N' = N - N_.j N_j. / N_jj,  h' = h - N_.j h_j / N_jj,  c' = c - c_j N_j. / N_jj
 *   gain of j: total(A) - total(A + j) = h_j c_j / N_jj            (c = 1^T N)
 *   remove s:  the bordered inverse (Schur complement of the new row and column).
 * N, h, c are kept unscaled (laziness 0); totals are reported scaled by 1 / (1 - laziness).
 */
import type { ErgodicData } from './ergodic';
import { axpySub, invertInPlace } from './linalg/dense';
import { denseSystem } from './reach';
import type { PreparedRoom } from './room';

export const TIE_TOLERANCE = 1e-12;

/**
 * Relative tolerance under which two totals count as tied. engine.md asks for 1e-12; O(n^3)
 * computations carry rounding of about machine precision times the conditioning (~n^2 for
 * path-like rooms), so genuinely equal totals in symmetric rooms (a cycle of 400 people
 * differs by 7e-12 between equal candidates) would otherwise be split by noise. The tolerance
 * therefore grows as 1e-16 n^2 above n = 100.
 */
export function tieTolerance(n: number): number {
  return Math.max(TIE_TOLERANCE, 1e-16 * n * n);
}

/** engine.md tie-break: the smaller total wins; within the tie tolerance, the earlier person wins. */
export function beats(total: number, index: number, bestTotal: number, bestIndex: number, tieTol = TIE_TOLERANCE): boolean {
  if (bestIndex < 0) return true;
  if (total === bestTotal) return index < bestIndex;
  if (!Number.isFinite(total) || !Number.isFinite(bestTotal)) return total < bestTotal;
  const tol = tieTol * Math.max(Math.abs(total), Math.abs(bestTotal));
  if (total < bestTotal - tol) return true;
  if (total > bestTotal + tol) return false;
  return index < bestIndex;
}

export class AbsorbingState {
  readonly n: number;
  readonly N: Float64Array;
  readonly h: Float64Array;
  readonly c: Float64Array;
  readonly inT: Uint8Array;
  readonly starters: number[];
  /** Unscaled total (sum of h over T). */
  rawTotal = 0;
  readonly scale: number;

  private constructor(n: number, scale: number) {
    this.n = n;
    this.scale = scale;
    this.N = new Float64Array(n * n);
    this.h = new Float64Array(n);
    this.c = new Float64Array(n);
    this.inT = new Uint8Array(n).fill(1);
    this.starters = [];
  }

  get total(): number {
    return this.rawTotal * this.scale;
  }

  /** Direct inverse of I - Q for the given starters (all others must reach them). O(n^3). */
  static fromStarters(room: PreparedRoom, starters: readonly number[]): AbsorbingState {
    const n = room.n;
    const s = new AbsorbingState(n, 1 / (1 - room.laziness));
    for (const a of starters) {
      s.inT[a] = 0;
      s.starters.push(a);
    }
    const idx: number[] = [];
    for (let i = 0; i < n; i++) if (s.inT[i]) idx.push(i);
    const f = idx.length;
    const inv = invertInPlace(denseSystem(room, Int32Array.from(idx), false), f);
    for (let r = 0; r < f; r++) {
      const dst = idx[r] * n;
      const src = r * f;
      for (let q = 0; q < f; q++) s.N[dst + idx[q]] = inv[src + q];
    }
    s.refreshVectors();
    return s;
  }

  /** N for A = {j} from the ergodic fundamental matrix in O(n^2):
   *  N_il = G_il - G_jl + pi_l (G_jj - G_ij) / pi_j (from Aldous & Fill ch. 2, identity 4). */
  static fromErgodic(e: ErgodicData, j: number): AbsorbingState {
    const n = e.n;
    const s = new AbsorbingState(n, e.scale);
    s.inT[j] = 0;
    s.starters.push(j);
    const g = e.g;
    const pi = e.pi;
    const gjj = g[j * n + j];
    const rj = j * n;
    for (let i = 0; i < n; i++) {
      if (i === j) continue;
      const ri = i * n;
      const f = (gjj - g[ri + j]) / pi[j];
      for (let l = 0; l < n; l++) s.N[ri + l] = g[ri + l] - g[rj + l] + pi[l] * f;
      s.N[ri + j] = 0;
    }
    s.refreshVectors();
    return s;
  }

  /** Overwrites this state with `from` (same room size) without allocating. */
  copyFrom(from: AbsorbingState): this {
    this.N.set(from.N);
    this.h.set(from.h);
    this.c.set(from.c);
    this.inT.set(from.inT);
    this.starters.splice(0, this.starters.length, ...from.starters);
    this.rawTotal = from.rawTotal;
    return this;
  }

  clone(): AbsorbingState {
    const s = new AbsorbingState(this.n, this.scale);
    s.N.set(this.N);
    s.h.set(this.h);
    s.c.set(this.c);
    s.inT.set(this.inT);
    s.starters.push(...this.starters);
    s.rawTotal = this.rawTotal;
    return s;
  }

  /** Recomputes h = N 1, c = 1^T N and the total from N. O(n^2). */
  refreshVectors(): void {
    const { n, N, h, c, inT } = this;
    h.fill(0);
    c.fill(0);
    let t = 0;
    for (let i = 0; i < n; i++) {
      if (!inT[i]) continue;
      const ri = i * n;
      let s = 0;
      for (let l = 0; l < n; l++) {
        if (!inT[l]) continue;
        const v = N[ri + l];
        s += v;
        c[l] += v;
      }
      h[i] = s;
      t += s;
    }
    this.rawTotal = t;
  }

  /** Unscaled gain of adding j (j in T). */
  rawGain(j: number): number {
    return (this.h[j] * this.c[j]) / this.N[j * this.n + j];
  }

  /** Best candidate under the tie-break rule among people in T allowed by `allowed` (1 = may be chosen). */
  bestCandidate(allowed: Uint8Array): number {
    let best = -1;
    let bestTotal = Infinity;
    const tol = tieTolerance(this.n);
    for (let j = 0; j < this.n; j++) {
      if (!this.inT[j] || !allowed[j]) continue;
      const t = this.rawTotal - this.rawGain(j);
      if (beats(t, j, bestTotal, best, tol)) {
        best = j;
        bestTotal = t;
      }
    }
    return best;
  }

  /** Sum of the r largest unscaled gains among allowed people in T. */
  topGains(allowed: Uint8Array, r: number): number {
    const g: number[] = [];
    for (let j = 0; j < this.n; j++) if (this.inT[j] && allowed[j]) g.push(this.rawGain(j));
    g.sort((a, b) => b - a);
    let s = 0;
    for (let q = 0; q < Math.min(r, g.length); q++) s += g[q];
    return s;
  }

  /** Moves j from T into A (Schur downdate). O(n^2). */
  add(j: number): void {
    const { n, N, h, c, inT } = this;
    const rj = j * n;
    const njj = N[rj + j];
    const hj = h[j];
    const cj = c[j];
    const rowJ = N.subarray(rj, rj + n);
    inT[j] = 0;
    for (let i = 0; i < n; i++) {
      if (!inT[i]) continue;
      const ri = i * n;
      const f = N[ri + j] / njj;
      if (f !== 0) axpySub(N, ri, N, rj, n, f);
      h[i] -= f * hj;
    }
    const fc = cj / njj;
    let t = 0;
    for (let l = 0; l < n; l++) {
      if (!inT[l]) continue;
      c[l] -= fc * rowJ[l];
      t += h[l];
    }
    h[j] = 0;
    c[j] = 0;
    this.rawTotal = t;
    this.starters.push(j);
  }

  /** Moves starter s back into T (bordered inverse). p1 is the dense walk (laziness excluded). O(n^2). */
  remove(s: number, p1: Float64Array): void {
    const { n, N, inT } = this;
    const x = new Float64Array(n);
    const y = new Float64Array(n);
    const rs = s * n;
    // x = N u with u_l = P_ls; y^T = v^T N with v_l = P_sl.
    const u = new Float64Array(n);
    for (let l = 0; l < n; l++) if (inT[l]) u[l] = p1[l * n + s];
    for (let i = 0; i < n; i++) {
      if (!inT[i]) continue;
      const ri = i * n;
      let acc = 0;
      for (let l = 0; l < n; l++) acc += N[ri + l] * u[l];
      x[i] = acc;
      const vi = p1[rs + i];
      if (vi !== 0) for (let l = 0; l < n; l++) y[l] += vi * N[ri + l];
    }
    let vx = 0;
    for (let l = 0; l < n; l++) if (inT[l]) vx += p1[rs + l] * x[l];
    const sigma = 1 - p1[rs + s] - vx;
    for (let i = 0; i < n; i++) {
      if (!inT[i]) continue;
      const ri = i * n;
      const f = x[i] / sigma;
      if (f !== 0) for (let l = 0; l < n; l++) if (inT[l]) N[ri + l] += f * y[l];
      N[ri + s] = f;
    }
    for (let l = 0; l < n; l++) N[rs + l] = inT[l] ? y[l] / sigma : 0;
    N[rs + s] = 1 / sigma;
    inT[s] = 1;
    const at = this.starters.indexOf(s);
    if (at >= 0) this.starters.splice(at, 1);
    this.refreshVectors();
  }
}
