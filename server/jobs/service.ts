/**
 * What the features that queue jobs (plans, rehearsals) use of the job rows. The rows are read and
 * written in jobs/store.ts, which no other feature imports.
 */
export {
  clearJobKey,
  findJob,
  findJobByKey,
  insertJob,
  openJobsOf,
  openLoadOf,
  plansStoredBy,
  updateJob,
  type JobRow,
  type NewJob,
} from './store';
