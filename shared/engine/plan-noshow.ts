/**
 * No-show plans: each starter of A independently fails to be briefed with chance P, and the
 * room total counts everyone not briefed (absent starters included). The objective is the
 * expected total given that at least one starter shows:
 *   E_P(A) = sum over nonempty X ⊆ A of (1-P)^|X| P^(|A|-|X|) F(X) / (1 - P^|A|).
 * Exact for |A| <= 12: every subset is reached by one Schur downdate from its parent in a
 * depth-first walk of the subset lattice (identity 1), 2^k O(n^2). Scoring every addition j at
 * once uses F(X + j) = F(X) - ρ_j(X) (identity 2), so a greedy step costs 2^|A| O(n^2):
 *   E_P(A + j) = [sum_X w(X) (F(X) - (1-P) ρ_j(X)) + P^m (1-P) F({j})] / (1 - P^(m+1)),
 * with w(X) = (1-P)^|X| P^(m-|X|), m = |A|. Greedy (Nemhauser, Wolsey & Fisher 1978 style) then
 * swap polish (Teitz & Bart 1968) on this objective; exhaustive enumerates every k-set when that
 * is affordable. Above 12 starters the expectation is sampled (stated standard error).
 */
import { AbsorbingState, beats, tieTolerance } from './dense-state';
import { EngineError } from './errors';
import type { PlanContext } from './plan-context';
import { binomialTable, shouldStop } from './plan-search-meter';
import type { NoShowReport } from './plan-types';

export const NO_SHOW_EXACT_LIMIT = 12;

/** Visits every nonempty subset X of `set` with its state and size. 2^|set| states, O(n^2) each. */
function eachSubset(ctx: PlanContext, set: readonly number[], visit: (s: AbsorbingState, size: number) => void): void {
  const e = ctx.ergodic()!;
  const states: AbsorbingState[] = [];
  const rec = (s: AbsorbingState, from: number, size: number) => {
    visit(s, size);
    for (let q = from; q < set.length; q++) {
      const child = states[size] ? states[size].copyFrom(s) : (states[size] = s.clone());
      child.add(set[q]);
      rec(child, q + 1, size + 1);
    }
  };
  for (let q = 0; q < set.length; q++) rec(AbsorbingState.fromErgodic(e, set[q]), q + 1, 1);
}

export function requireNoShowRoom(ctx: PlanContext, p: number): void {
  if (!(p >= 0 && p <= 0.5)) throw new EngineError('INVALID_OPTION', `The no-show chance must be between 0 and 0.5 (got ${String(p)}).`);
  const e = ctx.ergodic();
  if (!e || !e.pi.every((v) => v > 0))
    throw new EngineError(
      'INVALID_OPTION',
      'No-show plans need a room where word can travel between any two people (connected, or with background mixing): with several closed groups a missing starter leaves people who can never hear.',
    );
}

/** Exact E_P(A) (raw hops). */
export function expectedTotalExact(ctx: PlanContext, set: readonly number[], p: number): number {
  const k = set.length;
  let sum = 0;
  eachSubset(ctx, set, (s, size) => (sum += (1 - p) ** size * p ** (k - size) * s.rawTotal));
  return sum / (1 - p ** k);
}

/** E_P(A + j) for every allowed j not in A (raw hops; Infinity elsewhere). */
export function additionScores(ctx: PlanContext, set: readonly number[], p: number, allowed: Uint8Array): Float64Array {
  const n = ctx.n;
  const e = ctx.ergodic()!;
  const m = set.length;
  const out = new Float64Array(n).fill(Infinity);
  const inSet = new Uint8Array(n);
  for (const a of set) inSet[a] = 1;
  if (m === 0) {
    for (let j = 0; j < n; j++) if (allowed[j]) out[j] = e.singleTotals[j] / e.scale;
    return out;
  }
  let s0 = 0;
  const g = new Float64Array(n);
  eachSubset(ctx, set, (s, size) => {
    const w = (1 - p) ** size * p ** (m - size);
    s0 += w * s.rawTotal;
    for (let j = 0; j < n; j++) if (s.inT[j]) g[j] += w * s.rawGain(j);
  });
  const norm = 1 - p ** (m + 1);
  for (let j = 0; j < n; j++) {
    if (!allowed[j] || inSet[j]) continue;
    out[j] = (s0 - (1 - p) * g[j] + p ** m * (1 - p) * (e.singleTotals[j] / e.scale)) / norm;
  }
  return out;
}

function argBest(scores: Float64Array, n: number): number {
  let best = -1;
  for (let j = 0; j < n; j++)
    if (Number.isFinite(scores[j]) && beats(scores[j], j, best < 0 ? Infinity : scores[best], best, tieTolerance(n))) best = j;
  return best;
}

