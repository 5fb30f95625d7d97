/** Rehearsals HTTP (contract in shared/api/plans.ts). */
import { Router } from 'express';
import { z } from 'zod';
import { JOB_STATUSES, REHEARSAL_LIMITS } from '../../shared/api/plans';
import { ID_PATTERN } from '../../shared/api/ids';
import { signedIn } from '../core/access';
import { parse } from '../core/validate';
import { roomAccess } from '../jobs/access';
import { streamJob } from '../jobs/sse';
import { loadPlanFor } from '../plans/service';
import { roomIdOf } from '../rooms/access';
import { replayBundle, replayIndex, replaySample } from './replay';
import * as service from './service';
import { listRehearsals } from './store';

const key = z.string().trim().min(1).max(REHEARSAL_LIMITS.idempotencyKeyMax);

// Runs and seed are checked by the service, so each gets its own specific message and code.
const startSchema = z.strictObject({
  runs: z.number({ error: 'runs must be a number of cascades' }),
  seed: z.string({ error: 'seed must be text' }).optional(),
  idempotencyKey: key.optional(),
});

const rerunSchema = z.strictObject({ idempotencyKey: key.optional() });

const isoDate = z
  .string()
  .refine(
    (s) => /^\d{4}-\d{2}-\d{2}([T ][\d:.]+(Z|[+-]\d{2}:?\d{2})?)?$/.test(s) && !Number.isNaN(Date.parse(s)),
    'Use an ISO date such as 2026-03-01.',
  )
  .transform((s) => new Date(s));

const listSchema = z.strictObject({
  planId: z.string().regex(ID_PATTERN, 'planId must be a plan id').transform(Number).optional(),
  status: z.enum(JOB_STATUSES).optional(),
  from: isoDate.optional(),
  to: isoDate.optional(),
});

/** Mounted at /api/plans: start a rehearsal of a plan. */
export const planRehearsalsRouter = Router();

planRehearsalsRouter.post('/:planId/rehearsals', signedIn(), async (req, res) => {
  const body = parse(startSchema, req.body);
  const plan = await loadPlanFor(req.user, req.params['planId'], 'edit');
  res.status(202).json(await service.startRehearsal(req.user!, plan, body));
});

/** Mounted at /api/rooms: the room's rehearsal history. */
export const roomRehearsalsRouter = Router();

roomRehearsalsRouter.get('/:roomId/rehearsals', signedIn(), async (req, res) => {
  const q = parse(listSchema, req.query, 'filters');
  const roomId = roomIdOf(req.params['roomId']);
  await roomAccess(req.user, roomId, 'view', 'That room');
  res.json(await service.summaries(await listRehearsals(roomId, q)));
});

/** Mounted at /api/rehearsals. */
export const rehearsalsRouter = Router();

rehearsalsRouter.get('/:id', signedIn(), async (req, res) => {
  res.json(await service.rehearsalDetail(await service.loadRehearsalFor(req.user, req.params['id'], 'view')));
});

rehearsalsRouter.get('/:id/events', signedIn(), async (req, res) => {
  const row = await service.loadRehearsalFor(req.user, req.params['id'], 'view');
  await streamJob(req, res, row.rehearsal.jobId);
});

rehearsalsRouter.post('/:id/cancel', signedIn(), async (req, res) => {
  res.json(await service.cancelRehearsal(await service.loadRehearsalFor(req.user, req.params['id'], 'edit')));
});

rehearsalsRouter.post('/:id/rerun', signedIn(), async (req, res) => {
  const body = parse(rerunSchema, req.body);
  const row = await service.loadRehearsalFor(req.user, req.params['id'], 'edit');
  const plan = await loadPlanFor(req.user, row.rehearsal.planId, 'edit');
  const started = await service.startRehearsal(
    req.user!,
    plan,
    { runs: row.rehearsal.runs, seed: row.rehearsal.seed, ...(body.idempotencyKey ? { idempotencyKey: body.idempotencyKey } : {}) },
    { id: row.rehearsal.id },
  );
  res.status(202).json(started);
});

rehearsalsRouter.delete('/:id', signedIn(), async (req, res) => {
  await service.deleteRehearsal(await service.loadRehearsalFor(req.user, req.params['id'], 'edit'));
  res.status(204).end();
});

rehearsalsRouter.get('/:id/samples', signedIn(), async (req, res) => {
  res.json(await replayIndex(await service.loadRehearsalFor(req.user, req.params['id'], 'view')));
});

rehearsalsRouter.get('/:id/replay', signedIn(), async (req, res) => {
  res.json(await replayBundle(await service.loadRehearsalFor(req.user, req.params['id'], 'view')));
});

rehearsalsRouter.get('/:id/samples/:n', signedIn(), async (req, res) => {
  res.json(await replaySample(await service.loadRehearsalFor(req.user, req.params['id'], 'view'), String(req.params['n'])));
});
