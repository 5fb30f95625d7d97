/**
 * The starting set of the sparse exact greedy, the same as the dense planners' (plan-context.ts
 * `initialState`): the required people, then for every closed group (connected part) without
 * one its best single starter, scored for all members at once (docs/engine.md section 7,
 * identity 5): with X the inverse of the part's Laplacian grounded at one member r,
 *   L+_jj = X_jj - 2 (X1)_j / n_C + 1^T X 1 / n_C^2
 *   (L+ d)_j = (Xd)_j - (vol_C / n_C)(X1)_j - (1^T X d - (vol_C / n_C) 1^T X 1) / n_C
 *   F({j}) = n_C (vol_C L+_jj - (L+ d)_j).
 * One factorisation, one selected inversion and two solves serve every part. With background
 * mixing the system of the whole room is already positive definite, so the first starter is
 * an ordinary greedy step and nothing is done here.
 */
import { beats, tieTolerance } from './dense-state';
import { factorFits, GroundedFactor } from './grounded-factor';
import type { PlanContext } from './plan-context';

export interface FirstStarters {
  readonly set: number[];
  /** True when every allowed person was scored as a single starter (one closed group, nothing required). */
  readonly scoredAll: boolean;
  /** Worst single-starter total (one worst member per closed group; unscaled), when scored here. */
  readonly worst?: number;
  /** With one closed group: the best single starter over everyone and its total (unscaled). */
  readonly bestSingle?: { person: number; total: number };
  /** The factor of the room grounded at `ground` and diag of its inverse X (0 on the grounded people), for reuse. */
  readonly grounded?: { readonly f: GroundedFactor; readonly ground: Uint8Array; readonly diag: Float64Array };
}

export function firstStarters(ctx: PlanContext, order: Int32Array, maxFill: number, maxWork: number): FirstStarters | null {
  const { room, n } = ctx;
  const set = [...ctx.mustInclude];
  const isIn = new Uint8Array(n);
  for (const p of set) isIn[p] = 1;
  if (room.mixing > 0) return { set: [], scoredAll: false };
  const classes = ctx.classes.closedClasses;
  const pinv = new Int32Array(n);
  for (let q = 0; q < n; q++) pinv[order[q]] = q;
  // One member of every part grounded (the one eliminated last: no extra fill).
  const grounded = new Uint8Array(n);
  for (const cls of classes) grounded[cls.reduce((r, p) => (pinv[p] > pinv[r] ? p : r), cls[0])] = 1;
  const f = new GroundedFactor(room.csr, order, grounded, 1);
  if (!factorFits(f.sym, maxFill, maxWork)) return null;
  f.factorise();
  const xd = f.inverseDiagonal();
  const d = room.csr.outStrength;
  const b1 = new Float64Array(n);
  const bd = new Float64Array(n);
  for (let i = 0; i < n; i++)
    if (!grounded[i]) {
      b1[i] = 1;
      bd[i] = d[i];
    }
  const x1 = f.solve(b1);
  const xdv = f.solve(bd);
  for (let i = 0; i < n; i++) if (grounded[i]) xd[i] = x1[i] = xdv[i] = 0;
  let worst = 0;
  let bestSingle: FirstStarters['bestSingle'];
  for (const cls of classes) {
    const part = scorePart(ctx, cls, xd, x1, xdv);
    worst += part.worst;
    if (classes.length === 1) bestSingle = part.bestAny;
    if (!cls.some((p) => isIn[p])) set.push(part.best);
  }
  return {
    set,
    scoredAll: classes.length === 1 && ctx.mustInclude.length === 0,
    worst,
    ...(bestSingle ? { bestSingle } : {}),
    grounded: { f, ground: grounded, diag: xd },
  };
}

/** The best allowed single starter of a part (tie-break of docs/engine.md) and the worst single total. */
function scorePart(
  ctx: PlanContext,
  cls: number[],
  xd: Float64Array,
  x1: Float64Array,
  xdv: Float64Array,
): { best: number; worst: number; bestAny?: { person: number; total: number } } {
  const m = cls.length;
  if (m === 1) return { best: cls[0], worst: 0 };
  const { vol, s1, rho, shift } = partSums(cls, ctx.room.csr.outStrength, x1, xdv);
  const tol = tieTolerance(m);
  let best = -1;
  let bestT = Infinity;
  let any = -1;
  let anyT = Infinity;
  let worst = 0;
  for (const j of cls) {
    const lpjj = xd[j] - (2 * x1[j]) / m + s1 / (m * m);
    const lpd = xdv[j] - rho * x1[j] - shift;
    const t = m * (vol * lpjj - lpd);
    if (t > worst) worst = t;
    if (ctx.allowed[j] && beats(t, j, bestT, best, tol)) {
      best = j;
      bestT = t;
    }
    if (beats(t, j, anyT, any, tol)) {
      any = j;
      anyT = t;
    }
  }
  return { best, worst, ...(any >= 0 ? { bestAny: { person: any, total: anyT } } : {}) };
}

/** A part's volume, 1^T X 1, the mean strength rho and the constant of (L+ d)_j (identity 5). */
export function partSums(
  cls: number[],
  d: Float64Array,
  x1: Float64Array,
  xd: Float64Array,
): { vol: number; s1: number; rho: number; shift: number } {
  let vol = 0;
  let s1 = 0;
  let sd = 0;
  for (const p of cls) {
    vol += d[p];
    s1 += x1[p];
    sd += xd[p];
  }
  const rho = vol / cls.length;
  return { vol, s1, rho, shift: (sd - rho * s1) / cls.length };
}
