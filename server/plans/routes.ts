/** Plans HTTP: /api/rooms/:roomId/plans... and /api/plans/... (contract in shared/api/plans.ts). */
import { Router } from 'express';
import { z } from 'zod';
import { PLAN_LIMITS, PLAN_METHOD_CHOICES } from '../../shared/api/plans';
import { NO_SHOW_LIMITS } from '../../shared/api/plan-rules';
import { SEED_PATTERN } from '../../shared/api/ids';
import { CLOCK_PATTERN, DEFAULT_SEND_AT } from '../../shared/api/briefing-clock';
import { signedIn } from '../core/access';
import { parse } from '../core/validate';
import { roomIdOf } from '../rooms/access';
import { briefingCsv, briefingPdf, briefingSheet } from './briefing';
import * as service from './service';

const personIds = z.array(z.number().int().positive()).max(5000);

const createSchema = z
  .strictObject({
    name: z.string().trim().max(PLAN_LIMITS.nameMax).optional(),
    k: z.number().int('k must be a whole number').optional(),
    method: z.enum(PLAN_METHOD_CHOICES).optional(),
    nu: z.number().min(PLAN_LIMITS.nu.min).max(PLAN_LIMITS.nu.max).optional(),
    timeLimitSeconds: z
      .number()
      .min(PLAN_LIMITS.timeLimitSeconds.min, 'The time limit is 1 to 300 seconds.')
      .max(PLAN_LIMITS.timeLimitSeconds.max, 'The time limit is 1 to 300 seconds.')
      .optional(),
    mustBrief: personIds.optional(),
    cannotBrief: personIds.optional(),
    starters: personIds.optional(),
    background: z.boolean().optional(),
    noShow: z
      .number()
      .min(NO_SHOW_LIMITS.min, 'The no-show chance is 0 to 50 %.')
      .max(NO_SHOW_LIMITS.max, 'The no-show chance is 0 to 50 %.')
      .optional(),
  })
  .superRefine((v, ctx) => {
    if (v.starters === undefined && v.k === undefined)
      ctx.addIssue({ code: 'custom', path: ['k'], message: 'Give k (the number of starters), or pick the starters yourself.' });
    if (v.starters !== undefined && v.k !== undefined && v.k !== v.starters.length) {
      ctx.addIssue({
        code: 'custom',
        path: ['k'],
        message: `k (${v.k}) differs from the number of starters picked (${v.starters.length}).`,
      });
    }
    if (v.starters !== undefined && (v.method || v.mustBrief?.length || v.cannotBrief?.length)) {
      ctx.addIssue({ code: 'custom', path: ['starters'], message: 'A hand-made plan takes no method or constraints.' });
    }
  });

const updateSchema = z.strictObject({
  name: z.string().trim().min(1, 'A plan needs a name.').max(PLAN_LIMITS.nameMax).optional(),
  chosen: z.boolean().optional(),
});

const sweepSchema = z.strictObject({
  maxK: z.number().int('maxK must be a whole number'),
  seed: z.string().regex(SEED_PATTERN, 'Use 1-64 letters, digits, - or _.').optional(),
});

const compareSchema = z.strictObject({ a: z.string(), b: z.string() });

const pdfQuerySchema = z.strictObject({
  /** Time the message goes out, 24-hour HH:MM (default 09:00). */
  start: z.string().regex(CLOCK_PATTERN, 'Give the start time as a 24-hour time such as 09:00 or 14:30.').optional(),
});

/** Mounted at /api/rooms: the room's plan list, creation and k-sweep. */
export const roomPlansRouter = Router();

roomPlansRouter.get('/:roomId/plans', signedIn(), async (req, res) => {
  res.json(await service.listPlans(req.user!, roomIdOf(req.params['roomId'])));
});

roomPlansRouter.post('/:roomId/plans', signedIn(), async (req, res) => {
  const body = parse(createSchema, req.body);
  const out = await service.createPlan(req.user!, roomIdOf(req.params['roomId']), body);
  res.status(out.status).json(out.body);
});

roomPlansRouter.post('/:roomId/plans/sweep', signedIn(), async (req, res) => {
  const body = parse(sweepSchema, req.body);
  res.json(await service.sweep(req.user!, roomIdOf(req.params['roomId']), body.maxK, body.seed ?? 'sweep'));
});

/** Mounted at /api/plans. */
export const plansRouter = Router();

plansRouter.get('/compare', signedIn(), async (req, res) => {
  const q = parse(compareSchema, req.query, 'query');
  const [a, b] = await Promise.all([service.loadPlanFor(req.user, q.a, 'view'), service.loadPlanFor(req.user, q.b, 'view')]);
  res.json(await service.comparePlans(a, b));
});

plansRouter.get('/:planId', signedIn(), async (req, res) => {
  res.json(await service.getPlan(await service.loadPlanFor(req.user, req.params['planId'], 'view')));
});

plansRouter.patch('/:planId', signedIn(), async (req, res) => {
  const body = parse(updateSchema, req.body);
  const plan = await service.loadPlanFor(req.user, req.params['planId'], 'edit');
  res.json(await service.updatePlan(plan, body));
});

plansRouter.delete('/:planId', signedIn(), async (req, res) => {
  await service.deletePlan(await service.loadPlanFor(req.user, req.params['planId'], 'edit'));
  res.status(204).end();
});

plansRouter.post('/:planId/rerun', signedIn(), async (req, res) => {
  const plan = await service.loadPlanFor(req.user, req.params['planId'], 'edit');
  res.status(202).json(await service.rerunPlan(req.user!, plan));
});

plansRouter.get('/:planId/briefing', signedIn(), async (req, res) => {
  res.json(await briefingSheet(await service.loadPlanFor(req.user, req.params['planId'], 'view')));
});

plansRouter.get('/:planId/briefing.csv', signedIn(), async (req, res) => {
  const plan = await service.loadPlanFor(req.user, req.params['planId'], 'view');
  const csv = await briefingCsv(plan);
  res.type('text/csv; charset=utf-8').set('Content-Disposition', `attachment; filename="briefing-plan-${plan.id}.csv"`).send(csv);
});

plansRouter.get('/:planId/briefing.pdf', signedIn(), async (req, res) => {
  const q = parse(pdfQuerySchema, req.query, 'query');
  const plan = await service.loadPlanFor(req.user, req.params['planId'], 'view');
  const pdf = await briefingPdf(plan, q.start ?? DEFAULT_SEND_AT);
  res.type('application/pdf').set('Content-Disposition', `attachment; filename="briefing-plan-${plan.id}.pdf"`).send(pdf);
});
