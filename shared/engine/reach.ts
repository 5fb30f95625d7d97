/**
 * Exact reach for a starter set A (engine.md section 1): h = (I - Q)^-1 1 on T = V \ A.
 * - dense, undirected, no mixing: LDL^T (Cholesky-equivalent) on the symmetric form (D - W)_T h = d_T (identity 5);
 * - dense otherwise: LU with partial pivoting on I - Q;                      O(n^3)
 * - sparse undirected, no mixing: Jacobi-preconditioned CG on L_T (identity 5);  O(m * iterations)
 * - sparse otherwise: BiCGSTAB on I - Q with the mixing as a rank-one term.    O(m * iterations)
 * People who cannot reach a starter are excluded from the solve (they never feed back into the
 * finite part), get h = Infinity, and are listed with their reason.
 */
import { EngineError } from './errors';
import type { WalkOptions } from './graph';
import { luFactor, luFactorDominant, luSolve } from './linalg/dense';
import { gthFactor, gthSolve } from './linalg/gth';
import { minimumDegreeOrder } from './linalg/ordering';
import { refine } from './linalg/refine';
import { unreachablePeople, type UnreachablePerson } from './reachability';
import { checkPeople, prepareRoom, type PreparedRoom, type RoomInput } from './room';
import { SparseSystem } from './sparse-system';

export type ReachSolver = 'auto' | 'dense' | 'sparse';

export interface ReachOptions extends WalkOptions {
  readonly solver?: ReachSolver;
  /** Largest room solved densely by `auto` (default 2500). */
  readonly denseLimit?: number;
  /** Relative residual for the iterative solvers (default 1e-12). */
  readonly tolerance?: number;
}

export interface ReachResult {
  readonly n: number;
  readonly starters: number[];
  /** Expected hops to hear per person: 0 on starters, Infinity for the unreachable (listed below). */
  readonly h: Float64Array;
  /** Sum of h over non-starters; Infinity exactly when `unreachable` is not empty. */
  readonly total: number;
  /** total / (n - |A|); Infinity exactly when `unreachable` is not empty. */
  readonly average: number;
  /** Sum and mean over the people who can be reached (finite even when some cannot). */
  readonly reachableTotal: number;
  readonly reachableAverage: number;
  readonly unreachable: UnreachablePerson[];
  readonly solver: 'ldlt' | 'lu' | 'cg' | 'bicgstab' | 'none';
  readonly iterations?: number;
  readonly relativeResidual?: number;
  /** Accuracy warnings (for example a condition number that makes 1e-9 relative impossible). */
  readonly warnings?: string[];
}

export const DEFAULT_DENSE_LIMIT = 2500;

function isSymmetricForm(room: PreparedRoom): boolean {
  return !room.directed && room.mixing === 0;
}

/** Dense I - Q1 restricted to `idx` (row-major, size f x f); symmetric form (D - W) when asked. */
export function denseSystem(room: PreparedRoom, idx: Int32Array, symmetric: boolean): Float64Array {
  const { n, csr, mixing: b } = room;
  const f = idx.length;
  const pos = new Int32Array(n).fill(-1);
  for (let k = 0; k < f; k++) pos[idx[k]] = k;
  const m = new Float64Array(f * f);
  if (!symmetric && b > 0) m.fill(-b / n);
  for (let r = 0; r < f; r++) {
    const i = idx[r];
    const s = csr.outStrength[i];
    const row = r * f;
    if (symmetric) {
      m[row + r] += s;
      for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) {
        const c = pos[csr.col[e]];
        if (c >= 0) m[row + c] -= csr.weight[e];
      }
      continue;
    }
    m[row + r] += 1;
    if (s > 0) {
      const g = (1 - b) / s;
      for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) {
        const c = pos[csr.col[e]];
        if (c >= 0) m[row + c] -= g * csr.weight[e];
      }
    } else m[row + r] -= 1 - b;
  }
  return m;
}

export function exactReach(input: RoomInput, starterList: readonly number[], options: ReachOptions = {}): ReachResult {
  const room = prepareRoom(input, options);
  const starters = checkPeople(room, starterList, 'Starters');
  const n = room.n;
  if (starters.length === 0) throw new EngineError('INVALID_STARTERS', 'Choose at least one starter.');
  const unreachable = unreachablePeople(room, starters);
  const h = new Float64Array(n);
  const active = new Uint8Array(n).fill(1);
  for (const s of starters) active[s] = 0;
  for (const u of unreachable) {
    active[u.index] = 0;
    h[u.index] = Infinity;
  }
  const idxList: number[] = [];
  for (let i = 0; i < n; i++) if (active[i]) idxList.push(i);
  const idx = Int32Array.from(idxList);
  const f = idx.length;
  const warnings: string[] = [];
  let solved: SolveOutcome = { solver: 'none' };
  const limit = options.denseLimit ?? DEFAULT_DENSE_LIMIT;
  const dense = options.solver === 'dense' || (options.solver !== 'sparse' && f <= limit);
  if (f > 0 && dense) solved = solveDense(room, idx, active, h, warnings);
  else if (f > 0) {
    const excluded = [...starters, ...unreachable.map((u) => u.index)];
    solved = solveSparse(room, idx, excluded, options.tolerance ?? 1e-12, h);
  }
  let reachableTotal = 0;
  for (let k = 0; k < f; k++) reachableTotal += h[idx[k]];
  const others = n - starters.length;
  const total = unreachable.length > 0 ? Infinity : reachableTotal;
  return {
    n,
    starters,
    h,
    total,
    average: others > 0 ? total / others : 0,
    reachableTotal,
    reachableAverage: f > 0 ? reachableTotal / f : 0,
    unreachable,
    solver: solved.solver,
    iterations: solved.iterations,
    relativeResidual: solved.relativeResidual,
    warnings,
  };
}

