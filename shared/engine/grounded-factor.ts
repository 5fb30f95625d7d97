/**
 * The grounded system of an undirected room as a sparse LDL^T factor (docs/engine.md
 * section 7): K = D_T - gamma W_TT on the people T not grounded, with gamma = 1 without
 * background mixing (K = L_TT, the grounded Laplacian) and gamma = 1 - b with mixing b (the
 * rank-one part is handled by the caller, Sherman-Morrison). Grounded people keep a unit
 * diagonal and no ties, so one fill-reducing order of the whole room serves every starter set.
 * Solves can be refined: x += K^-1 (b - K x) with double-double residuals formed from the ties
 * (linalg/refine.ts), which recovers digits lost to ill-conditioning.
 */
import type { Csr } from './graph';
import type { FillOrderChoice } from './plan-types';
import { amdOrderWithin } from './linalg/amd';
import { LEAF, nestedDissectionOrder } from './linalg/nested-dissection';
import { analyse, analyseWithin, factor, ldlSolve, SpdMatrix, type LdlFactor, type Symbolic } from './linalg/sparse-ldl';
import { refine, type Refined } from './linalg/refine';
import { inverseDiagonal } from './linalg/selected-inverse';

/** Largest factorisation work (sum of squared column counts) before the iterative path is used: about a minute here. */
export const MAX_FACTOR_WORK = 3e10;

/** The symbolic step's verdict: does a factor of this size and work fit? */
export function factorFits(sym: { nnz: number; flops: number }, maxFill: number, maxWork = MAX_FACTOR_WORK): boolean {
  return sym.nnz <= maxFill && sym.flops <= maxWork;
}

/** The fill-reducing order chosen for a room, with the symbolic estimate (whole room, nothing grounded) that chose it. */
export interface RoomOrder {
  readonly order: Int32Array;
  readonly method: 'amd' | 'nested-dissection';
  readonly nnz: number;
  readonly work: number;
}

/**
 * Orders per CSR: the ties of a prepared room never change, so repeated plans of a room (a
 * k-sweep, a re-plan) order it once. A refusal is kept with the limits it was made under.
 */
const orders = new WeakMap<Csr, { readonly chosen: RoomOrder | null; readonly maxFill: number; readonly maxWork: number }>();

/**
 * The room's fill-reducing order (read only: it is shared between calls): nested dissection or
 * approximate minimum degree, whichever the symbolic step finds cheaper (less work, then fewer
 * nonzeros; docs/sparse-greedy.md section 3). Null when neither can fit `maxFill` / `maxWork`.
 */
export function fillReducingOrder(
  csr: Csr,
  maxFill = Infinity,
  maxWork = MAX_FACTOR_WORK,
  method: FillOrderChoice = 'auto',
): RoomOrder | null {
  if (method !== 'auto') return forcedOrder(csr, method, maxFill, maxWork);
  const cached = orders.get(csr);
  if (cached && (cached.chosen || (maxFill <= cached.maxFill && maxWork <= cached.maxWork))) return cached.chosen;
  const chosen = chooseOrder(csr, maxFill, maxWork);
  orders.set(csr, { chosen, maxFill, maxWork });
  return chosen;
}

/** One order forced (tests, benchmarks), not cached; null when its factor cannot fit. */
function forcedOrder(csr: Csr, method: RoomOrder['method'], maxFill: number, maxWork: number): RoomOrder | null {
  const { fillLimit, workLimit } = roomLimits(csr, maxFill, maxWork);
  const order = method === 'amd' ? amdOrderWithin(csr, { nnz: fillLimit, work: Infinity }) : nestedDissectionOrder(csr);
  return judged(csr, order, method, fillLimit, workLimit);
}

function chooseOrder(csr: Csr, maxFill: number, maxWork: number): RoomOrder | null {
  // Up to one leaf, nested dissection is the minimum-degree order itself.
  if (csr.n <= LEAF) return forcedOrder(csr, 'amd', maxFill, maxWork);
  const { fillLimit, workLimit } = roomLimits(csr, maxFill, maxWork);
  const nd = judged(csr, nestedDissectionOrder(csr), 'nested-dissection', fillLimit, workLimit);
  // Minimum degree stops once it is known to need more work than nested dissection.
  const amdOrd = amdOrderWithin(csr, { nnz: fillLimit, work: nd ? nd.work : workLimit });
  const amd = judged(csr, amdOrd, 'amd', fillLimit, workLimit);
  if (!amd) return nd;
  if (!nd) return amd;
  return nd.work < amd.work || (nd.work === amd.work && nd.nnz < amd.nnz) ? nd : amd;
}

