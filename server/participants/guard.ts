import type { NextFunction, Request, Response } from 'express';
import { LINK_INVALID_MESSAGE } from '../../shared/api/workshops';
import { refusedLink } from '../auth/link-guard';
import { HttpError } from '../core/http-error';
import { findJoinWorkshop, findLinkHolder, type LinkHolder } from './links';

/** One answer for a made-up, expired or revoked link, so the three cannot be told apart. */
export const linkInvalid = () => new HttpError(404, 'link_invalid', LINK_INVALID_MESSAGE);

export function holderOf(res: Response): LinkHolder {
  return res.locals['linkHolder'] as LinkHolder;
}

/** Resolves :token to its participant, or answers link_invalid. */
export async function requireLink(req: Request, res: Response, next: NextFunction): Promise<void> {
  const holder = await findLinkHolder(String(req.params['token'] ?? ''));
  // Only links that do not work count against the address; a good link is never refused.
  if (!holder) return next(await refusedLink(req, res, linkInvalid()));
  res.locals['linkHolder'] = holder;
  res.set('Cache-Control', 'no-store');
  next();
}

/** Resolves :code (the projector QR code) to its workshop, or answers link_invalid. */
export async function requireJoinCode(req: Request, res: Response, next: NextFunction): Promise<void> {
  const workshopId = await findJoinWorkshop(String(req.params['code'] ?? ''));
  if (!workshopId) return next(await refusedLink(req, res, linkInvalid()));
  res.locals['joinWorkshopId'] = workshopId;
  res.set('Cache-Control', 'no-store');
  next();
}