type SolveOutcome = Pick<ReachResult, 'solver' | 'iterations' | 'relativeResidual'>;

/** Fills h on the people of `idx` by a dense factorisation (LDL^T on the symmetric form, else LU). */
function solveDense(room: PreparedRoom, idx: Int32Array, active: Uint8Array, h: Float64Array, warnings: string[]): SolveOutcome {
  const f = idx.length;
  const scale = 1 / (1 - room.laziness);
  if (isSymmetricForm(room)) {
    // Eliminate in minimum degree order so a sparse room's factor stays sparse for longer.
    const ord = f >= 64 ? fillReducingOrder(room, idx) : idx;
    const x = refinedSymmetric(room, ord, active, warnings);
    for (let k = 0; k < f; k++) h[ord[k]] = x[ord[k]] * scale;
    return { solver: 'ldlt' };
  }
  // Without mixing the system is sparse: minimum degree order on the ties taken both ways,
  // then elimination without pivoting (I - Q is a diagonally dominant M-matrix).
  const sparse = room.mixing === 0 && f >= 64;
  const ord = sparse ? fillReducingOrder(room, idx) : idx;
  const m = denseSystem(room, ord, false);
  const rhs = new Float64Array(f);
  rhs.fill(1);
  luSolve(sparse ? luFactorDominant(m, f) : luFactor(m, f), rhs);
  for (let k = 0; k < f; k++) h[ord[k]] = rhs[k] * scale;
  return { solver: 'lu' };
}

/** Fills h on the people of `idx` by CG or BiCGSTAB with the `excluded` people (starters, unreachable) taken out. */
function solveSparse(room: PreparedRoom, idx: Int32Array, excluded: number[], tolerance: number, h: Float64Array): SolveOutcome {
  const scale = 1 / (1 - room.laziness);
  const sys = new SparseSystem(room, excluded, tolerance);
  const x = sys.solve(new Float64Array(room.n).fill(1));
  for (let k = 0; k < idx.length; k++) h[idx[k]] = x[idx[k]] * scale;
  return { solver: sys.symmetric ? 'cg' : 'bicgstab', iterations: sys.iterations, relativeResidual: sys.lastResidual };
}

/**
 * h = L_TT^-1 d_T by the subtraction-free dense LDL^T (linalg/gth.ts) in the order `ord`, then
 * iterative refinement on double-double residuals of the ties (linalg/refine.ts), so badly
 * conditioned rooms (strengths from 1e-6 to 1e6 and beyond) still get 1e-9 relative per person;
 * a warning when even that cannot be reached.
 */
function refinedSymmetric(room: PreparedRoom, ord: Int32Array, active: Uint8Array, warnings: string[]): Float64Array {
  const { n, csr } = room;
  const f = ord.length;
  const pos = new Int32Array(n).fill(-1);
  for (let k = 0; k < f; k++) pos[ord[k]] = k;
  const w = new Float64Array(f * f);
  const g = new Float64Array(f);
  for (let k = 0; k < f; k++) {
    const i = ord[k];
    for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) {
      const j = csr.col[e];
      if (j === i) continue;
      if (pos[j] >= 0) w[k * f + pos[j]] += csr.weight[e];
      else g[k] += csr.weight[e];
    }
  }
  const fac = gthFactor(w, g, f);
  const solveFull = (r: Float64Array) => {
    const t = new Float64Array(f);
    for (let k = 0; k < f; k++) t[k] = r[ord[k]];
    gthSolve(fac, t);
    const out = new Float64Array(n);
    for (let k = 0; k < f; k++) out[ord[k]] = t[k];
    return out;
  };
  const b = new Float64Array(n);
  for (let k = 0; k < f; k++) b[ord[k]] = csr.outStrength[ord[k]];
  const first = solveFull(b);
  if (!first.every(Number.isFinite))
    throw new EngineError(
      'SOLVER_FAILED',
      'Expected hops in this room exceed the number range (tie strengths differ by a factor of more than about 1e150): bring the strengths closer together.',
    );
  const ref = refine(csr, active, 1, b, first, solveFull, 1e-13);
  if (!(ref.lastCorrection <= 1e-9))
    warnings.push(
      `The tie strengths of this room span so wide a range that expected hops are only accurate to about ${ref.lastCorrection.toExponential(0)} relative (1e-9 could not be reached).`,
    );
  return ref.x;
}
/** The people of `idx` in minimum degree order of their ties among themselves. */
function fillReducingOrder(room: PreparedRoom, idx: Int32Array): Int32Array {
  const { csr, n } = room;
  const pos = new Int32Array(n).fill(-1);
  for (let q = 0; q < idx.length; q++) pos[idx[q]] = q;
  const order = minimumDegreeOrder(idx.length, (q, visit) => {
    const i = idx[q];
    for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) {
      const p = pos[csr.col[e]];
      if (p >= 0) visit(p);
    }
  });
  return Int32Array.from(order, (q) => idx[q]);
}
