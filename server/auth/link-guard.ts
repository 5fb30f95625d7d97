import type { NextFunction, Request, Response } from 'express';
import { ipKeyGenerator } from 'express-rate-limit';
import { config } from '../config';
import { HttpError } from '../core/http-error';
import { FailureCounter } from './failure-counter';

/**
 * The one link-guessing limit, for participant links, the projector join code, invitation and
 * password-reset links. Only links that do not work count against the address; a good link is
 * always served, even from an address past the limit (one office network shares an address).
 * Past the limit, links that do not work answer 429 for the rest of the window, so a script
 * cannot go on guessing (OWASP Authentication Cheat Sheet, "Protect against automated attacks").
 */
const WINDOW_MS = 15 * 60 * 1000;
const counter = new FailureCounter('link-guess', config.RATE_LIMIT_LINK_PER_15MIN, WINDOW_MS);

export const addressKey = (req: Request) => ipKeyGenerator(req.ip ?? '');

const tooManyGuesses = (retryAfter: number) =>
  new HttpError(
    429,
    'rate_limited',
    `Too many links that do not work were tried from this address. Wait ${Math.ceil(retryAfter / 60)} minutes and try again.`,
    { retryAfter },
  );

/**
 * Call when a link did not work: counts it against the address unless the address is already
 * past the limit, and says whether it is (with the seconds left).
 */
export async function countFailedLink(req: Request): Promise<{ blocked: boolean; retryAfter: number }> {
  const key = addressKey(req);
  const state = await counter.check(key);
  if (!state.blocked) await counter.fail(key);
  return state;
}

/** Call when a link did not work: the error to answer with (the link's own, or 429 past the limit). */
export async function refusedLink(req: Request, res: Response, invalid: HttpError): Promise<HttpError> {
  const state = await countFailedLink(req);
  if (!state.blocked) return invalid;
  res.set('Retry-After', String(state.retryAfter));
  return tooManyGuesses(state.retryAfter);
}

/**
 * For routes that check a link themselves (the token is in the body): an address past the limit
 * gets through only with a good link; answers with `failedStatus` count as failures.
 */
export function linkGuard(isGood: (req: Request) => Promise<boolean>, failedStatus: number) {
  return async (req: Request, res: Response, next: NextFunction) => {
    const key = addressKey(req);
    const state = await counter.check(key);
    if (state.blocked && !(await isGood(req))) {
      res.set('Retry-After', String(state.retryAfter));
      return next(tooManyGuesses(state.retryAfter));
    }
    res.on('finish', () => {
      if (res.statusCode === failedStatus) counter.fail(key).catch(() => undefined);
    });
    next();
  };
}
