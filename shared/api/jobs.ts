/** Background jobs (plans computed in the background and rehearsals): status, progress and the event stream. See plans.ts for the routes. */

/** Also the database's enums (db/schema/plans.ts). */
export const JOB_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled', 'interrupted'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

export const JOB_KINDS = ['plan', 'rehearsal'] as const;
export type JobKind = (typeof JOB_KINDS)[number];

export interface JobDto {
  id: number;
  kind: JobKind;
  status: JobStatus;
  /** 0..1. */
  progress: number;
  /** 1-based place in the caller's queue while queued (null otherwise). */
  queuePosition: number | null;
  message: string | null;
  planId: number | null;
  rehearsalId: number | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

/** What a running plan search reports with each progress event. */
export interface PlanSearchProgress {
  /** Planner stage ('greedy', 'widened', 'swap', 'search', ...). */
  stage: string;
  /** Share of the search space closed (0..1), when the stage can tell it. */
  closed: number | null;
  /** Best total found so far. */
  bestTotal: number | null;
  /** Proven lower bound so far. */
  lowerBound: number | null;
  /** (bestTotal - lowerBound) / bestTotal: the proven gap so far. */
  gapShare: number | null;
  /** Search nodes visited so far. */
  nodes: number | null;
}

export type JobEventType = 'queued' | 'started' | 'progress' | 'done' | 'failed' | 'cancelled' | 'interrupted';

export interface JobEvent {
  type: JobEventType;
  job: JobDto;
  /** queued: position in the queue. */
  position?: number;
  /** progress: 0..1, with `done` of `of` units (cascades for rehearsals). */
  fraction?: number;
  done?: number;
  of?: number;
  message?: string;
  /** progress of a plan job: what the search has found and proven so far. */
  search?: PlanSearchProgress;
}

/** The server's configured limits, for forms. GET /api/jobs/limits */
export interface ServerLimits {
  maxCascades: number;
  maxJobsPerUser: number;
  workers: number;
}
