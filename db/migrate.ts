// Applies the committed SQL migrations with drizzle's programmatic migrator (it reports real
// errors; drizzle-kit's own migrate command can exit 1 silently on MariaDB).
import { migrate } from 'drizzle-orm/mysql2/migrator';
import { db, pool } from './connection';
import { config } from '../config/settings';

try {
  await migrate(db, { migrationsFolder: new URL('./migrations', import.meta.url).pathname });
  console.log(`Database ${config.DB_NAME} is up to date.`);
} catch (err) {
  const e = err as { code?: string; message?: string; cause?: { message?: string } };
  console.error(`Could not migrate database ${config.DB_NAME} on ${config.DB_HOST}:${config.DB_PORT}: ${e.cause?.message ?? e.message}`);
  if (e.code === 'ECONNREFUSED') console.error('Is MariaDB running? Start it with: bash scripts/db.sh start');
  process.exitCode = 1;
} finally {
  await pool.end();
}
