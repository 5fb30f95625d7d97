import type { NextFunction, Request, Response } from 'express';
import { sessionAccount } from '../core/session';
import { findUserById } from './store';

/**
 * Loads the signed-in account on every request, so a deactivation or role change takes
 * effect at once, even for sessions that are still open elsewhere. The session store reads the
 * account in the same statement as the session row; a session that did not come from the store
 * in this request is looked up on its own.
 */
export async function currentUser(req: Request, _res: Response, next: NextFunction) {
  const userId = req.session?.userId;
  if (!userId) return next();
  const read = sessionAccount(req);
  const row = read !== undefined && (read === null || read.id === userId) ? read : await findUserById(userId);
  if (!row || row.status !== 'active') {
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    return next();
  }
  req.user = { id: row.id, email: row.email, name: row.name, role: row.role };
  next();
}
