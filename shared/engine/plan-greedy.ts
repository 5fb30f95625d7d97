/**
 * Greedy planner: the best single starter from the ergodic fundamental matrix (identity 3),
 * then repeatedly the person of largest marginal gain h_j c_j / N_jj (identity 2), with the
 * Schur-complement downdate of identity 1 after each choice. Cost O(n^3 + k n^2).
 * Guarantee: within 1 - 1/e of the best improvement over the first starter (Nemhauser,
 * Wolsey & Fisher, "An analysis of approximations for maximizing submodular set functions", 1978).
 * Tie-break: engine.md (smaller total; within 1e-12 relative, earlier person).
 */
import type { AbsorbingState } from './dense-state';
import { initialState, recordBound, type PlanContext } from './plan-context';

/**
 * Extends `state` greedily until it holds k starters; records an identity-6 bound at every step.
 * With `cutoff` (an unscaled total), stops and returns null as soon as the identity-6 bound
 * proves that no k-set containing the current set can beat it (used to prune widened seeds).
 */
export function extendGreedy(ctx: PlanContext, state: AbsorbingState, k: number, record?: true): AbsorbingState;
export function extendGreedy(ctx: PlanContext, state: AbsorbingState, k: number, record: false, cutoff?: number): AbsorbingState | null;
export function extendGreedy(ctx: PlanContext, state: AbsorbingState, k: number, record = true, cutoff?: number): AbsorbingState | null {
  const onProgress = ctx.options.onProgress;
  while (state.starters.length < k) {
    if (record) recordBound(ctx, state);
    if (cutoff !== undefined) {
      const lb = state.rawTotal - state.topGains(ctx.allowed, k - state.starters.length);
      if (lb >= cutoff * (1 - 1e-12)) return null;
    }
    const j = state.bestCandidate(ctx.allowed);
    if (j < 0) break;
    state.add(j);
    onProgress?.({ stage: 'greedy', done: state.starters.length, of: k });
  }
  if (record) recordBound(ctx, state);
  return state;
}

export function greedyState(ctx: PlanContext): AbsorbingState {
  return extendGreedy(ctx, initialState(ctx), ctx.k);
}
