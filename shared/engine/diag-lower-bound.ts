/**
 * Proven lower bounds on the diagonal of G = K^-1 for a grounded Laplacian K, person by person,
 * without solving (docs/sparse-greedy.md section 8). For any set of vectors Y with Y^T K Y
 * positive definite, Cauchy-Schwarz in the K inner product gives
 *   G_jj >= b^T (Y^T K Y)^-1 b,   b = Y^T e_j,
 * whatever Y is: a better Y only makes the bound tighter. Here Y holds a few Lanczos vectors
 * of K started at e_j (a ball of some hops around j: what walks near j contribute) and two
 * global vectors the greedy already has (G d and G 1, K-orthogonalised: the room's slow mode).
 * The small system is solved by a Cholesky factor that drops a vector whose pivot falls below
 * 1e-8 of its diagonal (the bound then holds for the smaller Y), and the result is lowered by
 * a relative 1e-7 so rounding in it cannot lift it above the true value.
 * Cost per person: the ball's ties times the hops, capped at MAX_BALL people.
 */
import type { GroundedLaplacian } from './linalg/grounded-laplacian';

/** Most Lanczos steps from e_j (the local vectors are e_j, K e_j, ..., K^hops e_j orthonormalised). */
export const MAX_HOPS = 8;
/** A ball that grows past this many people stops adding local vectors (the bound stays valid). */
const MAX_BALL = 4096;
const DROP = 1e-8;
const SAFETY = 1 - 1e-7;

interface GlobalVector {
  readonly g: Float64Array;
  /** g^T K g for this vector and the cross term with the previous one. */
  readonly self: number;
}

export class DiagLowerBound {
  private readonly pos: Int32Array;
  private nodes: Int32Array;
  private q: Float64Array[];
  private kq: Float64Array[];
  private globals: GlobalVector[] = [];
  private cross = 0;
  /** Size of the supports: q_l lives on nodes[0..qSize[l]), K q_l on nodes[0..kqSize[l]). */
  private readonly qSize = new Int32Array(MAX_HOPS + 1);
  private readonly kqSize = new Int32Array(MAX_HOPS + 1);
  private readonly alpha = new Float64Array(MAX_HOPS + 1);
  private readonly beta = new Float64Array(MAX_HOPS + 1);
  private count = 0;

  constructor(private readonly k: GroundedLaplacian) {
    this.pos = new Int32Array(k.n).fill(-1);
    this.nodes = new Int32Array(256);
    this.q = Array.from({ length: MAX_HOPS + 1 }, () => new Float64Array(256));
    this.kq = Array.from({ length: MAX_HOPS + 1 }, () => new Float64Array(256));
  }

