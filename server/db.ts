import { config } from './config';
import { dbErrorCode } from './core/db-errors';
import { db, pool, type Tx } from '../db/connection';

export { db, pool, type Conn, type Db, type Tx } from '../db/connection';

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
