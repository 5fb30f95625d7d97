import type { ErrorEnvelope } from '../../shared/api/errors';
import type { Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { config } from '../config';
import { linkGuard } from './link-guard';
import { createLimiterStore } from './limiter-store';
import { findUsableToken, type TokenPurpose } from './tokens';

/**
 * Rate limits on password-reset requests, per account+address and per address (OWASP
 * Authentication Cheat Sheet, "Protect against automated attacks"), and the link-guessing limit
 * on invitation and reset links. Sign-in has its own back-off (./sign-in-guard.ts). Every counter
 * store comes from createLimiterStore, so all of them move together to a shared store.
 */
const WINDOW_MS = 15 * 60 * 1000;

const tooMany = (prefix: string, message: string) => ({
  windowMs: WINDOW_MS,
  statusCode: 429,
  message: { error: { code: 'rate_limited', message } } satisfies ErrorEnvelope,
  standardHeaders: 'draft-8' as const,
  legacyHeaders: false,
  store: createLimiterStore(prefix),
});

const emailOf = (req: Request): string => {
  const email = (req.body as { email?: unknown } | undefined)?.email;
  return typeof email === 'string' ? email : '';
};

const accountAndIp = (prefix: string) => (req: Request) => `${prefix}|${emailOf(req).trim().toLowerCase()}|${ipKeyGenerator(req.ip ?? '')}`;

export const resetPerIp = rateLimit({
  limit: config.RATE_LIMIT_IP_PER_15MIN,
  ...tooMany('reset-address', 'Too many password-reset requests from this address. Wait 15 minutes and try again.'),
});

/** The same answer for known and unknown addresses, so the limit reveals nothing either. */
export const resetPerAccount = rateLimit({
  limit: config.RATE_LIMIT_RESET_PER_15MIN,
  keyGenerator: accountAndIp('reset'),
  ...tooMany('reset-account', 'Too many password-reset requests for this address. Wait 15 minutes and try again.'),
});

/** Invitation and reset links: dead links (410) count; a good link is never refused. */
export const linkLimit = (purpose: TokenPurpose) =>
  linkGuard(async (req) => {
    const token: unknown = (req.body as { token?: unknown } | undefined)?.token;
    return typeof token === 'string' && !!(await findUsableToken(token, purpose));
  }, 410);
