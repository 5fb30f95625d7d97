/**
 * Plans, rehearsals and background jobs: the API contract shared by the client and the server.
 * No Node or DOM imports here. Person ids are the rooms API's `PersonDto.id` (numbers).
 *
 * Plans
 *   POST   /api/rooms/:roomId/plans            CreatePlanRequest      -> 201 PlanDetail (computed at once)
 *                                                                      -> 202 PlanStarted (background job: exhaustive,
 *                                                                         auto, big rooms, or `background: true`)
 *   GET    /api/rooms/:roomId/plans                                   -> PlanSummary[] (newest first)
 *   POST   /api/rooms/:roomId/plans/sweep      KSweepRequest          -> KSweepResult
 *   GET    /api/plans/:planId                                         -> PlanDetail (per person, reach curve, quantiles)
 *   PATCH  /api/plans/:planId                  UpdatePlanRequest      -> PlanSummary (rename, mark chosen)
 *   DELETE /api/plans/:planId                                         -> 204 (its rehearsals go with it)
 *   POST   /api/plans/:planId/rerun                                   -> 202 PlanStarted (a computed plan that was
 *                                                                         interrupted, cancelled or failed, on its snapshot)
 *   GET    /api/plans/compare?a=ID&b=ID                               -> PlanComparison (one endpoint, side by side)
 *   GET    /api/plans/:planId/briefing                                -> BriefingSheet (data of the printable sheet)
 *   GET    /api/plans/:planId/briefing.csv                            -> text/csv download (formula-injection safe)
 *   GET    /api/plans/:planId/briefing.pdf                            -> application/pdf download
 *
 * Jobs (plans computed in the background and rehearsals)
 *   GET    /api/jobs/limits                                           -> ServerLimits
 *   GET    /api/jobs/:jobId                                           -> JobDto
 *   GET    /api/jobs/:jobId/events                                    -> text/event-stream (JobEvent, see below)
 *   POST   /api/jobs/:jobId/cancel                                    -> JobDto
 *
 * Rehearsals
 *   POST   /api/plans/:planId/rehearsals       StartRehearsalRequest  -> 202 RehearsalStarted (reused: true when the
 *                                                                         same idempotency key, or the same plan + seed +
 *                                                                         runs within IDEMPOTENCY_WINDOW_MS, already started one)
 *   GET    /api/rooms/:roomId/rehearsals?planId&status&from&to        -> RehearsalSummary[] (newest first; from/to ISO dates)
 *   GET    /api/rehearsals/:id                                        -> RehearsalDetail (results only when status 'done')
 *   GET    /api/rehearsals/:id/events                                 -> text/event-stream (same events as the job's)
 *   POST   /api/rehearsals/:id/cancel                                 -> RehearsalSummary
 *   POST   /api/rehearsals/:id/rerun           { idempotencyKey? }    -> 202 RehearsalStarted (same plan, seed, runs)
 *   DELETE /api/rehearsals/:id                                        -> 204
 *   GET    /api/rehearsals/:id/samples                                -> ReplayIndex (starters, people, sample list)
 *   GET    /api/rehearsals/:id/samples/:n                             -> ReplaySample (n = 0 .. count-1)
 *   GET    /api/rehearsals/:id/replay                                 -> ReplayBundle (the index and every sample:
 *                                                                         what the projector replay loads, in one answer)
 *
 * Server-sent events (both streams): `event: queued` {position}, `event: started` {},
 * `event: progress` {fraction, done, of}, `event: done` {job}, `event: failed` {job, message},
 * `event: cancelled` {job}, `event: interrupted` {job}; every event's data is a JobEvent JSON.
 * A comment line `: heartbeat` every 15 s; the server closes the stream after a final event.
 * The first event always reports the current state (so a late subscriber sees `done` at once).
 *
 * Plans keep a snapshot of the room they were computed on: `stale` says the room changed since;
 * the numbers, the briefing sheet and rehearsals always use the snapshot.
 *
 * Errors (codes in ./errors.ts): planner errors use the engine's EngineError codes in snake_case
 * (invalid_k, k_below_closed_groups, must_include_too_many, conflicting_constraints,
 * no_feasible_plan, exhaustive_infeasible, unknown_person, invalid_option, invalid_starters), plus
 * unreachable_people (a hand-made plan leaves people who can never hear; `details.people`),
 * too_many_cascades, invalid_seed, not_ready (plan or rehearsal not finished), not_rerunnable.
 * `error.details.suggest` names another method when
 * one would work. Rooms the caller cannot see answer 404; viewers get 403 on changes.
 */
