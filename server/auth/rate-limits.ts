import type { Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { config } from '../config';

/**
 * Rate limits on sign-in and password reset, each per account+address and per address
 * (OWASP Authentication Cheat Sheet, "Protect against automated attacks"). In memory:
 * one server process; counters reset on restart.
 */
const WINDOW_MS = 15 * 60 * 1000;

const tooMany = (message: string) => ({
  windowMs: WINDOW_MS,
  statusCode: 429,
  message: { error: { code: 'rate_limited', message } },
  standardHeaders: 'draft-8' as const,
  legacyHeaders: false,
});

const emailOf = (req: Request): string => {
  const email = (req.body as { email?: unknown } | undefined)?.email;
  return typeof email === 'string' ? email : '';
};

const accountAndIp = (prefix: string) => (req: Request) => `${prefix}|${emailOf(req).trim().toLowerCase()}|${ipKeyGenerator(req.ip ?? '')}`;

/** Per IP: a cap on attempts from one address across all accounts. */
export const signInPerIp = rateLimit({
  limit: config.RATE_LIMIT_IP_PER_15MIN,
  ...tooMany('Too many sign-in attempts from this address. Wait 15 minutes and try again.'),
});

/** Per account and IP: slows guessing one account's password. Only failed attempts count. */
export const signInPerAccount = rateLimit({
  limit: config.RATE_LIMIT_SIGNIN_PER_15MIN,
  keyGenerator: accountAndIp('sign-in'),
  skipSuccessfulRequests: true,
  ...tooMany('Too many sign-in attempts for this account. Wait 15 minutes and try again.'),
});

export const resetPerIp = rateLimit({
  limit: config.RATE_LIMIT_IP_PER_15MIN,
  ...tooMany('Too many password-reset requests from this address. Wait 15 minutes and try again.'),
});

/** The same answer for known and unknown addresses, so the limit reveals nothing either. */
export const resetPerAccount = rateLimit({
  limit: config.RATE_LIMIT_RESET_PER_15MIN,
  keyGenerator: accountAndIp('reset'),
  ...tooMany('Too many password-reset requests for this address. Wait 15 minutes and try again.'),
});

/** Links carry 256-bit tokens, so guessing is hopeless; this only keeps scripted floods out. */
export const linkPerIp = rateLimit({
  limit: config.RATE_LIMIT_IP_PER_15MIN,
  ...tooMany('Too many attempts from this address. Wait 15 minutes and try again.'),
});
