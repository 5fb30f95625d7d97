/**
 * A web process: serves HTTP and, unless WEB_ONLY=true, also runs jobs (the same workers as
 * `npm run worker`, so one machine needs one process and several machines use the same code).
 */
import { createServer } from 'node:http';
import { config, publicUrl, startupWarnings } from './config';
import { createApp } from './app';
import { logger } from './core/logging';
import { installProcessGuards } from './core/process-guards';
import { checkDatabase, pool } from './db';
import { closeCounterRedis } from './jobs/redis';
import { startMail, stopMail } from './mail/transport';
import { startJobs, stopJobs } from './jobs/index';

installProcessGuards();
for (const warning of startupWarnings()) logger.warn(warning);
const unreachable = await checkDatabase();
if (unreachable) {
  console.error(unreachable);
  process.exit(1);
}
const server = createServer(createApp());

server.on('error', (err: NodeJS.ErrnoException) => {
  if (err.code === 'EADDRINUSE') {
    console.error(`Port ${config.PORT} is already in use. Stop the other program or set PORT to a free port.`);
  } else {
    console.error(`The server could not start: ${err.message}`);
  }
  process.exit(1);
});

await startMail();
// Jobs start only once the port is ours: a second server started on a taken port exits before
// it has touched any job, and a live server's jobs are never recovered by someone else.
server.listen(config.PORT, config.HOST, () => {
  logger.info(`Ripplehall is serving ${publicUrl()}${config.WEB_ONLY ? ' (web only: jobs run in worker processes)' : ''}`);
  try {
    startJobs(!config.WEB_ONLY);
  } catch (err) {
    logger.error({ err }, 'the job system did not start');
  }
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  logger.info(`${signal}: finishing open requests, handing running jobs back to the queue, then stopping.`);
  setTimeout(() => process.exit(0), 10_000).unref();
  // Requests already read (some waiting for a database connection) are answered before the
  // pool closes; keep-alive connections close as soon as they are idle.
  const drained = new Promise<void>((resolve) => server.close(() => resolve()));
  server.closeIdleConnections();
  const jobs = stopJobs().catch((err: unknown) => logger.warn({ err }, 'stopping the jobs failed'));
  await Promise.race([drained, new Promise((resolve) => setTimeout(resolve, 8_000).unref())]);
  await jobs;
  await closeCounterRedis();
  await stopMail();
  await pool.end();
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
