/**
 * What the exact greedy on iterative solves and its first pick share (the solve that refuses to
 * return an unconverged value, the tie-break test against a bound), and the masked-vector helpers
 * both exact greedy paths use.
 */
import { EngineError } from './errors';
import type { GroundedLaplacian } from './linalg/grounded-laplacian';

/** Relative residual of every exact check and of u and v. */
export const CHECK_TOL = 1e-10;
/** Each rank-one step lowers the diagonal bounds by this relative margin, for rounding in g. */
export const STEP_SAFETY = 1 - 1e-9;
/** Lanczos steps of the bound every person gets at the start, and of a refresh of the person on top. */
export const CHEAP_HOPS = 2;
export const DEEP_HOPS = 8;

/**
 * Whether a person whose true total is at least `low` could still win against the incumbent
 * under the engine's tie-break (beats in dense-state.ts): a later person only by a smaller
 * total, an earlier one also by a tie within the tolerance.
 */
export function mayBeat(low: number, j: number, bestT: number, best: number, tol: number): boolean {
  if (best < 0) return true;
  if (j > best) return low < bestT;
  return low <= bestT + 2 * tol * Math.abs(bestT);
}

/** K x = b by CG (from x0 when given); a solve that does not converge is an error, not a silent value. */
export function solved(k: GroundedLaplacian, b: Float64Array, x0?: Float64Array, tol = CHECK_TOL): Float64Array {
  const x = x0 ? Float64Array.from(x0) : new Float64Array(k.n);
  const out = k.solve(b, x, tol);
  if (!out.converged && !(out.relativeResidual <= 100 * tol))
    throw new EngineError(
      'SOLVER_FAILED',
      `The iterative solver did not converge (relative residual ${out.relativeResidual.toExponential(2)} after ${out.iterations} iterations).`,
    );
  return x;
}

export function invert(inT: Uint8Array): Uint8Array {
  const g = new Uint8Array(inT.length);
  for (let i = 0; i < inT.length; i++) g[i] = inT[i] ? 0 : 1;
  return g;
}

export function masked(x: Float64Array, keep: Uint8Array): Float64Array {
  const b = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) if (keep[i]) b[i] = x[i];
  return b;
}

export function sumOn(x: Float64Array, keep: Uint8Array): number {
  let t = 0;
  for (let i = 0; i < x.length; i++) if (keep[i]) t += x[i];
  return t;
}