import type { JobDto, JobStatus } from './jobs';

export const PLAN_METHOD_CHOICES = ['auto', 'greedy', 'widened', 'swap', 'exhaustive'] as const;

/** The methods a plan request may name (the server hands them to the engine, so the type check keeps them among the engine's). */
export type PlanMethodChoice = (typeof PLAN_METHOD_CHOICES)[number];

/** What was actually run ('auto' resolves to one of the engine's methods). */
export type PlanMethodUsed = 'greedy' | 'widened' | 'swap' | 'exhaustive' | 'lazy-greedy' | 'screen' | 'hand-made';

/**
 * What a plan warning is about: one code per kind, so the client acts on the code and shows the
 * text. The engine's codes (shared/engine/plan-types.ts, the same list without 'note'):
 * search-stopped / search-time-limit (the branch and bound was stopped, or reached its time
 * limit, with part of the search space open), widening-time-limit (widened greedy did not extend
 * every seed), swap-time-limit (swap polish stopped at the time limit), over-dense-limit (a room
 * above the dense limit got a greedy instead of the method asked for), no-show-not-exhaustive
 * (too many plans to score each on the expected total). 'note': any other text, for example a
 * warning of a plan saved before the codes whose words are not recognised.
 */
export const PLAN_WARNING_CODES = [
  'search-stopped',
  'search-time-limit',
  'widening-time-limit',
  'swap-time-limit',
  'over-dense-limit',
  'no-show-not-exhaustive',
  'note',
] as const;

export type PlanWarningCode = (typeof PLAN_WARNING_CODES)[number];

/** One warning of a plan, as answered and as stored with new plans (older plans stored the text alone). */
export interface PlanWarning {
  code: PlanWarningCode;
  text: string;
}

export const PLAN_LIMITS = {
  nameMax: 120,
  /** Exhaustive search is offered up to this many people (above: a 400 suggesting auto). */
  exhaustiveMaxPeople: 120,
  /** Plans above this many people (or exhaustive / auto) run as background jobs. */
  inlineMaxPeople: 400,
  /**
   * An automatic plan (no no-show chance) of a room up to exhaustiveMaxPeople whose search has at
   * most this many starter sets to decide is computed in the request like greedy (201, no job):
   * its whole search takes milliseconds. Every other automatic plan is a job.
   */
  autoInlineMaxSets: 10_000,
  /**
   * An automatic plan of a room up to inlineMaxPeople that is a job still has its request wait this
   * long for it: a plan that is done by then is answered at once (201), the rest as a job (202).
   */
  autoAnswerWithinMs: 1200,
  /** Time limit for exhaustive and auto, seconds. */
  timeLimitSeconds: { min: 1, max: 300, default: 10 },
  /** Widened greedy's near-optimal threshold. */
  nu: { min: 0, max: 1, default: 0.9 },
  /** Largest k of a k-sweep. */
  sweepMaxK: 20,
} as const;

export interface CreatePlanRequest {
  name?: string;
  /** Budget: number of starters. Required unless `starters` is given. */
  k?: number;
  method?: PlanMethodChoice;
  /** Widened greedy threshold (0..1). */
  nu?: number;
  /** Exhaustive / auto time limit in seconds. */
  timeLimitSeconds?: number;
  /** Person ids who must be briefed. */
  mustBrief?: number[];
  /** Person ids who cannot be briefed. */
  cannotBrief?: number[];
  /** A hand-made plan: the facilitator's starters, in briefing order (k = its length). */
  starters?: number[];
  /** Force a background job even for a small room. */
  background?: boolean;
  /** Chance (0..0.5) that each starter independently does not show up; the plan then minimises the expected total. */
  noShow?: number;
}

/** What proved a plan's lower bound: a branch-and-bound search, a supermodular check of evaluated sets, the cover argument, or scoring every single starter. */
export type BoundSource = 'search' | 'supermodular' | 'cover' | 'single';

