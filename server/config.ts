import { z } from 'zod';

/** Every setting comes from the environment, is validated once, and is listed in the README. */
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
  SESSION_SECRET: z.string().min(16).default('dev-only-session-secret-change-me'),
  /** Key material for the sealed copies of participant links (server/participants/link-seal.ts). */
  LINK_SECRET: z.string().min(16).default('dev-only-link-secret-change-me'),
  SESSION_IDLE_MINUTES: z.coerce.number().positive().default(30),
  SESSION_MAX_HOURS: z.coerce.number().positive().default(8),
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
  RATE_LIMIT_SIGNIN_PER_15MIN: z.coerce.number().int().positive().default(10),
  RATE_LIMIT_IP_PER_15MIN: z.coerce.number().int().positive().default(100),
  /** Password-reset requests per account and address (the per-address cap is RATE_LIMIT_IP_PER_15MIN). */
  RATE_LIMIT_RESET_PER_15MIN: z.coerce.number().int().positive().default(5),
  /** Failed participant-link lookups per address (made-up, expired or revoked links). */
  RATE_LIMIT_LINK_PER_15MIN: z.coerce.number().int().positive().default(30),
  MAX_ROOM_PEOPLE: z.coerce.number().int().positive().default(5000),
  MAX_CASCADES: z.coerce.number().int().positive().default(100000),
  MAX_JOBS_PER_USER: z.coerce.number().int().positive().default(2),
  WORKERS: z.coerce.number().int().min(1).max(16).default(2),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
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

export function publicUrl(): string {
  return config.PUBLIC_URL ?? `http://${config.HOST === '0.0.0.0' ? '127.0.0.1' : config.HOST}:${config.PORT}`;
}
