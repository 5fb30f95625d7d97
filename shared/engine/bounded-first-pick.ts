/**
 * The starting set of the exact greedy on iterative solves: the required people, then per
 * closed group without one its best single starter, from the pseudo-inverse formula
 * (docs/engine.md section 7, identity 5; sparse-first-pick.ts) on the room grounded at one
 * member r: F({j}) = n_C (vol_C L+_jj - (L+ d)_j) = n_C vol_C X_jj + (terms known from X 1 and
 * X d), so a proven lower bound on X_jj bounds F_j from below; members are refreshed and then
 * checked exactly in order of that bound until no bound can win.
 */
import { CHEAP_HOPS, DEEP_HOPS, masked, mayBeat, solved } from './bounded-common';
import { beats, tieTolerance } from './dense-state';
import { DiagLowerBound } from './diag-lower-bound';
import { EngineError } from './errors';
import { GroundedLaplacian } from './linalg/grounded-laplacian';
import { partSums } from './sparse-first-pick';
import type { PlanContext } from './plan-context';

export interface First {
  readonly set: number[];
  readonly worst?: number;
  readonly bestSingle?: { person: number; total: number };
  readonly checks: number;
  readonly iterations: number;
}

export function firstStarters(ctx: PlanContext): First {
  const { room, n } = ctx;
  const d = room.csr.outStrength;
  const set = [...ctx.mustInclude];
  const isIn = new Uint8Array(n);
  for (const p of set) isIn[p] = 1;
  const classes = ctx.classes.closedClasses;
  const grounded = new Uint8Array(n);
  for (const cls of classes) grounded[cls.reduce((r, p) => (d[p] > d[r] ? p : r), cls[0])] = 1;
  const kx = new GroundedLaplacian(room.csr, grounded);
  const x1 = solved(kx, masked(new Float64Array(n).fill(1), kx.active));
  const xd = solved(kx, masked(d, kx.active));
  const bounds = new DiagLowerBound(kx);
  bounds.setGlobals(xd, x1);
  const scorer = new SingleScorer(kx, bounds, ctx);
  let worst = 0;
  let bestSingle: First['bestSingle'];
  for (const cls of classes) {
    const part = scorer.part(cls, x1, xd, classes.length === 1);
    worst += part.worst;
    if (part.bestAny) bestSingle = part.bestAny;
    if (!cls.some((p) => isIn[p])) set.push(part.best);
  }
  return { set, worst, ...(bestSingle ? { bestSingle } : {}), checks: scorer.checks, iterations: kx.iterations };
}

class SingleScorer {
  checks = 0;
  private readonly exact = new Map<number, number>();
  private readonly e: Float64Array;

  constructor(
    private readonly kx: GroundedLaplacian,
    private readonly bounds: DiagLowerBound,
    private readonly ctx: PlanContext,
  ) {
    this.e = new Float64Array(kx.n);
  }

  part(
    cls: number[],
    x1: Float64Array,
    xd: Float64Array,
    wantAny: boolean,
  ): { best: number; worst: number; bestAny?: { person: number; total: number } } {
    const m = cls.length;
    if (m === 1) return { best: cls[0], worst: 0 };
    const { vol, s1, rho, shift } = partSums(cls, this.ctx.room.csr.outStrength, x1, xd);
    const scores = new PartScores(cls, m * vol);
    for (let a = 0; a < m; a++) {
      const j = cls[a];
      scores.lin[a] = m * (vol * ((-2 * x1[j]) / m + s1 / (m * m)) - (xd[j] - rho * x1[j] - shift));
      scores.low[a] = scores.slope * (this.kx.active[j] ? this.bounds.lower(j, CHEAP_HOPS) : 0) + scores.lin[a];
    }
    const tol = tieTolerance(m);
    const best = this.bestOf(scores, tol, (j) => this.ctx.allowed[j] === 1);
    const any = wantAny ? this.bestOf(scores, tol, () => true) : undefined;
    // Worst single starter, from below: the member with the largest bound, checked exactly.
    let top = 0;
    for (let a = 1; a < m; a++) if (scores.low[a] > scores.low[top]) top = a;
    const worst = Math.max(scores.slope * this.value(cls[top]) + scores.lin[top], scores.low[top]);
    return { best: best.person, worst, ...(any ? { bestAny: any } : {}) };
  }

  /**
   * The smallest total by the engine's tie-break among members passing `ok`: the member with the
   * smallest bound gets a deeper bound, then an exact check, until no bound can win.
   */
  private bestOf(sc: PartScores, tol: number, ok: (j: number) => boolean): { person: number; total: number } {
    const { cls, low } = sc;
    const done = new Uint8Array(cls.length);
    let best = -1;
    let bestT = Infinity;
    for (;;) {
      let a = -1;
      for (let b = 0; b < cls.length; b++)
        if (!done[b] && ok(cls[b]) && mayBeat(low[b], cls[b], bestT, best, tol) && (a < 0 || low[b] < low[a])) a = b;
      if (a < 0) break;
      const j = cls[a];
      if (!sc.deep[a] && this.kx.active[j]) {
        sc.deep[a] = 1;
        low[a] = Math.max(low[a], sc.slope * this.bounds.lower(j, DEEP_HOPS) + sc.lin[a]);
        continue;
      }
      done[a] = 1;
      const t = sc.slope * this.value(j) + sc.lin[a];
      low[a] = t;
      if (beats(t, j, bestT, best, tol)) {
        best = j;
        bestT = t;
      }
    }
    if (best < 0) throw new EngineError('NO_FEASIBLE_PLAN', 'No allowed person is left to brief in one of the closed groups.');
    return { person: best, total: bestT };
  }

  /** X_jj exactly (0 for the grounded member): one solve. */
  private value(j: number): number {
    if (!this.kx.active[j]) return 0;
    const known = this.exact.get(j);
    if (known !== undefined) return known;
    this.e[j] = 1;
    const x = solved(this.kx, this.e);
    this.e[j] = 0;
    this.checks++;
    this.exact.set(j, x[j]);
    return x[j];
  }
}

/** Per member of a closed group: F_j = slope X_jj + lin_j, and a lower bound on F_j. */
class PartScores {
  readonly lin: Float64Array;
  readonly low: Float64Array;
  readonly deep: Uint8Array;
  constructor(
    readonly cls: number[],
    readonly slope: number,
  ) {
    this.lin = new Float64Array(cls.length);
    this.low = new Float64Array(cls.length);
    this.deep = new Uint8Array(cls.length);
  }
}
