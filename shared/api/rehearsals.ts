/** Rehearsals: seeded simulated cascades of a plan, checked against the plan's analysis. See plans.ts for the routes. */
import { SEED_PATTERN } from './ids';
import type { JobDto, JobStatus } from './jobs';

export const REHEARSAL_LIMITS = {
  /** Default cascades; the server's cap (config MAX_CASCADES) is reported in `ServerLimits`. */
  defaultRuns: 5000,
  /** Seeds: 1-64 characters of letters, digits, '-' and '_' (SEED_PATTERN in ./ids.ts, as text for the command line). */
  seedPattern: SEED_PATTERN.source,
  idempotencyKeyMax: 100,
  /** Whole cascades kept for the replay. */
  samples: 3,
} as const;

/** Same plan, seed and runs started again within this window reuse the first job. */
export const IDEMPOTENCY_WINDOW_MS = 10_000;

export interface StartRehearsalRequest {
  /** Cascades (1..MAX_CASCADES). */
  runs: number;
  /** Default: a random seed, returned and stored. */
  seed?: string;
  /** A double click with the same key starts one job. */
  idempotencyKey?: string;
}

export interface AgreementVerdict {
  /** Share of people whose analytic expected hops lie inside the simulated 99% interval. */
  shareInInterval99: number;
  peopleChecked: number;
  /** |simulated room average - analytic| <= 3 standard errors. */
  averageWithin3se: boolean;
  averageDifference: number;
  averageStderr: number;
  agrees: boolean;
  line: string;
}

export interface RehearsalSummary {
  id: number;
  /** Its number within the room: the room's first rehearsal is 1 (the id runs across all rooms). */
  number: number;
  planId: number;
  planName: string;
  roomId: number;
  status: JobStatus;
  runs: number;
  seed: string;
  jobId: number;
  progress: number;
  queuePosition: number | null;
  /** Simulated room average (null until done). */
  average: number | null;
  averageStderr: number | null;
  analyticAverage: number | null;
  capped: number | null;
  elapsedMs: number | null;
  verdict: AgreementVerdict | null;
  rerunOf: number | null;
  message: string | null;
  createdBy: string;
  createdAt: string;
  finishedAt: string | null;
}

export interface RehearsalPersonDto {
  personId: number;
  name: string;
  group: string | null;
  starter: boolean;
  /** False for starters (and people who cannot be reached). */
  walked: boolean;
  mean: number;
  sd: number;
  stderr: number;
  low95: number;
  high95: number;
  low99: number;
  high99: number;
  analytic: number;
  capped: number;
  inInterval99: boolean;
}

export interface RehearsalDetail extends RehearsalSummary {
  people: RehearsalPersonDto[];
  reach: { simulated: number[]; analytic: number[] } | null;
  hopCap: number | null;
  hops: number | null;
  samples: number;
  minutesPerHop: number;
}

export interface RehearsalStarted {
  rehearsal: RehearsalSummary;
  job: JobDto;
  /** True when an identical start (same key, or same plan + seed + runs just now) was reused. */
  reused: boolean;
}
