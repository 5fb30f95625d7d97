import { drizzle } from 'drizzle-orm/mysql2';
import mysql from 'mysql2/promise';
import * as schema from '../db/schema/index';
import { config } from './config';
import { dbErrorCode } from './core/db-errors';

export const pool = mysql.createPool({
  host: config.DB_HOST,
  port: config.DB_PORT,
  user: config.DB_USER,
  password: config.DB_PASSWORD,
  database: config.DB_NAME,
  timezone: 'Z',
  connectionLimit: config.DB_POOL_SIZE,
  connectTimeout: 5000,
  charset: 'utf8mb4',
  // mysql2 would capture a stack trace for every query (about 3 % of a signed-in read's CPU).
  // Drizzle's query errors still show the caller (raised where drizzle awaited the query); an
  // error of a raw pool.query shows only the driver's frames.
  trace: false,
});

/**
 * Every pooled connection gets a per-statement time limit (MariaDB `max_statement_time`, in
 * seconds; 0 = none), so one runaway statement cannot hold a connection for long.
 */
pool.pool.on('connection', (conn) => {
  if (config.DB_STATEMENT_SECONDS > 0) {
    conn.query(`SET SESSION max_statement_time = ${Number(config.DB_STATEMENT_SECONDS)}`, () => undefined);
  }
});

/**
 * A connection must be free within DB_ACQUIRE_TIMEOUT_MS, or the request answers 503 instead of
 * waiting behind everyone else (mysql2 pools have no acquire timeout of their own). A connection
 * that arrives after the caller gave up goes straight back to the pool.
 */
type Core = { getConnection(cb: (err: Error | null, conn?: { release(): void }) => void): void };
const core = pool.pool as unknown as Core;
const acquire = core.getConnection.bind(core);
core.getConnection = (cb) => {
  let settled = false;
  const timer = setTimeout(() => {
    settled = true;
    const err = Object.assign(new Error(`No database connection was free within ${config.DB_ACQUIRE_TIMEOUT_MS} ms.`), {
      code: 'POOL_ACQUIRE_TIMEOUT',
    });
    cb(err);
  }, config.DB_ACQUIRE_TIMEOUT_MS);
  acquire((err, conn) => {
    if (settled) {
      conn?.release();
      return;
    }
    settled = true;
    clearTimeout(timer);
    cb(err, conn);
  });
};

export const db = drizzle(pool, { schema, mode: 'default' });
export type Db = typeof db;
/** The transaction handle drizzle passes to `db.transaction(async (tx) => ...)`. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
/** What a store function runs on: the pool, or the transaction it was handed (always its last argument). */
export type Conn = Tx | Db;

/**
 * A transaction retried when MariaDB picks it as a deadlock victim (errno 1213) or a lock wait
 * times out (1205): the whole transaction was rolled back, so running it again is safe. Bounded;
 * the last failure goes to the error handler (503, "try again").
 */
export async function transaction<T>(work: (tx: Tx) => Promise<T>, attempts = 3): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await db.transaction(work);
    } catch (err) {
      const code = dbErrorCode(err);
      if (attempt >= attempts || (code !== 'ER_LOCK_DEADLOCK' && code !== 'ER_LOCK_WAIT_TIMEOUT')) throw err;
      await new Promise((r) => setTimeout(r, 10 * attempt + Math.floor(Math.random() * 20)));
    }
  }
}

/** One line for start-up when the database cannot be reached (no stack, no internal paths). */
export async function checkDatabase(): Promise<string | undefined> {
  try {
    await pool.query('SELECT 1');
    return undefined;
  } catch (err) {
    const code = dbErrorCode(err) ?? 'unknown error';
    const where = `${config.DB_HOST}:${config.DB_PORT} (database ${config.DB_NAME})`;
    if (code === 'ECONNREFUSED' || code === 'ETIMEDOUT' || code === 'POOL_ACQUIRE_TIMEOUT') {
      return `Cannot reach MariaDB at ${where}: is it running? Start it with \`bash scripts/db.sh start\` (or \`npm start\`), or set DB_HOST and DB_PORT.`;
    }
    if (code === 'ER_ACCESS_DENIED_ERROR') return `MariaDB at ${where} refused the user ${config.DB_USER}: check DB_USER and DB_PASSWORD.`;
    if (code === 'ER_BAD_DB_ERROR') return `MariaDB at ${where} has no database ${config.DB_NAME}: run \`npm start\` once to create it.`;
    return `MariaDB at ${where} answered with ${code}.`;
  }
}
