/**
 * Swap polish (local search, the interchange heuristic of Teitz & Bart, "Heuristic methods
 * for estimating the generalized vertex median of a weighted graph", 1968): swap one starter
 * for one non-starter while the total drops by more than 1e-12 relative. Each trial removes a
 * starter by a bordered inverse and scores all n candidates by identity 2: O(k n^2) per pass.
 * Required people are never swapped out; the result is never worse than the start.
 */
import { AbsorbingState } from './dense-state';
import { recordBound, type PlanContext } from './plan-context';

export function swapPolish(ctx: PlanContext, start: AbsorbingState, maxPasses = 20): AbsorbingState {
  let state = start.clone();
  let trial = start.clone(); // scratch, reused for every trial swap
  const p1 = ctx.p1();
  const fixed = new Uint8Array(ctx.n);
  for (const p of ctx.mustInclude) fixed[p] = 1;
  const closedOf = ctx.classes.closedOf;
  for (let pass = 0; pass < maxPasses; pass++) {
    let improved = false;
    for (const s of [...state.starters]) {
      if (fixed[s]) continue;
      // A closed group's last starter cannot leave it (the total would be infinite): such
      // starters are kept, and the group's choice among its own members is left to greedy.
      const cls = closedOf[s];
      if (cls >= 0 && state.starters.filter((t) => closedOf[t] === cls).length === 1) continue;
      const before = state.rawTotal;
      trial.copyFrom(state);
      trial.remove(s, p1);
      const allowed = Uint8Array.from(ctx.allowed);
      allowed[s] = 0;
      const j = trial.bestCandidate(allowed);
      if (j < 0) continue;
      const after = trial.rawTotal - trial.rawGain(j);
      if (after < before - 1e-12 * Math.abs(before)) {
        trial.add(j);
        const order = state.starters.map((t) => (t === s ? j : t));
        [state, trial] = [trial, state];
        state.starters.splice(0, state.starters.length, ...order);
        improved = true;
        ctx.options.onProgress?.({ stage: 'swap', done: pass + 1, of: maxPasses });
      }
    }
    if (!improved) break;
    if (performance.now() > ctx.deadline) {
      ctx.warnings.push({
        code: 'swap-time-limit',
        text: `Swap polish stopped at the time limit after ${pass + 1} ${pass === 0 ? 'pass' : 'passes'}.`,
      });
      break;
    }
    // Re-factor once per improving pass (small rooms) so rounding from many updates cannot build up.
    if (ctx.n <= 500) {
      state = AbsorbingState.fromStarters(ctx.room, [...state.starters]);
      trial = state.clone();
    }
  }
  recordBound(ctx, state);
  return state;
}
