import { z } from 'zod';

/**
 * Every setting comes from the environment, is validated once, and is listed in the README. It lives
 * outside server/ so that the migrator (db/migrate.ts) and the demo loader (seed-data/) read the same
 * settings without reaching into the server.
 */
const schema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(4300),
  HOST: z.string().default('127.0.0.1'),
  PUBLIC_URL: z.string().url().optional(),
  /** Folder of the built client (default dist/ripplehall/browser). */
  CLIENT_DIR: z.string().optional(),
  DB_HOST: z.string().default('127.0.0.1'),
  DB_PORT: z.coerce.number().int().min(1).max(65535).default(3407),
  DB_USER: z.string().default('ripplehall'),
  DB_PASSWORD: z.string().default('ripplehall'),
  DB_NAME: z
    .string()
    .regex(/^[A-Za-z0-9_]+$/)
    .default('ripplehall'),
  /** Pooled database connections per process. */
  DB_POOL_SIZE: z.coerce.number().int().min(2).max(200).default(20),
  /** How long a request waits for a free database connection before answering 503. */
  DB_ACQUIRE_TIMEOUT_MS: z.coerce.number().int().min(100).default(5000),
  /** MariaDB max_statement_time for every pooled connection, in seconds (0 = no limit). */
  DB_STATEMENT_SECONDS: z.coerce.number().min(0).default(10),
  SESSION_SECRET: z.string().min(16).default('dev-only-session-secret-change-me'),
  /** Key material for the sealed copies of participant links (server/participants/link-seal.ts). */
  LINK_SECRET: z.string().min(16).default('dev-only-link-secret-change-me'),
  SESSION_IDLE_MINUTES: z.coerce.number().positive().default(30),
  SESSION_MAX_HOURS: z.coerce.number().positive().default(8),
  /**
   * How long a web process may answer from its own copy of a session row and its account, in ms
   * (0 = read both on every request). Capped at 2 s: it bounds how long a sign-out, password reset,
   * deactivation or role change made in another process (or straight in the database) can go
   * unnoticed here; the process that makes the change forgets its copy at once.
   */
  SESSION_CACHE_MS: z.coerce.number().int().min(0).max(2000).default(1000),
  TRUST_PROXY: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  /** 'fake' runs the local SMTP fake in-process and stores every message; 'smtp' sends for real. */
  MAIL_MODE: z.enum(['fake', 'smtp']).default('fake'),
  MAIL_FROM: z.string().default('Ripplehall <no-reply@ripplehall.local>'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(0),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  ADMIN_EMAIL: z.string().email().default('admin@ripplehall.local'),
  ADMIN_PASSWORD: z.string().min(10).default('admin-demo-2026'),
  /** Failed sign-ins per account (or known device) before the back-off starts. */
  RATE_LIMIT_SIGNIN_PER_15MIN: z.coerce.number().int().positive().default(10),
  /** Failed sign-ins per account in 15 minutes, over all addresses (NIST SP 800-63B 5.2.2: at most 100). */
  SIGNIN_ACCOUNT_MAX_FAILURES: z.coerce.number().int().min(1).max(100).default(100),
  RATE_LIMIT_IP_PER_15MIN: z.coerce.number().int().positive().default(100),
  /**
   * Tests only: the key scope of the Redis counters. Under NODE_ENV=test each process counts on
   * its own (the scope is its pid) unless processes that must share counters name one scope.
   */
  RATE_LIMIT_SCOPE: z
    .string()
    .regex(/^[A-Za-z0-9_-]{1,40}$/)
    .optional(),
  /** Password-reset requests per account and address (the per-address cap is RATE_LIMIT_IP_PER_15MIN). */
  RATE_LIMIT_RESET_PER_15MIN: z.coerce.number().int().positive().default(5),
  /** Failed participant-link lookups per address (made-up, expired or revoked links). */
  RATE_LIMIT_LINK_PER_15MIN: z.coerce.number().int().positive().default(30),
  /** People in one imported room (rooms built by hand keep the lower limit of the screens). */
  MAX_ROOM_PEOPLE: z.coerce.number().int().positive().default(100000),
  /** Ties in one imported room. */
  MAX_ROOM_TIES: z.coerce.number().int().positive().default(1000000),
  /** Memory cap of the thread that reads one upload, in MB. */
  IMPORT_WORKER_MB: z.coerce.number().int().min(32).default(512),
  /** Edit batches, imports and rooms created with content that one account may run at once. */
  MAX_HEAVY_WRITES_PER_USER: z.coerce.number().int().min(1).default(2),
  MAX_CASCADES: z.coerce.number().int().positive().default(100000),
  MAX_JOBS_PER_USER: z.coerce.number().int().positive().default(2),
  /** Seconds an automatic plan's search goes on proving in the background after the plan is shown (0: never). */
  PROOF_SECONDS: z.coerce.number().min(0).max(600).default(50),
  WORKERS: z.coerce.number().int().min(1).max(16).default(2),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** The job queue's Redis (BullMQ); the default is the private one of scripts/redis.sh on REDIS_PORT. */
  REDIS_URL: z
    .string()
    .regex(/^rediss?:\/\//, 'use redis://host:port (or rediss:// for TLS)')
    .optional(),
  REDIS_PORT: z.coerce.number().int().min(1).max(65535).default(6389),
  /** true: this process serves HTTP only and runs no jobs (start worker processes with npm run worker). */
  WEB_ONLY: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  /** A worker that stops renewing its lock for this long is taken for dead; its job is retried elsewhere. */
  JOB_LOCK_SECONDS: z.coerce.number().int().min(2).max(600).default(30),
  /** Tries per job and per rehearsal chunk before it is marked failed (database or queue faults). */
  JOB_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(8),
  /** Jobs one user may have queued or running at once (plans and rehearsals together). */
  MAX_OPEN_JOBS_PER_USER: z.coerce.number().int().positive().default(10),
  /** Cascades one user may have queued or running at once, over all their rehearsals. */
  MAX_OPEN_CASCADES_PER_USER: z.coerce.number().int().positive().default(500000),
  /** Plans one user may keep stored (delete old ones to make room). */
  MAX_PLANS_PER_USER: z.coerce.number().int().positive().default(500),
});

export type Config = z.infer<typeof schema>;

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = schema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration in the environment:\n${lines.join('\n')}`);
  }
  const config = parsed.data;
  if (config.NODE_ENV === 'production' && config.SESSION_SECRET.startsWith('dev-only')) {
    throw new Error('Invalid configuration: set SESSION_SECRET to a long random value in production.');
  }
  if (config.NODE_ENV === 'production' && config.LINK_SECRET.startsWith('dev-only')) {
    throw new Error('Invalid configuration: set LINK_SECRET to a long random value in production (it seals participant links).');
  }
  return config;
}

export const config: Config = loadConfig();
