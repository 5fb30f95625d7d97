import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { HttpError } from './http-error';

/**
 * Signed double-submit cookie bound to the session (OWASP CSRF Prevention Cheat Sheet,
 * "Signed Double-Submit Cookie"), in Angular's naming convention: the server sets a readable
 * XSRF-TOKEN cookie; Angular's HttpClient echoes it in the X-XSRF-TOKEN header on every
 * state-changing request. The token is `nonce.HMAC(secret, binding | nonce)`, where the binding
 * is the session id of a signed-in session (and a fixed anonymous binding before sign-in), so
 * a token minted for one session is refused with any other. Sign-in and sign-out rotate it.
 */
export const CSRF_COOKIE = 'XSRF-TOKEN';
export const CSRF_HEADER = 'x-xsrf-token';
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);
const ANONYMOUS = 'anonymous';
const VERIFIED_MAX = 20_000;

/** What the token of this request must be bound to. */
function bindingOf(req: Request): string {
  return req.session?.userId ? `session:${req.sessionID}` : ANONYMOUS;
}

export interface Csrf {
  middleware: (req: Request, res: Response, next: NextFunction) => void;
  /** Sets a fresh token for the request's current session (call after sign-in and sign-out). */
  rotate: (req: Request, res: Response) => void;
}

export function createCsrf(secret: string, secure: boolean): Csrf {
  const sign = (binding: string, nonce: string) => createHmac('sha256', secret).update(`${binding}|${nonce}`).digest('base64url');
  // Tokens already checked for their binding: a browser sends the same cookie with every
  // request, and the HMAC is a fixed result of (secret, binding, nonce), so it is worked out
  // once per pair. Only tokens that passed are kept, never more than VERIFIED_MAX of them.
  const verified = new Set<string>();
  const valid = (token: unknown, binding: string): token is string => {
    if (typeof token !== 'string' || token.length > 200) return false;
    const key = `${binding}\n${token}`;
    if (verified.has(key)) return true;
    const [nonce, mac, extra] = token.split('.');
    if (!nonce || !mac || extra !== undefined) return false;
    const expected = Buffer.from(sign(binding, nonce));
    const given = Buffer.from(mac);
    if (expected.length !== given.length || !timingSafeEqual(expected, given)) return false;
    if (verified.size >= VERIFIED_MAX) verified.clear();
    verified.add(key);
    return true;
  };
  const rotate = (req: Request, res: Response) => {
    const nonce = randomBytes(18).toString('base64url');
    res.cookie(CSRF_COOKIE, `${nonce}.${sign(bindingOf(req), nonce)}`, { sameSite: 'lax', secure, httpOnly: false, path: '/' });
  };
  const middleware = (req: Request, res: Response, next: NextFunction) => {
    const binding = bindingOf(req);
    const cookie: unknown = req.cookies?.[CSRF_COOKIE];
    const good = valid(cookie, binding);
    if (!good) rotate(req, res);
    if (SAFE.has(req.method)) return next();
    if (!good || req.get(CSRF_HEADER) !== cookie) {
      return next(new HttpError(403, 'csrf', 'This form has expired or came from another site. Reload the page and try again.'));
    }
    next();
  };
  return { middleware, rotate };
}

let current: Csrf | undefined;

/** The app's CSRF guard (one per process; the secret and cookie flags come from the config). */
export function csrfProtection(secret: string, secure: boolean) {
  current = createCsrf(secret, secure);
  return current.middleware;
}

/** Rotates the token after the session changed (sign-in, sign-out). */
export function rotateCsrf(req: Request, res: Response): void {
  current?.rotate(req, res);
}

/**
 * For a page that comes with its first data written in (a participant's page), so it may write
 * before it has asked the API anything: a browser without a token gets one (bound as the API
 * would bind it: no session yet). A token the browser already holds is left as it is.
 */
export function csrfCookieForPage(req: Request, res: Response): void {
  if (req.cookies?.[CSRF_COOKIE] === undefined) current?.rotate(req, res);
}
