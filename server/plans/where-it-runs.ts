/** Where a plan is computed: in the request, or as a background job (pure rules, no I/O). */
import type { CreatePlanRequest } from '../../shared/api/plans';
import { PLAN_LIMITS } from '../../shared/api/plans';

/**
 * Where a plan runs, decided once: an automatic plan whose search is small is searched in the
 * request (autoRunsNow); a hand-made plan, or a fast method on a small room, is computed in the
 * request; everything else is a background job.
 */
export function placement(
  body: CreatePlanRequest,
  n: number,
  mustCount = 0,
  excludeCount = 0,
): 'search-now' | 'compute-now' | 'background' {
  if (body.starters) return 'compute-now';
  if (body.background) return 'background';
  if (autoRunsNow(body, n, mustCount, excludeCount)) return 'search-now';
  const fast = body.method === 'greedy' || body.method === 'swap' || body.method === 'widened';
  return fast && n <= PLAN_LIMITS.inlineMaxPeople ? 'compute-now' : 'background';
}

/**
 * An automatic plan is computed in the request when its branch and bound has at most
 * PLAN_LIMITS.autoInlineMaxSets starter sets to decide (the sets of k - must people among those
 * neither required nor excluded) in a room of at most exhaustiveMaxPeople, without a no-show
 * chance. Such a search takes milliseconds; a queued job would cost more than the search.
 */
export function autoRunsNow(body: CreatePlanRequest, n: number, mustCount: number, excludeCount: number): boolean {
  if (body.starters || body.background || (body.method ?? 'auto') !== 'auto') return false;
  if ((body.noShow ?? 0) > 0 || n > PLAN_LIMITS.exhaustiveMaxPeople || body.k === undefined) return false;
  return setsAtMost(n - mustCount - excludeCount, body.k - mustCount, PLAN_LIMITS.autoInlineMaxSets);
}

/** Whether C(n, k) <= limit, without overflow (stops as soon as the count passes the limit). */
export function setsAtMost(n: number, k: number, limit: number): boolean {
  if (k < 0 || n < 0 || k > n) return true;
  const r = Math.min(k, n - k);
  let c = 1;
  for (let i = 1; i <= r; i++) {
    c = (c * (n - r + i)) / i;
    if (c > limit) return false;
  }
  return true;
}
