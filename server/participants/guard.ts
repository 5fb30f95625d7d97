import type { NextFunction, Request, Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import { LINK_INVALID_MESSAGE } from '../../shared/api/workshops';
import { config } from '../config';
import { createLimiterStore } from '../auth/limiter-store';
import { HttpError } from '../core/http-error';
import { findJoinWorkshop, findLinkHolder, type LinkHolder } from './links';

/** One answer for a made-up, expired or revoked link, so the three cannot be told apart. */
export const linkInvalid = () => new HttpError(404, 'link_invalid', LINK_INVALID_MESSAGE);

/**
 * Only answers that say "this link does not work" count against the address; a participant
 * using a good link is never slowed. Past the limit every link request from that address is
 * refused for the window (OWASP Authentication Cheat Sheet, "Protect against automated attacks").
 */
export const linkGuessLimit = rateLimit({
  store: createLimiterStore('link-guess'),
  passOnStoreError: true,
  windowMs: 15 * 60 * 1000,
  limit: config.RATE_LIMIT_LINK_PER_15MIN,
  skipSuccessfulRequests: true,
  requestWasSuccessful: (_req, res) => res.statusCode !== 404,
  statusCode: 429,
  message: {
    error: {
      code: 'rate_limited',
      message: 'Too many links that do not work were tried from this address. Wait 15 minutes and try again.',
    },
  },
  standardHeaders: 'draft-8',
  legacyHeaders: false,
});

export function holderOf(res: Response): LinkHolder {
  return res.locals['linkHolder'] as LinkHolder;
}

/** Resolves :token to its participant, or answers link_invalid. */
export async function requireLink(req: Request, res: Response, next: NextFunction): Promise<void> {
  const holder = await findLinkHolder(String(req.params['token'] ?? ''));
  if (!holder) return next(linkInvalid());
  res.locals['linkHolder'] = holder;
  res.set('Cache-Control', 'no-store');
  next();
}

/** Resolves :code (the projector QR code) to its workshop, or answers link_invalid. */
export async function requireJoinCode(req: Request, res: Response, next: NextFunction): Promise<void> {
  const workshopId = await findJoinWorkshop(String(req.params['code'] ?? ''));
  if (!workshopId) return next(linkInvalid());
  res.locals['joinWorkshopId'] = workshopId;
  res.set('Cache-Control', 'no-store');
  next();
}
