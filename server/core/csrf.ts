import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { HttpError } from './http-error';

/**
 * Signed double-submit cookie (OWASP CSRF cheat sheet), in Angular's naming convention:
 * the server sets a readable XSRF-TOKEN cookie; Angular's HttpClient echoes it in the
 * X-XSRF-TOKEN header on every state-changing request. The token carries an HMAC so a
 * cookie planted by a sibling subdomain cannot be forged. Stateless, so it survives the
 * session id regeneration at sign-in.
 */
export const CSRF_COOKIE = 'XSRF-TOKEN';
export const CSRF_HEADER = 'x-xsrf-token';
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

export function csrfProtection(secret: string, secure: boolean) {
  const sign = (nonce: string) => createHmac('sha256', secret).update(nonce).digest('base64url');
  const valid = (token: unknown): token is string => {
    if (typeof token !== 'string') return false;
    const [nonce, mac] = token.split('.');
    if (!nonce || !mac) return false;
    const expected = Buffer.from(sign(nonce));
    const given = Buffer.from(mac);
    return expected.length === given.length && timingSafeEqual(expected, given);
  };
  return (req: Request, res: Response, next: NextFunction) => {
    const cookie: unknown = req.cookies?.[CSRF_COOKIE];
    if (!valid(cookie)) {
      const nonce = randomBytes(18).toString('base64url');
      res.cookie(CSRF_COOKIE, `${nonce}.${sign(nonce)}`, { sameSite: 'lax', secure, httpOnly: false, path: '/' });
    }
    if (SAFE.has(req.method)) return next();
    const header = req.get(CSRF_HEADER);
    if (!valid(cookie) || header !== cookie) {
      return next(new HttpError(403, 'csrf', 'This form has expired or came from another site. Reload the page and try again.'));
    }
    next();
  };
}
