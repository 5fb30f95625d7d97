/**
 * Last line of defence for long-running processes (web and worker): a promise rejected with
 * nobody listening, or an error thrown from a callback, is logged and the process keeps serving.
 * A database or Redis fault must never end the process; the code paths that can hit one handle
 * it, and this catches what slips through.
 */
import { logger } from './logging';

let installed = false;

export function installProcessGuards(): void {
  if (installed) return;
  installed = true;
  process.on('unhandledRejection', (reason) => {
    logger.error(
      { err: reason instanceof Error ? { message: reason.message, stack: reason.stack } : reason },
      'unhandled rejection (kept running)',
    );
  });
  process.on('uncaughtException', (err) => {
    logger.error({ err: { message: err.message, stack: err.stack } }, 'uncaught exception (kept running)');
  });
}