export interface PlanExtrasDto {
  /** The best single starter and the room total with them alone (hops). */
  bestSingle: { personId: number; name: string; total: number } | null;
  /** Share of the possible saving over the best single starter this plan achieves (1 = proven best of its size). */
  gainShare: number | null;
  /** Branch-and-bound nodes visited (searches only). */
  nodes: number | null;
  /** Share of the possible starter sets a search left undecided (0 when it finished). */
  searchLeft: number | null;
  /** The search was stopped before it finished. */
  stopped: boolean;
  /** Fewest starters after whom everyone else hears in one hop. */
  fewestForOneHop: number | null;
}

/** No-show results of a plan made with a no-show chance. */
export interface AbsenceDto {
  /** Expected room total when each starter independently fails to show with chance noShow, given at least one shows. */
  expectedTotal: number;
  /** noShow^k: the chance that nobody shows up. */
  nobodyChance: number;
  /** The starter whose absence costs most, and the room total without them. */
  worstAbsence: { personId: number; name: string; total: number } | null;
  /** For each starter: the best person to brief instead if they are missing, and the total then. */
  standIns: { personId: number; name: string; standInId: number | null; standInName: string | null; total: number | null }[];
}

export interface UpdatePlanRequest {
  name?: string;
  /** true marks this plan as the room's chosen one (unmarks the others); false unmarks it. */
  chosen?: boolean;
}

/** Also the database's enum (db/schema/plans.ts). */
export const PLAN_STATUSES = ['computing', 'ready', 'failed', 'cancelled', 'interrupted'] as const;
export type PlanStatus = (typeof PLAN_STATUSES)[number];

export interface PlanStarterDto {
  personId: number;
  name: string;
  group: string | null;
  /** 1-based briefing order. */
  order: number;
}

export interface PlanSettingsSnapshot {
  directed: boolean;
  minutesPerHop: number;
  laziness: number;
  mixing: number;
}

/** A computed plan is found by a planner; a hand-made one has starters the facilitator picked. */
export type PlanKind = 'computed' | 'hand-made';

export interface PlanSummary {
  id: number;
  roomId: number;
  name: string;
  kind: PlanKind;
  status: PlanStatus;
  k: number;
  methodRequested: PlanMethodChoice | 'hand-made';
  methodUsed: PlanMethodUsed | null;
  nu: number | null;
  timeLimitSeconds: number | null;
  mustBrief: number[];
  cannotBrief: number[];
  starters: PlanStarterDto[];
  /** Sum of expected hops to hear over the people not briefed. Null until computed. */
  total: number | null;
  /** Room average: total / (people - k). */
  average: number | null;
  /** Room average in minutes (average x minutesPerHop). */
  averageMinutes: number | null;
  qualityRank: number | null;
  /** The best proven lower bound known for this plan's problem (room version, k, constraints), shared by all its plans. */
  lowerBound: number | null;
  /** total - lowerBound: how far this plan can at most be from the best plan of its size. */
  gap: number | null;
  /** gap / total (0..1): the best plan cuts this plan's total waiting by at most this share. */
  gapShare: number | null;
  /** Proven best: its total equals a proven lower bound (whichever plan of the same problem proved it). */
  certified: boolean;
  /** What proved the lower bound. */
  boundSource: BoundSource | null;
  /** The smallest total any plan of the same problem has reached (may be another plan's). */
  bestKnownTotal: number | null;
  /** The best total of this problem is proven (some plan of it reached the lower bound). */
  optimumKnown: boolean;
  /** No-show chance the plan was made with (null: none). */
  noShow: number | null;
  absence: AbsenceDto | null;
  /** Reading aids (null for plans made before they existed). */
  extras: PlanExtrasDto | null;
  coverSize: number | null;
  elapsedMs: number | null;
  people: number;
  roomVersion: number;
  currentRoomVersion: number;
  /** The room changed since this plan was computed: numbers are for the old version. */
  stale: boolean;
  settings: PlanSettingsSnapshot;
  chosen: boolean;
  notes: string[];
  warnings: PlanWarning[];
  /** The background job computing it (null for plans computed at once). */
  jobId: number | null;
  error: string | null;
  createdBy: string;
  createdAt: string;
}

