import { Router } from 'express';
import { publicAccess } from './core/access';
import { notFound } from './core/http-error';
import { authRouter } from './auth/routes';
import { roomsRouter } from './rooms/routes';

/** Every feature router is mounted here; each route starts with an access policy. */
export function apiRouter(): Router {
  const api = Router();
  api.get('/health', publicAccess, (_req, res) => res.json({ ok: true }));
  api.use('/auth', authRouter);
  api.use('/rooms', roomsRouter);
  api.use((_req, _res, next) => next(notFound('That API route')));
  return api;
}
