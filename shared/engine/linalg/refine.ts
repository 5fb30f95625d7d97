/**
 * Accurate residuals for iterative refinement of grounded Laplacian systems
 * K = gamma L_TT + (1 - gamma) D_T (gamma = 1 without background mixing).
 *
 * The residual is formed from the ties, never from a stored diagonal:
 *   (L_TT x)_i = sum_{j in T} w_ij (x_i - x_j) + sum_{j not in T} w_ij x_i,
 * so a strength of 1e-6 next to one of 1e6 is not lost in d_i = 1e6 + 1e-6; every product is
 * split exactly (Dekker, "A floating-point technique for extending the available precision",
 * Numer. Math. 18, 1971: TwoProduct by Veltkamp splitting) and summed with TwoSum (Knuth,
 * TAOCP vol. 2), i.e. in double-double arithmetic. Refinement x += K^-1 r with such residuals
 * reaches the accuracy of the data even when K is badly conditioned, as long as the factor's
 * error contracts (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., 2002, ch. 12).
 */
import type { Csr } from '../graph';

const SPLIT = 134217729; // 2^27 + 1

/** Double-double accumulator: hi + lo. */
class Acc {
  hi = 0;
  lo = 0;
  add(a: number): void {
    const s = this.hi + a;
    const bb = s - this.hi;
    this.lo += this.hi - (s - bb) + (a - bb);
    this.hi = s;
  }
  /** Adds a * b exactly (TwoProduct). */
  addProduct(a: number, b: number): void {
    const p = a * b;
    let t = SPLIT * a;
    const ah = t - (t - a);
    const al = a - ah;
    t = SPLIT * b;
    const bh = t - (t - b);
    const bl = b - bh;
    const e = al * bl - (p - ah * bh - al * bh - ah * bl);
    this.add(p);
    this.lo += e;
  }
  value(): number {
    return this.hi + this.lo;
  }
}

/** r = b - K x on T (0 elsewhere), in double-double. Returns the residual and its 2-norm ratio to b. */
export function groundedResidual(
  csr: Csr,
  inT: Uint8Array,
  gamma: number,
  b: Float64Array,
  x: Float64Array,
): { r: Float64Array; relative: number } {
  const { n, rowStart, col, weight, outStrength } = csr;
  const r = new Float64Array(n);
  const acc = new Acc();
  let nr = 0;
  let nb = 0;
  for (let i = 0; i < n; i++) {
    if (!inT[i]) continue;
    acc.hi = b[i];
    acc.lo = 0;
    const xi = x[i];
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      const j = col[e];
      if (j === i) continue;
      acc.addProduct(-gamma * weight[e], inT[j] ? xi - x[j] : xi);
    }
    if (gamma !== 1) acc.addProduct(-(1 - gamma) * outStrength[i], xi);
    r[i] = acc.value();
    nr += r[i] * r[i];
    nb += b[i] * b[i];
  }
  return { r, relative: Math.sqrt(nr) / (Math.sqrt(nb) || 1) };
}

export interface Refined {
  readonly x: Float64Array;
  /** Largest relative change of an entry in the last correction (an estimate of the remaining forward error). */
  readonly lastCorrection: number;
  readonly steps: number;
}

/**
 * Refines x in place: up to `maxSteps` corrections solve(r), stopping once no entry changes by
 * more than `target` relative to itself. `solve` must return K^-1 r on T.
 */
export function refine(
  csr: Csr,
  inT: Uint8Array,
  gamma: number,
  b: Float64Array,
  x: Float64Array,
  solve: (r: Float64Array) => Float64Array,
  target = 1e-12,
  maxSteps = 6,
): Refined {
  let last = Infinity;
  let steps = 0;
  for (; steps < maxSteps; steps++) {
    const { r } = groundedResidual(csr, inT, gamma, b, x);
    const dx = solve(r);
    last = 0;
    for (let i = 0; i < x.length; i++) {
      if (!inT[i]) continue;
      x[i] += dx[i];
      if (x[i] !== 0) last = Math.max(last, Math.abs(dx[i] / x[i]));
    }
    if (last <= target) {
      steps++;
      break;
    }
  }
  return { x, lastCorrection: last, steps };
}
