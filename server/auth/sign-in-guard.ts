import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, Response } from 'express';
import { config } from '../config';
import { HttpError } from '../core/http-error';
import { FailureCounter } from './failure-counter';
import { addressKey } from './link-guard';

/**
 * Slows password guessing without locking out the real owner (NIST SP 800-63B, section 5.2.2
 * "Rate Limiting (Throttling)": at most 100 consecutive failed attempts on one account, and
 * back-off between attempts as an alternative to locking; OWASP Authentication Cheat Sheet,
 * "Slow Down Online Guessing Attacks with Device Cookies").
 *  - Only failures count; a successful sign-in clears its counters.
 *  - Per subject, a progressive back-off: RATE_LIMIT_SIGNIN_PER_15MIN free failures, then one try
 *    a minute, then, past twice that, one try in five minutes.
 *  - The subject is the account, unless the browser holds a device cookie from an earlier
 *    successful sign-in to that account: then it is that device, so a stranger's failures never
 *    slow the owner's own browser.
 *  - Per account over all subjects: at most SIGNIN_ACCOUNT_MAX_FAILURES (100) failures in the
 *    window, then the account waits for the window to end.
 *  - Per address: at most RATE_LIMIT_IP_PER_15MIN failures, except for known devices.
 */
const WINDOW_MS = 15 * 60 * 1000;
const FREE = config.RATE_LIMIT_SIGNIN_PER_15MIN;
const free = new FailureCounter('sign-in-free', FREE, WINDOW_MS);
const slow = new FailureCounter('sign-in-slow', 1, 60 * 1000);
const slower = new FailureCounter('sign-in-slower', 1, 5 * 60 * 1000);
const account = new FailureCounter('sign-in-account', config.SIGNIN_ACCOUNT_MAX_FAILURES, WINDOW_MS);
const address = new FailureCounter('sign-in-address', config.RATE_LIMIT_IP_PER_15MIN, WINDOW_MS);

export const DEVICE_COOKIE = 'rh.device';
const DEVICE_DAYS = 180;

const deviceMac = (email: string, nonce: string) =>
  createHmac('sha256', config.SESSION_SECRET).update(`device|${email}|${nonce}`).digest('base64url');

/** The device id if the request carries a device cookie for this account. */
function knownDevice(req: Request, email: string): string | undefined {
  const raw: unknown = req.cookies?.[DEVICE_COOKIE];
  if (typeof raw !== 'string' || raw.length > 200) return undefined;
  const [nonce, mac] = raw.split('.');
  if (!nonce || !mac) return undefined;
  const expected = Buffer.from(deviceMac(email, nonce));
  const given = Buffer.from(mac);
  return expected.length === given.length && timingSafeEqual(expected, given) ? nonce : undefined;
}

export interface SignInAttempt {
  email: string;
  subject: string;
  address: string;
  device: boolean;
}

const wait = (res: Response, retryAfter: number, message: string) => {
  res.set('Retry-After', String(retryAfter));
  const when = retryAfter >= 120 ? `${Math.ceil(retryAfter / 60)} minutes` : `${retryAfter} seconds`;
  return new HttpError(429, 'rate_limited', `${message} Wait ${when} and try again.`, { retryAfter });
};

/** Throws 429 when this attempt must wait; else returns what to count afterwards. */
export async function beforeSignIn(req: Request, res: Response, email: string): Promise<SignInAttempt> {
  const device = knownDevice(req, email);
  const attempt = { email, subject: device ? `device:${device}` : `account:${email}`, address: addressKey(req), device: !!device };
  const capped = await account.check(email);
  if (capped.blocked) throw wait(res, capped.retryAfter, 'This account had too many failed sign-ins. Reset your password, or');
  if (!device) {
    const fromAddress = await address.check(attempt.address);
    if (fromAddress.blocked) throw wait(res, fromAddress.retryAfter, 'Too many failed sign-ins from this address.');
  }
  if ((await free.check(attempt.subject)).blocked) {
    const gate = (await free.hits(attempt.subject)) > 2 * FREE ? slower : slow;
    const state = await gate.check(attempt.subject);
    if (state.blocked) throw wait(res, state.retryAfter, 'Too many failed sign-ins for this account.');
  }
  return attempt;
}

export async function signInFailed(attempt: SignInAttempt): Promise<void> {
  await account.fail(attempt.email);
  if (!attempt.device) await address.fail(attempt.address);
  const n = await free.fail(attempt.subject);
  if (n > 2 * FREE) await slower.fail(attempt.subject);
  else if (n >= FREE) await slow.fail(attempt.subject);
}

/** Clears the counters and remembers this browser as a known device of the account. */
export async function signInSucceeded(attempt: SignInAttempt, res: Response, secure: boolean): Promise<void> {
  await Promise.all([
    account.clear(attempt.email),
    free.clear(attempt.subject),
    slow.clear(attempt.subject),
    slower.clear(attempt.subject),
  ]);
  const nonce = randomBytes(18).toString('base64url');
  res.cookie(DEVICE_COOKIE, `${nonce}.${deviceMac(attempt.email, nonce)}`, {
    httpOnly: true,
    sameSite: 'lax',
    secure,
    path: '/api/auth',
    maxAge: DEVICE_DAYS * 24 * 3600 * 1000,
  });
}
