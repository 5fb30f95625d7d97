/**
 * The connection pool and its drizzle handle, shared by the server, the migrator (db/migrate.ts) and the
 * demo loader (seed-data/). SQL itself lives in the server's store files.
 */
import { drizzle } from 'drizzle-orm/mysql2';
import mysql from 'mysql2/promise';
import * as schema from './schema/index';
import { config } from '../config/settings';

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
