import { createServer } from 'node:http';
import { config, publicUrl, startupWarnings } from './config';
import { createApp } from './app';
import { logger } from './core/logging';
import { checkDatabase, pool } from './db';
import { startMail, stopMail } from './mail/transport';
import { startJobs, stopJobs } from './jobs/index';

for (const warning of startupWarnings()) logger.warn(warning);
const unreachable = await checkDatabase();
if (unreachable) {
  console.error(unreachable);
  process.exit(1);
}
await startMail();
await startJobs();
const server = createServer(createApp());

server.on('error', (err: NodeJS.ErrnoException) => {
  if (err.code === 'EADDRINUSE') {
    console.error(`Port ${config.PORT} is already in use. Stop the other program or set PORT to a free port.`);
  } else {
    console.error(`The server could not start: ${err.message}`);
  }
  process.exit(1);
});

server.listen(config.PORT, config.HOST, () => {
  logger.info(`Ripplehall is serving ${publicUrl()}`);
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  logger.info(`${signal}: finishing open requests, then stopping.`);
  server.close();
  server.closeIdleConnections();
  setTimeout(() => process.exit(0), 5000).unref();
  await stopJobs();
  await stopMail();
  await pool.end();
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