/**
 * The limits an order is judged by, on the whole room: grounding a person removes at most n - 1
 * nonzeros (and 2 nnz of work), so with one grounded person's slack these limits refuse no room
 * whose factor grounded at one person fits (with several grounded, a room within a few rows of the limit).
 */
function roomLimits(csr: Csr, maxFill: number, maxWork: number): { fillLimit: number; workLimit: number } {
  const fillLimit = maxFill + csr.n;
  return { fillLimit, workLimit: maxWork + 2 * fillLimit };
}

/** An order with its symbolic estimate; null when there is no order or its factor passes the limits. */
function judged(csr: Csr, order: Int32Array | null, method: RoomOrder['method'], fillLimit: number, workLimit: number): RoomOrder | null {
  const sym = order ? analyseWithin(csr, order, fillLimit, workLimit) : null;
  return order && sym ? { order, method, nnz: sym.nnz, work: sym.flops } : null;
}

export function groundedMatrix(csr: Csr, grounded: Uint8Array, gamma: number): SpdMatrix {
  const n = csr.n;
  const start = new Int32Array(n + 1);
  countTies(csr, grounded, start);
  const m = new SpdMatrix(n, start, new Int32Array(start[n]), new Float64Array(start[n]), new Float64Array(n));
  fillTies(csr, grounded, gamma, m);
  return m;
}

/** start[i + 1] - start[i] = ties of i to people not grounded (none for grounded people). */
function countTies(csr: Csr, grounded: Uint8Array, start: Int32Array): void {
  const { n, rowStart, col } = csr;
  for (let i = 0; i < n; i++) {
    let c = 0;
    if (!grounded[i]) for (let e = rowStart[i]; e < rowStart[i + 1]; e++) if (col[e] !== i && !grounded[col[e]]) c++;
    start[i + 1] = start[i] + c;
  }
}

/** The entries of K: -gamma w_ij off the diagonal, d_i - gamma w_ii on it, 1 for grounded people. */
function fillTies(csr: Csr, grounded: Uint8Array, gamma: number, m: SpdMatrix): void {
  const { n, rowStart, col, weight, outStrength } = csr;
  const { col: cols, val, diag } = m;
  for (let i = 0; i < n; i++) {
    if (grounded[i]) {
      diag[i] = 1;
      continue;
    }
    let q = m.rowStart[i];
    let self = 0;
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      const j = col[e];
      if (j === i) self += weight[e];
      else if (!grounded[j]) {
        cols[q] = j;
        val[q++] = -gamma * weight[e];
      }
    }
    diag[i] = outStrength[i] - gamma * self;
  }
}

export class GroundedFactor {
  readonly matrix: SpdMatrix;
  readonly sym: Symbolic;
  private f: LdlFactor | null = null;
  private readonly work: Float64Array;

  private readonly inT: Uint8Array;

  constructor(
    private readonly csr: Csr,
    order: Int32Array,
    grounded: Uint8Array,
    private readonly gamma: number,
  ) {
    this.inT = grounded.map((g) => (g ? 0 : 1));
    this.matrix = groundedMatrix(csr, grounded, gamma);
    this.sym = analyse(this.matrix, order);
    this.work = new Float64Array(csr.n);
  }

  /** Numeric factorisation (call after checking `sym.nnz`, the fill estimate). */
  factorise(): this {
    this.f = factor(this.matrix, this.sym);
    return this;
  }

  get ldl(): LdlFactor {
    if (!this.f) this.factorise();
    return this.f!;
  }

  solve(b: Float64Array, out?: Float64Array): Float64Array {
    return ldlSolve(this.ldl, b, out, this.work);
  }

  /** diag(K^-1) by selected inversion. */
  inverseDiagonal(): Float64Array {
    return inverseDiagonal(this.ldl);
  }

  /** Solve with refinement on double-double residuals of the ties (linalg/refine.ts). */
  solveRefined(b: Float64Array, target = 1e-13): Refined {
    return refine(this.csr, this.inT, this.gamma, b, this.solve(b), (r) => this.solve(r), target);
  }
}
