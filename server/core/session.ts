import session from 'express-session';
import type { NextFunction, Request, Response } from 'express';
import { config } from '../config';
import { pool } from '../db';
import { forgetCachedAccount } from './session-cache';
import { SessionStore } from './session-store';

export { sessionAccount, type SessionAccount } from './session-store';

export const SESSION_COOKIE = 'rh.sid';

export function sessionMiddleware(secure: boolean) {
  const store = new SessionStore({ tableName: 'sessions', columnNames: { session_id: 'session_id', expires: 'expires', data: 'data' } });
  setInterval(() => void store.clearExpiredSessions().catch(() => undefined), 15 * 60 * 1000).unref();
  throttleTouch(store);
  return session({
    name: SESSION_COOKIE,
    secret: config.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true, // each request pushes the idle deadline forward
    proxy: config.TRUST_PROXY,
    cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: config.SESSION_IDLE_MINUTES * 60 * 1000 },
  });
}

/**
 * With `rolling`, express-session writes the new expiry of an unchanged session on every
 * request (store.touch: one UPDATE per request). The idle deadline moves in minutes, so write it
 * at most once a minute (or a tenth of the idle time, if shorter) per session and process; the cookie still rolls on every answer. Changed
 * sessions are saved as always.
 */
const TOUCH_EVERY_MS = Math.min(60 * 1000, (config.SESSION_IDLE_MINUTES * 60 * 1000) / 10);
function throttleTouch(store: session.Store): void {
  const lastTouch = new Map<string, number>();
  const touch = store.touch?.bind(store);
  if (!touch) return;
  store.touch = (sid: string, sess: session.SessionData, cb?: (err?: unknown) => void) => {
    const now = Date.now();
    if (now - (lastTouch.get(sid) ?? 0) < TOUCH_EVERY_MS) return cb?.();
    lastTouch.set(sid, now);
    if (lastTouch.size > 50_000) lastTouch.clear();
    touch(sid, sess, cb);
  };
}

/** Ends sessions older than the absolute lifetime, whatever their activity. */
export function absoluteLifetime(req: Request, _res: Response, next: NextFunction): void {
  const started = req.session?.signedInAt;
  if (started && Date.now() - started > config.SESSION_MAX_HOURS * 3600 * 1000) {
    req.session.destroy(() => next());
    return;
  }
  next();
}

/** Removes every stored session of one account (deactivation, password reset), but `keep` if given. */
export async function endSessionsOf(userId: number, keep?: string): Promise<number> {
  forgetCachedAccount(userId);
  const [result] = await pool.query("DELETE FROM sessions WHERE JSON_VALUE(data, '$.userId') = ? AND session_id <> ?", [
    String(userId),
    keep ?? '',
  ]);
  // Again once the rows are gone: a read in flight during the delete is not kept either.
  forgetCachedAccount(userId);
  return (result as { affectedRows?: number }).affectedRows ?? 0;
}
