/** /api/jobs: state, event stream, cancel and the configured limits. */
import { Router } from 'express';
import { z } from 'zod';
import type { ServerLimits } from '../../shared/api/plans';
import { signedIn } from '../core/access';
import { config } from '../config';
import { parse } from '../core/validate';
import { loadJobFor } from './access';
import { jobDto } from './dto';
import { jobRunner } from './runner';
import { streamJob } from './sse';
import './index';
import { findJob } from './store';

export const jobsRouter = Router();

jobsRouter.get('/limits', signedIn(), (_req, res) => {
  const limits: ServerLimits = { maxCascades: config.MAX_CASCADES, maxJobsPerUser: config.MAX_JOBS_PER_USER, workers: config.WORKERS };
  res.json(limits);
});

jobsRouter.get('/:jobId', signedIn(), async (req, res) => {
  const job = await loadJobFor(req.user, req.params['jobId'], 'view');
  res.json(jobDto(job, await jobRunner.positionOf(job)));
});

jobsRouter.get('/:jobId/events', signedIn(), async (req, res) => {
  const job = await loadJobFor(req.user, req.params['jobId'], 'view');
  await streamJob(req, res, job.id);
});

/** keepBest: a running plan search stops and keeps the best plan found so far (it then ends 'done'). */
const cancelSchema = z.strictObject({ keepBest: z.boolean().optional() });

jobsRouter.post('/:jobId/cancel', signedIn(), async (req, res) => {
  const body = parse(cancelSchema, req.body ?? {});
  const job = await loadJobFor(req.user, req.params['jobId'], 'edit');
  if (body.keepBest) await jobRunner.stopEarly(job);
  else await jobRunner.cancel(job);
  const fresh = (await findJob(job.id))!;
  res.json(jobDto(fresh, await jobRunner.positionOf(fresh)));
});
