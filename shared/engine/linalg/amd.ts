/**
 * Approximate minimum degree ordering on the quotient graph (Amestoy, Davis & Duff, "An
 * approximate minimum degree ordering algorithm", SIAM J. Matrix Anal. Appl. 17, 1996):
 * eliminated people become elements; a variable's degree is bounded from above by
 * |variables| + |L_p \ i| + sum over its other elements e of |L_e \ L_p| (the w(e) trick),
 * elements whose members all lie in the new element are absorbed. Supervariables are not
 * detected (simpler, slightly slower orderings). People with very many ties (degree above
 * 10 sqrt(n), as AMD does) are ordered last. Deterministic: ties by degree bucket order.
 * Returns order[k] = the person eliminated k-th.
 *
 * Each pivot's list L_p is exactly its column of the factor (people of dense rows aside), so
 * the running sums of |L_p| and |L_p|^2 are lower bounds on the factor's nonzeros and work:
 * `amdOrderWithin` stops as soon as they pass a budget (a room whose factor cannot fit is
 * refused after a fraction of the ordering's time).
 */
export interface SymmetricPattern {
  readonly n: number;
  /** CSR of the off-diagonal pattern, both triangles (row i lists j != i). */
  readonly rowStart: Int32Array;
  readonly col: Int32Array;
}

export interface FactorBudget {
  /** Nonzeros below the diagonal. */
  readonly nnz: number;
  /** Sum of squared column counts. */
  readonly work: number;
}

export function amdOrder(g: SymmetricPattern): Int32Array {
  return amdOrderWithin(g, { nnz: Infinity, work: Infinity })!;
}

/** The AMD order, or null once the factor in that order is known to exceed the budget. */
// eslint-disable-next-line max-lines-per-function -- the minimum-degree elimination is one loop over shared arrays (degrees, element lists, marks); split into functions it would pass a dozen arrays around on every pivot.
export function amdOrderWithin(g: SymmetricPattern, budget: FactorBudget): Int32Array | null {
  const n = g.n;
  const dense = Math.max(16, Math.floor(10 * Math.sqrt(n)));
  const out = new Int32Array(n);
  let top = 0;
  const late: number[] = [];
  const gone = new Uint8Array(n); // eliminated, skipped or dense
  for (let i = 0; i < n; i++) {
    if (g.rowStart[i + 1] - g.rowStart[i] > dense) {
      late.push(i);
      gone[i] = 1;
    }
  }
  const vars = new Array<Int32Array>(n);
  const varLen = new Int32Array(n);
  const elts = new Array<number[]>(n);
  const members = new Array<Int32Array | null>(n).fill(null);
  const deg = new Int32Array(n);
  const head = new Int32Array(n + 1).fill(-1);
  const next = new Int32Array(n).fill(-1);
  const prev = new Int32Array(n).fill(-1);
  const absorbed = new Uint8Array(n);
  let live = 0;
  const insert = (i: number) => {
    const d = deg[i];
    next[i] = head[d];
    prev[i] = -1;
    if (head[d] >= 0) prev[head[d]] = i;
    head[d] = i;
  };
  const unlink = (i: number) => {
    if (prev[i] >= 0) next[prev[i]] = next[i];
    else head[deg[i]] = next[i];
    if (next[i] >= 0) prev[next[i]] = prev[i];
  };
  for (let i = 0; i < n; i++) {
    if (gone[i]) continue;
    const vs: number[] = [];
    for (let e = g.rowStart[i]; e < g.rowStart[i + 1]; e++) if (!gone[g.col[e]] && g.col[e] !== i) vs.push(g.col[e]);
    vars[i] = Int32Array.from(vs);
    varLen[i] = vs.length;
    elts[i] = [];
    deg[i] = vs.length;
    live++;
  }
  for (let i = n - 1; i >= 0; i--) if (!gone[i]) insert(i);
  const mark = new Int32Array(n);
  const wStamp = new Int32Array(n);
  const wVal = new Int32Array(n);
  let stamp = 0;
  let minDeg = 0;
  const lp: number[] = [];
  let nnz = 0;
  let work = 0;
  for (; live > 0; live--) {
    while (head[minDeg] < 0) minDeg++;
    const p = head[minDeg];
    unlink(p);
    gone[p] = 1;
    out[top++] = p;
    stamp++;
    lp.length = 0;
    mark[p] = stamp;
    const vp = vars[p];
    for (let q = 0; q < varLen[p]; q++) {
      const v = vp[q];
      if (!gone[v] && mark[v] !== stamp) {
        mark[v] = stamp;
        lp.push(v);
      }
    }
    for (const e of elts[p]) {
      if (absorbed[e]) continue;
      for (const v of members[e]!)
        if (!gone[v] && mark[v] !== stamp) {
          mark[v] = stamp;
          lp.push(v);
        }
      absorbed[e] = 1;
      members[e] = null;
    }
    nnz += lp.length;
    work += lp.length * lp.length;
    if (nnz > budget.nnz || work > budget.work) return null;
    members[p] = Int32Array.from(lp);
    varLen[p] = 0;
    elts[p] = [];
    // w(e) = |L_e \ L_p| for every element next to L_p.
    for (const i of lp) {
      for (const e of elts[i]) {
        if (absorbed[e]) continue;
        if (wStamp[e] !== stamp) {
          wStamp[e] = stamp;
          wVal[e] = members[e]!.length;
        }
        wVal[e]--;
      }
    }
    const remaining = live - 1;
    for (const i of lp) {
      unlink(i);
      let ext = 0;
      const es = elts[i];
      let ne = 0;
      for (let q = 0; q < es.length; q++) {
        const e = es[q];
        if (absorbed[e] || e === p) continue;
        if (wVal[e] === 0) {
          absorbed[e] = 1; // aggressive absorption: L_e lies inside L_p
          members[e] = null;
          continue;
        }
        es[ne++] = e;
        ext += wVal[e];
      }
      es.length = ne;
      es.push(p);
      const vs = vars[i];
      let nv = 0;
      for (let q = 0; q < varLen[i]; q++) {
        const v = vs[q];
        if (!gone[v] && mark[v] !== stamp) vs[nv++] = v;
      }
      varLen[i] = nv;
      const d = Math.min(remaining - 1, deg[i] + lp.length - 1, nv + lp.length - 1 + ext);
      deg[i] = Math.max(0, d);
      insert(i);
      if (deg[i] < minDeg) minDeg = deg[i];
    }
  }
  for (const i of late) out[top++] = i;
  return out;
}
