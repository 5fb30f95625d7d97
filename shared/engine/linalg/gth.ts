/**
 * Subtraction-free LDL^T of a grounded Laplacian K = L_TT (dense, row-major, eliminating in
 * the given order): every pivot is formed as the sum of the remaining tie strengths of its row
 * plus its strength to the ground (the starters), never as diagonal minus something, and the
 * ground strengths are carried along:
 *   p_k = g_k + sum_{j > k} w_kj;  f_ik = w_ik / p_k;
 *   w_ij += f_ik w_kj;  g_i += f_ik g_k                      (i, j > k)
 * (the GTH rule: Grassmann, Taksar & Heyman, "Regenerative analysis and steady state
 * distributions for Markov chains", Operations Research 33, 1985). Factor and solves with a
 * non-negative right-hand side then involve only additions of positive terms, so every
 * entry of the solution is accurate to a small multiple of machine precision whatever the
 * spread of the strengths (O'Cinneide, "Entrywise perturbation theory and error analysis for
 * Markov chains", Numer. Math. 65, 1993), short of overflow.
 */
export interface GthFactor {
  readonly f: number;
  /** Row-major: a[i * f + k] = f_ik for i > k (the negated multipliers). */
  readonly a: Float64Array;
  readonly pivot: Float64Array;
  /** Columns of the strictly lower part with a non-zero multiplier, per pivot k. */
  readonly below: Int32Array[];
}

/**
 * `w` is row-major f x f with w[i * f + j] = strength between i and j (i != j, within T; the
 * diagonal is ignored) and `g[i]` the strength from i to the ground. Both are overwritten.
 */
export function gthFactor(w: Float64Array, g: Float64Array, f: number): GthFactor {
  const pivot = new Float64Array(f);
  const below = new Array<Int32Array>(f);
  const list = new Int32Array(f);
  for (let k = 0; k < f; k++) {
    const rk = k * f;
    let p = g[k];
    let cnt = 0;
    for (let j = k + 1; j < f; j++) {
      const x = w[rk + j];
      if (x !== 0) {
        p += x;
        list[cnt++] = j;
      }
    }
    if (!(p > 0)) throw new Error(`No path to a starter from position ${k} of the elimination.`);
    pivot[k] = p;
    const gk = g[k];
    for (let q = 0; q < cnt; q++) {
      const i = list[q];
      const ri = i * f;
      const fik = w[ri + k] / p;
      w[ri + k] = fik;
      if (gk !== 0) g[i] += fik * gk;
      for (let s = 0; s < cnt; s++) {
        const j = list[s];
        if (j !== i) w[ri + j] += fik * w[rk + j];
      }
    }
    below[k] = list.slice(0, cnt);
  }
  return { f, a: w, pivot, below };
}

/** Solves K x = b in place (b >= 0 keeps every step subtraction-free). */
export function gthSolve(fac: GthFactor, b: Float64Array): Float64Array {
  const { f, a, pivot, below } = fac;
  for (let k = 0; k < f; k++) {
    const yk = b[k];
    if (yk !== 0) for (const i of below[k]) b[i] += a[i * f + k] * yk;
  }
  for (let k = f - 1; k >= 0; k--) {
    let s = b[k] / pivot[k];
    for (const i of below[k]) s += a[i * f + k] * b[i];
    b[k] = s;
  }
  return b;
}