/** Greedy on E_P from the required people. */
export function noShowGreedy(ctx: PlanContext, p: number): number[] {
  const set = [...ctx.mustInclude];
  while (set.length < ctx.k) {
    const j = argBest(additionScores(ctx, set, p, ctx.allowed), ctx.n);
    if (j < 0) break;
    set.push(j);
  }
  return set;
}

/** Swap polish on E_P: replace one starter by one non-starter while the expectation drops. */
export function noShowSwap(ctx: PlanContext, start: number[], p: number, maxPasses = 20): { set: number[]; value: number } {
  const set = [...start];
  let value = expectedTotalExact(ctx, set, p);
  const fixed = new Set(ctx.mustInclude);
  for (let pass = 0; pass < maxPasses; pass++) {
    let improved = false;
    for (let q = 0; q < set.length; q++) {
      if (fixed.has(set[q]) || performance.now() > ctx.deadline || shouldStop(ctx)) break;
      const rest = set.filter((_, t) => t !== q);
      const allowed = Uint8Array.from(ctx.allowed);
      allowed[set[q]] = 0;
      const scores = additionScores(ctx, rest, p, allowed);
      const j = argBest(scores, ctx.n);
      if (j >= 0 && scores[j] < value - 1e-12 * Math.abs(value)) {
        set[q] = j;
        value = scores[j];
        improved = true;
      }
    }
    if (!improved) break;
  }
  return { set, value };
}

/** Every k-set (with the required people) when at most `limit` of them; null when there are more. */
export function noShowExhaustive(ctx: PlanContext, p: number, incumbent: { set: number[]; value: number }, limit = 20_000) {
  const free: number[] = [];
  const must = new Set(ctx.mustInclude);
  for (let j = 0; j < ctx.n; j++) if (ctx.allowed[j] && !must.has(j)) free.push(j);
  const r = ctx.k - ctx.mustInclude.length;
  const count = binomialTable(free.length, r)[free.length][r];
  if (count > limit) return null;
  let best = incumbent;
  const cur: number[] = [];
  const rec = (from: number) => {
    if (cur.length === r) {
      const set = [...ctx.mustInclude, ...cur];
      const v = expectedTotalExact(ctx, set, p);
      if (v < best.value - 1e-12 * Math.abs(best.value)) best = { set, value: v };
      return;
    }
    for (let q = from; q <= free.length - (r - cur.length); q++) {
      cur.push(free[q]);
      rec(q + 1);
      cur.pop();
    }
  };
  rec(0);
  return best;
}

/** Seeded sample of E_P(A) for large A: mean and standard error over `samples` subsets. */
export function expectedTotalSampled(ctx: PlanContext, set: readonly number[], p: number, samples: number) {
  let x = 0x9e3779b9;
  const rand = () => {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    return x / 4294967296;
  };
  let mean = 0;
  let m2 = 0;
  for (let t = 1; t <= samples; t++) {
    let shows: number[] = [];
    while (shows.length === 0) shows = set.filter(() => rand() >= p);
    const v = AbsorbingState.fromStarters(ctx.room, shows).rawTotal;
    const d = v - mean;
    mean += d / t;
    m2 += d * (v - mean);
  }
  return { mean, standardError: Math.sqrt(m2 / Math.max(1, samples - 1) / samples) };
}

/** The report of a chosen set: expectation, nobody-shows chance, worst absence and stand-ins. */
export function noShowReport(ctx: PlanContext, set: readonly number[], p: number): NoShowReport {
  const scale = 1 / (1 - ctx.room.laziness);
  const k = set.length;
  let expected: number;
  let se = 0;
  const exact = k <= NO_SHOW_EXACT_LIMIT;
  if (exact) expected = expectedTotalExact(ctx, set, p);
  else {
    const samples = Math.max(200, Math.min(4000, Math.floor(2e9 / ctx.n ** 3)));
    const s = expectedTotalSampled(ctx, set, p, samples);
    expected = s.mean;
    se = s.standardError;
  }
  const standIns: { starter: number; person: number; total: number }[] = [];
  let worst = { person: set[0], total: -Infinity };
  for (const s of set) {
    const rest = set.filter((t) => t !== s);
    const allowed = Uint8Array.from(ctx.allowed);
    for (const t of set) allowed[t] = 0;
    // With P = 0 the addition scores are plain totals F(rest + j).
    const scores = additionScores(ctx, rest, 0, allowed);
    const without = rest.length === 0 ? Infinity : AbsorbingState.fromStarters(ctx.room, rest).rawTotal * scale;
    if (without > worst.total) worst = { person: s, total: without };
    const j = argBest(scores, ctx.n);
    if (j >= 0) standIns.push({ starter: s, person: j, total: scores[j] * scale });
  }
  return {
    chance: p,
    expectedTotal: expected * scale,
    nobodyChance: p ** k,
    worstAbsence: worst,
    standIns,
    exact,
    standardError: se * scale,
  };
}
