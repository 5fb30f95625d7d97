import { Router } from 'express';
import { publicAccess } from './core/access';
import { notFound } from './core/http-error';
import { authRouter } from './auth/routes';
import { roomsRouter } from './rooms/routes';
import { plansRouter, roomPlansRouter } from './plans/routes';
import { planRehearsalsRouter, rehearsalsRouter, roomRehearsalsRouter } from './rehearsals/routes';
import { jobsRouter } from './jobs/routes';
import { adminRouter } from './admin/routes';
import { workshopsRouter } from './workshops/routes';
import { participantRouter } from './participants/routes';

/** Every feature router is mounted here; each route starts with an access policy. */
export function apiRouter(): Router {
  const api = Router();
  api.get('/health', publicAccess, (_req, res) => res.json({ ok: true }));
  api.use('/auth', authRouter);
  api.use('/rooms', roomPlansRouter, roomRehearsalsRouter);
  api.use('/rooms', roomsRouter);
  api.use('/plans', plansRouter, planRehearsalsRouter);
  api.use('/rehearsals', rehearsalsRouter);
  api.use('/jobs', jobsRouter);
  api.use('/admin', adminRouter);
  api.use('/workshops', workshopsRouter);
  api.use('/p', participantRouter);
  api.use((_req, _res, next) => next(notFound('That API route')));
  return api;
}