export interface PlanPersonDto {
  personId: number;
  name: string;
  group: string | null;
  starter: boolean;
  /** 1-based briefing order for starters. */
  order: number | null;
  expectedHops: number;
  expectedMinutes: number;
}

export interface ReachQuantileDto {
  /** 0.5, 0.9, 0.99 or 1. */
  share: number;
  /** First hop by which that share of the people not briefed is expected to have heard; null: not guaranteed within the hops computed. */
  hop: number | null;
  minutes: number | null;
}

export interface ReachCurveDto {
  /** byHop[t] = expected share of the people not briefed who have heard by hop t (t = 0..). */
  byHop: number[];
  /** The same over everyone in the room, starters included. */
  roomByHop: number[];
  /** byMinute[t] = { minutes: t x minutesPerHop, share: byHop[t] }. */
  byMinute: { minutes: number; share: number }[];
  minutesPerHop: number;
  /** False when the curve stopped before 99.99% had heard (then the tail is cut). */
  complete: boolean;
  quantiles: ReachQuantileDto[];
}

/** The search that goes on proving a plan's problem in the background (its events: GET /api/jobs/:jobId/events). */
export interface ProvingDto {
  jobId: number;
  status: JobStatus;
  /** 0..1. */
  progress: number;
}

/** What the searches of a plan's problem (room version, k, constraints) have done over all their runs. */
export interface SearchSoFarDto {
  /** Search steps (branch-and-bound nodes) over every run. */
  nodes: number;
  runs: number;
  /** Share of the possible starter groups not yet checked (0..1). */
  left: number;
  /** Every group was checked: the best total of this problem is proven. */
  finished: boolean;
}

export interface PlanDetail extends PlanSummary {
  /** Everyone in the room's order (empty until the plan is ready). */
  perPerson: PlanPersonDto[];
  reach: ReachCurveDto | null;
  /** A background search proving this plan's problem, while one is queued or running. */
  proving?: ProvingDto | null;
  /** A finished plan of the same problem with a lower total (the fastest such), e.g. found in the background. */
  fasterPlanId?: number | null;
  /** The saved search of this plan's problem, which "Keep proving" continues. */
  searchSoFar?: SearchSoFarDto | null;
}

export interface PlanStarted {
  plan: PlanSummary;
  job: JobDto;
}

export interface PlanComparison {
  a: PlanSummary;
  b: PlanSummary;
  /** Per person, in room order: hops under a and b and b - a. Empty when the plans are of different room versions with different people. */
  people: { personId: number; name: string; a: number | null; b: number | null; difference: number | null }[];
  onlyInA: number[];
  onlyInB: number[];
  inBoth: number[];
  /** b.average - a.average (negative: b is better). */
  averageDifference: number | null;
  sameRoomVersion: boolean;
  line: string;
}

export interface KSweepRequest {
  /** Largest k (1..min(people - 1, PLAN_LIMITS.sweepMaxK)). */
  maxK: number;
  /** Seed of the random baseline (default "sweep"). */
  seed?: string;
}

export type SweepSeries = 'greedy' | 'widened' | 'swap' | 'mostTies' | 'random';

export const SWEEP_SERIES: readonly SweepSeries[] = ['greedy', 'widened', 'swap', 'mostTies', 'random'];

export interface KSweepPoint {
  k: number;
  /** Room average for each series (null where k is below the closed groups' need). */
  greedy: number | null;
  widened: number | null;
  swap: number | null;
  /** The k people with the most tie strength. */
  mostTies: number | null;
  /** k people drawn at random with the seed (the mean over 20 draws). */
  random: number | null;
  /** Proven lower bound on the best room average of size k. */
  lowerBound: number | null;
}

export interface KSweepResult {
  roomVersion: number;
  people: number;
  maxK: number;
  seed: string;
  minutesPerHop: number;
  points: KSweepPoint[];
  elapsedMs: number;
  notes: string[];
}

// The other parts of this contract, by concept; importing them from here keeps working.
export * from './jobs';
export * from './briefing';
export * from './rehearsals';
export * from './replay';
