// Loads the demo data idempotently: accounts first, then each demo scenario.
import { pool } from '../db/connection';
import { config } from '../config/settings';
import { seedAccounts } from './accounts';
import { seedRooms } from './rooms';

try {
  const accounts = await seedAccounts();
  await seedRooms(accounts.facilitatorId);
  console.log(`Demo data is loaded in ${config.DB_NAME}.`);
} catch (err) {
  console.error(`Could not load the demo data: ${(err as Error).message}`);
  process.exitCode = 1;
} finally {
  await pool.end();
}
