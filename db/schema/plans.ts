import {
  boolean,
  double,
  index,
  int,
  json,
  longtext,
  mysqlEnum,
  mysqlTable,
  text,
  timestamp,
  uniqueIndex,
  varchar,
} from 'drizzle-orm/mysql-core';
import { users } from './accounts';
import { createdAt, idColumn, refColumn, updatedAt } from './columns';
import { JOB_KINDS, JOB_STATUSES } from '../../shared/api/jobs';
import { PLAN_STATUSES, type PlanWarning } from '../../shared/api/plans';
import { rooms } from './rooms';

export interface StoredStarter {
  personId: number;
  key: string;
  name: string;
  group: string | null;
}

export interface StoredAbsence {
  expectedTotal: number;
  nobodyChance: number;
  worstAbsence: { personId: number; name: string; total: number } | null;
  standIns: { personId: number; name: string; standInId: number | null; standInName: string | null; total: number | null }[];
}

/**
 * A stored plan warning: { code, text } since warnings have codes; plans saved before hold the
 * text alone (server/plans/warnings.ts reads both).
 */
export type StoredPlanWarning = PlanWarning | string;

export interface StoredPlanExtras {
  bestSingle: { personId: number; name: string; total: number } | null;
  gainShare: number | null;
  nodes: number | null;
  searchLeft: number | null;
  stopped: boolean;
  fewestForOneHop: number | null;
}

/**
 * Background work (plans computed in the background, rehearsals). The row is the truth: the
 * in-memory runner only drives it, and on start-up rows left queued or running are marked
 * interrupted, so nothing half-written is ever presented as finished.
 */
export const jobs = mysqlTable(
  'jobs',
  {
    id: idColumn(),
    userId: refColumn('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    roomId: refColumn('room_id')
      .notNull()
      .references(() => rooms.id, { onDelete: 'cascade' }),
    kind: mysqlEnum('kind', JOB_KINDS).notNull(),
    status: mysqlEnum('status', JOB_STATUSES).notNull().default('queued'),
    progress: double('progress').notNull().default(0),
    message: text('message'),
    planId: refColumn('plan_id'),
    rehearsalId: refColumn('rehearsal_id'),
    /** Client-supplied key (or a derived one) so that a double click starts one job. */
    idempotencyKey: varchar('idempotency_key', { length: 160 }),
    createdAt: createdAt(),
    startedAt: timestamp('started_at', { fsp: 3 }),
    finishedAt: timestamp('finished_at', { fsp: 3 }),
  },
  (t) => [
    index('jobs_user_status_idx').on(t.userId, t.status),
    index('jobs_status_idx').on(t.status),
    uniqueIndex('jobs_user_key_uq').on(t.userId, t.idempotencyKey),
  ],
);

/** A choice of starters for a budget k, with its scores and the room snapshot it was computed on. */
export const plans = mysqlTable(
  'plans',
  {
    id: idColumn(),
    roomId: refColumn('room_id')
      .notNull()
      .references(() => rooms.id, { onDelete: 'cascade' }),
    createdBy: refColumn('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: varchar('name', { length: 120 }).notNull(),
    kind: mysqlEnum('kind', ['computed', 'hand-made']).notNull(),
    status: mysqlEnum('status', PLAN_STATUSES).notNull(),
    k: int('k', { unsigned: true }).notNull(),
    methodRequested: varchar('method_requested', { length: 20 }).notNull(),
    methodUsed: varchar('method_used', { length: 20 }),
    nu: double('nu'),
    timeLimitSeconds: double('time_limit_seconds'),
    mustBrief: json('must_brief').$type<number[]>().notNull(),
    cannotBrief: json('cannot_brief').$type<number[]>().notNull(),
    /** Starters in briefing order, with their names at computing time (null until computed). */
    starters: json('starters').$type<StoredStarter[]>(),
    total: double('total'),
    average: double('average'),
    qualityRank: double('quality_rank'),
    lowerBound: double('lower_bound'),
    gap: double('gap'),
    certified: boolean('certified').notNull().default(false),
    coverSize: int('cover_size'),
    /** Chance (0..0.5) that a starter does not show up; 0 or null: the plain objective. */
    noShow: double('no_show'),
    /** No-show results ({ expectedTotal, nobodyChance, worstAbsence, standIns }), null without a no-show chance. */
    absence: json('absence').$type<StoredAbsence>(),
    /** Search and reading aids ({ bestSingle, gainShare, nodes, searchLeft, stopped, fewestForOneHop }); null for older plans. */
    extras: json('extras').$type<StoredPlanExtras>(),
    elapsedMs: double('elapsed_ms'),
    people: int('people', { unsigned: true }).notNull(),
    roomVersion: int('room_version', { unsigned: true }).notNull(),
    settings: json('settings').$type<{ directed: boolean; minutesPerHop: number; laziness: number; mixing: number }>().notNull(),
    /** JSON of the room as computed on ({ graph, personIds, names }), so old plans stay reproducible. */
    snapshot: longtext('snapshot').notNull(),
    /** JSON of the per-person expected hops and the reach curve (computed once with the plan). */
    results: longtext('results'),
    notes: json('notes').$type<string[]>().notNull(),
    warnings: json('warnings').$type<StoredPlanWarning[]>().notNull(),
    chosen: boolean('chosen').notNull().default(false),
    jobId: refColumn('job_id'),
    error: text('error'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('plans_room_idx').on(t.roomId, t.createdAt)],
);

/** A batch of seeded simulated cascades for one plan. Results are written once, when complete. */
export const rehearsals = mysqlTable(
  'rehearsals',
  {
    id: idColumn(),
    planId: refColumn('plan_id')
      .notNull()
      .references(() => plans.id, { onDelete: 'cascade' }),
    roomId: refColumn('room_id')
      .notNull()
      .references(() => rooms.id, { onDelete: 'cascade' }),
    createdBy: refColumn('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    jobId: refColumn('job_id').notNull(),
    runs: int('runs', { unsigned: true }).notNull(),
    seed: varchar('seed', { length: 64 }).notNull(),
    rerunOf: refColumn('rerun_of'),
    average: double('average'),
    averageStderr: double('average_stderr'),
    analyticAverage: double('analytic_average'),
    capped: int('capped', { unsigned: true }),
    hops: double('hops'),
    hopCap: int('hop_cap', { unsigned: true }),
    elapsedMs: double('elapsed_ms'),
    verdict: json('verdict'),
    /** JSON per-person arrays and reach curves. */
    results: longtext('results'),
    /** JSON of the sample cascades kept for the replay. */
    samples: longtext('samples'),
    createdAt: createdAt(),
    finishedAt: timestamp('finished_at', { fsp: 3 }),
  },
  (t) => [index('rehearsals_room_idx').on(t.roomId, t.createdAt), index('rehearsals_plan_idx').on(t.planId)],
);
