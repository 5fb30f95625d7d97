import type { Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { config } from '../config';
import { createLimiterStore } from './limiter-store';

/**
 * Rate limits on sign-in and password reset, each per account+address and per address
 * (OWASP Authentication Cheat Sheet, "Protect against automated attacks"). Counters live in
 * Redis (limiter-store.ts), so the limits hold across web processes and restarts.
 */
const WINDOW_MS = 15 * 60 * 1000;

const tooMany = (message: string) => ({
  windowMs: WINDOW_MS,
  passOnStoreError: true,
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
  store: createLimiterStore('sign-in-ip'),
  limit: config.RATE_LIMIT_IP_PER_15MIN,
  ...tooMany('Too many sign-in attempts from this address. Wait 15 minutes and try again.'),
});

/** Per account and IP: slows guessing one account's password. Only failed attempts count. */
export const signInPerAccount = rateLimit({
  store: createLimiterStore('sign-in-account'),
  limit: config.RATE_LIMIT_SIGNIN_PER_15MIN,
  keyGenerator: accountAndIp('sign-in'),
  skipSuccessfulRequests: true,
  ...tooMany('Too many sign-in attempts for this account. Wait 15 minutes and try again.'),
});

export const resetPerIp = rateLimit({
  store: createLimiterStore('reset-ip'),
  limit: config.RATE_LIMIT_IP_PER_15MIN,
  ...tooMany('Too many password-reset requests from this address. Wait 15 minutes and try again.'),
});

/** The same answer for known and unknown addresses, so the limit reveals nothing either. */
export const resetPerAccount = rateLimit({
  store: createLimiterStore('reset-account'),
  limit: config.RATE_LIMIT_RESET_PER_15MIN,
  keyGenerator: accountAndIp('reset'),
  ...tooMany('Too many password-reset requests for this address. Wait 15 minutes and try again.'),
});

/** Links carry 256-bit tokens, so guessing is hopeless; this only keeps scripted floods out. */
export const linkPerIp = rateLimit({
  store: createLimiterStore('link-ip'),
  limit: config.RATE_LIMIT_IP_PER_15MIN,
  ...tooMany('Too many attempts from this address. Wait 15 minutes and try again.'),
});
