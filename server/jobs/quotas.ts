/**
 * Per-user quotas, checked before anything is stored or queued (limits in the environment, see
 * the README): open jobs, open cascades over all of a user's rehearsals, plans kept. Cascades per
 * rehearsal are capped by MAX_CASCADES in the rehearsal checks.
 */
import { config } from '../config';
import { HttpError } from '../core/http-error';
import { openLoadOf, plansStoredBy } from './store';

const n = (v: number) => v.toLocaleString('en-US');

export async function checkJobQuota(userId: number, cascades = 0): Promise<void> {
  const open = await openLoadOf(userId);
  if (open.jobs >= config.MAX_OPEN_JOBS_PER_USER) {
    throw new HttpError(
      429,
      'quota_jobs',
      `You already have ${n(open.jobs)} plans or rehearsals waiting or running (at most ${n(config.MAX_OPEN_JOBS_PER_USER)}): wait for one to finish or cancel one, then start this again.`,
      { open: open.jobs, max: config.MAX_OPEN_JOBS_PER_USER },
    );
  }
  if (cascades > 0 && open.cascades + cascades > config.MAX_OPEN_CASCADES_PER_USER) {
    throw new HttpError(
      429,
      'quota_cascades',
      `Your rehearsals waiting or running already hold ${n(open.cascades)} cascades; with ${n(cascades)} more you would pass your limit of ${n(config.MAX_OPEN_CASCADES_PER_USER)}: wait for one to finish, cancel one, or ask for fewer cascades.`,
      { open: open.cascades, asked: cascades, max: config.MAX_OPEN_CASCADES_PER_USER },
    );
  }
}

export async function checkPlanQuota(userId: number): Promise<void> {
  const stored = await plansStoredBy(userId);
  if (stored >= config.MAX_PLANS_PER_USER) {
    throw new HttpError(
      409,
      'quota_plans',
      `You keep ${n(stored)} plans, the most one account may store (${n(config.MAX_PLANS_PER_USER)}): delete plans you no longer need, then try again.`,
      { stored, max: config.MAX_PLANS_PER_USER },
    );
  }
}
