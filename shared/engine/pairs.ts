/**
 * Totals of every pair of starters in O(n^2) after the ergodic fundamental matrix (identity 4):
 * with A = {a}, E_i[visits to b before hitting a] = pi_b (H(i,a) + H(a,b) - H(i,b))
 * (Aldous & Fill, Reversible Markov Chains, ch. 2), so by identity 2
 *   total({a, b}) = T_a - H(b,a) (T_a + n H(a,b) - T_b) / (H(a,b) + H(b,a)),
 * where T_x = total({x}). Needs pi > 0 everywhere (one closed class and no transient people,
 * e.g. any connected undirected room or any room with mixing); otherwise the O(n^3) route
 * through one absorbing state per first starter is used.
 */
import { AbsorbingState } from './dense-state';
import { hittingTimes, type ErgodicData } from './ergodic';

/** Row-major n x n matrix of pair totals (symmetric; Infinity on the diagonal and for infeasible pairs). */
export function allPairsTotals(e: ErgodicData): Float64Array {
  const n = e.n;
  const out = new Float64Array(n * n);
  const t = e.singleTotals;
  const irreducible = e.pi.every((p) => p > 0);
  if (irreducible) {
    const H = hittingTimes(e);
    for (let a = 0; a < n; a++) {
      out[a * n + a] = Infinity;
      for (let b = a + 1; b < n; b++) {
        const hab = H[a * n + b];
        const hba = H[b * n + a];
        const v = t[a] - (hba * (t[a] + n * hab - t[b])) / (hab + hba);
        out[a * n + b] = v;
        out[b * n + a] = v;
      }
    }
    return out;
  }
  out.fill(Infinity);
  for (let a = 0; a < n; a++) {
    if (!(e.pi[a] > 0)) continue;
    const s = AbsorbingState.fromErgodic(e, a);
    for (let b = 0; b < n; b++) {
      if (b === a) continue;
      const v = (s.rawTotal - s.rawGain(b)) * s.scale;
      out[a * n + b] = v;
      out[b * n + a] = v;
    }
  }
  return out;
}
