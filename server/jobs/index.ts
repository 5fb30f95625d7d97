/** Wires the job kinds to their handlers and exposes start-up recovery and shutdown. */
import { logger } from '../core/logging';
import { planJobHandler } from '../plans/service';
import { rehearsalJobHandler } from '../rehearsals/service';
import { closePools, warmPools } from './pools';
import { jobRunner } from './runner';
import { recoverOpenJobs } from './store';

jobRunner.register('plan', planJobHandler);
jobRunner.register('rehearsal', rehearsalJobHandler);

export { jobRunner };

/** On server start: recovery, then the worker pools are started so the first request does not wait for them. */
export async function startJobs(): Promise<void> {
  await recoverJobs();
  void warmPools().catch((err: unknown) => logger.warn({ err }, 'warming the worker pools failed'));
}

/** Jobs left queued or running by a previous process become interrupted. */
export async function recoverJobs(): Promise<number> {
  const n = await recoverOpenJobs();
  if (n > 0) logger.warn(`${n} background job${n === 1 ? ' was' : 's were'} left open by the last run and marked interrupted.`);
  return n;
}

/** On shutdown: open jobs of this process become interrupted, then the worker pools stop. */
export async function stopJobs(): Promise<void> {
  await jobRunner.interruptAll('The server was stopped while this job was open; nothing partial was kept. Run it again.');
  await closePools();
}