  /** Sets the global vectors (any two vectors zero on the grounded people; K-orthogonalised here). */
  setGlobals(a: Float64Array, b: Float64Array): void {
    const { k } = this;
    const n = k.n;
    const ka = new Float64Array(n);
    const kb = new Float64Array(n);
    k.mul(a, ka);
    k.mul(b, kb);
    const saa = dotFull(a, ka);
    this.globals = [];
    if (!(saa > 0)) return;
    this.globals.push({ g: a, self: saa });
    const c = dotFull(a, kb) / saa;
    const g2 = new Float64Array(n);
    const kg2 = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      g2[i] = b[i] - c * a[i];
      kg2[i] = kb[i] - c * ka[i];
    }
    const s22 = dotFull(g2, kg2);
    if (s22 > DROP * dotFull(b, kb)) {
      this.globals.push({ g: g2, self: s22 });
      this.cross = dotFull(a, kg2);
    }
  }

  /** A proven lower bound on G_jj (j not grounded) from `hops` Lanczos steps (at most MAX_HOPS). */
  lower(j: number, hops: number): number {
    this.count = 0;
    this.add(j);
    this.q[0][0] = 1;
    this.qSize[0] = 1;
    const levels = this.lanczos(Math.min(hops, MAX_HOPS));
    const value = this.project(j, levels);
    for (let i = 0; i < this.count; i++) this.pos[this.nodes[i]] = -1;
    return value * SAFETY;
  }

  /** Builds q_0..q_L and K q_l; returns L + 1. */
  private lanczos(hops: number): number {
    let levels = 0;
    for (let l = 0; l <= hops; l++) {
      if (l > 0 && this.count > MAX_BALL) break;
      this.applyK(l);
      levels = l + 1;
      if (l === hops || !this.nextVector(l)) break;
    }
    return levels;
  }

  /** kq_l = K q_l, growing the ball by q_l's neighbours. */
  private applyK(l: number): void {
    const { k, pos } = this;
    const size = this.qSize[l];
    for (let a = 0; a < this.count; a++) this.kq[l][a] = 0;
    for (let a = 0; a < size; a++) {
      const i = this.nodes[a];
      const x = this.q[l][a];
      if (x === 0) continue;
      this.kq[l][a] += k.diag[i] * x;
      for (let e = k.rowStart[i]; e < k.rowStart[i + 1]; e++) {
        const jj = k.col[e];
        let b = pos[jj];
        if (b < 0) b = this.add(jj);
        this.kq[l][b] += k.val[e] * x;
      }
    }
    this.kqSize[l] = this.count;
  }

  /** q_{l+1} from K q_l by Lanczos with full reorthogonalisation; false when the ball is exhausted. */
  private nextVector(l: number): boolean {
    const m = this.kqSize[l];
    const w = this.q[l + 1];
    const kql = this.kq[l];
    for (let a = 0; a < m; a++) w[a] = kql[a];
    this.alpha[l] = localDot(this.q[l], w, this.qSize[l]);
    for (let pass = 0; pass < 2; pass++)
      for (let s = 0; s <= l; s++) {
        const c = localDot(this.q[s], w, this.qSize[s]);
        axpyLocal(-c, this.q[s], w, this.qSize[s]);
      }
    const b = Math.sqrt(localDot(w, w, m));
    this.beta[l] = b;
    if (!(b > 1e-12 * Math.abs(this.alpha[l]))) return false;
    for (let a = 0; a < m; a++) w[a] /= b;
    this.qSize[l + 1] = m;
    return true;
  }

  /** b^T A^-1 b for A = Y^T K Y with Y = [q_0..q_{L-1}, globals], b = Y^T e_j, by dropping Cholesky. */
  private project(j: number, levels: number): number {
    const g = this.globals.length;
    const size = levels + g;
    const a = new Float64Array(size * size);
    const rhs = new Float64Array(size);
    rhs[0] = 1;
    for (let l = 0; l < levels; l++) {
      a[l * size + l] = l + 1 < levels ? this.alpha[l] : localDot(this.q[l], this.kq[l], this.qSize[l]);
      if (l + 1 < levels) a[l * size + l + 1] = a[(l + 1) * size + l] = this.beta[l];
      for (let s = 0; s < g; s++) {
        const c = this.globalDot(l, this.globals[s].g);
        a[l * size + levels + s] = a[(levels + s) * size + l] = c;
      }
    }
    for (let s = 0; s < g; s++) {
      a[(levels + s) * size + levels + s] = this.globals[s].self;
      rhs[levels + s] = this.globals[s].g[j];
    }
    if (g === 2) a[levels * size + levels + 1] = a[(levels + 1) * size + levels] = this.cross;
    return quadraticInverse(a, rhs, size);
  }

  /** (K q_l)^T g over the ball. */
  private globalDot(l: number, g: Float64Array): number {
    let s = 0;
    const kql = this.kq[l];
    for (let a = 0; a < this.kqSize[l]; a++) s += kql[a] * g[this.nodes[a]];
    return s;
  }

  private add(i: number): number {
    if (this.count === this.nodes.length) this.grow();
    this.pos[i] = this.count;
    this.nodes[this.count] = i;
    for (let l = 0; l <= MAX_HOPS; l++) {
      this.q[l][this.count] = 0;
      this.kq[l][this.count] = 0;
    }
    return this.count++;
  }

  private grow(): void {
    const cap = this.nodes.length * 2;
    const nodes = new Int32Array(cap);
    nodes.set(this.nodes);
    this.nodes = nodes;
    this.q = this.q.map((v) => copyInto(v, cap));
    this.kq = this.kq.map((v) => copyInto(v, cap));
  }
}

/**
 * b^T A^-1 b for symmetric A by LDL^T, dropping any vector whose pivot is below DROP of its
 * diagonal (then the value is b'^T A'^-1 b' for the kept rows: still a lower bound).
 */
export function quadraticInverse(a: Float64Array, b: Float64Array, size: number): number {
  const lo = new Float64Array(size * size);
  const d = new Float64Array(size);
  const y = new Float64Array(size);
  const kept = new Uint8Array(size);
  let quad = 0;
  for (let r = 0; r < size; r++) {
    let dr = a[r * size + r];
    let yr = b[r];
    for (let c = 0; c < r; c++) {
      if (!kept[c]) continue;
      let s = a[r * size + c];
      for (let t = 0; t < c; t++) if (kept[t]) s -= lo[r * size + t] * d[t] * lo[c * size + t];
      const l = s / d[c];
      lo[r * size + c] = l;
      dr -= l * l * d[c];
      yr -= l * y[c];
    }
    if (!(dr > DROP * a[r * size + r])) continue;
    kept[r] = 1;
    d[r] = dr;
    y[r] = yr;
    quad += (yr * yr) / dr;
  }
  return quad;
}

function localDot(x: Float64Array, y: Float64Array, m: number): number {
  let s = 0;
  for (let a = 0; a < m; a++) s += x[a] * y[a];
  return s;
}

function axpyLocal(c: number, x: Float64Array, y: Float64Array, m: number): void {
  for (let a = 0; a < m; a++) y[a] += c * x[a];
}

function dotFull(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i] * y[i];
  return s;
}

function copyInto(v: Float64Array, cap: number): Float64Array {
  const out = new Float64Array(cap);
  out.set(v);
  return out;
}
