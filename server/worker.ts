/**
 * A worker process (`npm run worker`): runs plans and rehearsal chunks from the job queue, no
 * HTTP. Start as many as the machines have cores for; they share the work through Redis and
 * write results to MariaDB (REDIS_URL, DB_HOST in the README).
 */
import { config, redisUrl } from './config';
import { logger } from './core/logging';
import { installProcessGuards } from './core/process-guards';
import { pool } from './db';
import { startJobs, stopJobs } from './jobs/index';

installProcessGuards();
startJobs(true);
logger.info(
  `Ripplehall worker ${process.pid} is taking jobs from ${redisUrl().replace(/\/\/[^@]*@/, '//')} with ${config.WORKERS} threads`,
);

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  logger.info(`${signal}: handing running jobs back to the queue, then stopping.`);
  setTimeout(() => process.exit(0), 10_000).unref();
  await stopJobs().catch((err: unknown) => logger.warn({ err }, 'stopping the jobs failed'));
  await pool.end();
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
