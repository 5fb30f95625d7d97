import { Router } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import { eq } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { config } from '../config';
import { db } from '../db';
import { publicAccess, signedIn } from '../core/access';
import { audit } from '../core/audit';
import { HttpError, unauthorized } from '../core/http-error';
import { parse } from '../core/validate';
import { SESSION_COOKIE } from '../core/session';
import { hashPassword, PASSWORD_MAX, PASSWORD_MIN, verifyPassword } from './passwords';
import { findUserByEmail, findUserById } from './store';

const signInBody = z.strictObject({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.').max(254),
  password: z.string().min(1, 'Enter your password.').max(PASSWORD_MAX),
});

const changePasswordBody = z.strictObject({
  currentPassword: z.string().min(1, 'Enter your current password.').max(PASSWORD_MAX),
  newPassword: z.string().min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`).max(PASSWORD_MAX),
});

const tooMany = (message: string) => ({
  statusCode: 429,
  message: { error: { code: 'rate_limited', message } },
  standardHeaders: 'draft-8' as const,
  legacyHeaders: false,
});

/** Per IP: a cap on attempts from one address across all accounts. */
export const signInPerIp = rateLimit({
  windowMs: 15 * 60 * 1000,
  limit: config.RATE_LIMIT_IP_PER_15MIN,
  ...tooMany('Too many sign-in attempts from this address. Wait 15 minutes and try again.'),
});

/** Per account and IP: slows guessing one account's password. */
export const signInPerAccount = rateLimit({
  windowMs: 15 * 60 * 1000,
  limit: config.RATE_LIMIT_SIGNIN_PER_15MIN,
  keyGenerator: (req) =>
    `${String(req.body?.email ?? '')
      .trim()
      .toLowerCase()}|${ipKeyGenerator(req.ip ?? '')}`,
  ...tooMany('Too many sign-in attempts for this account. Wait 15 minutes and try again.'),
});

const WRONG = 'That e-mail and password do not match an active account.';

export const authRouter = Router();

authRouter.post('/sign-in', publicAccess, signInPerIp, signInPerAccount, async (req, res) => {
  const body = parse(signInBody, req.body);
  const row = await findUserByEmail(body.email);
  const ok = await verifyPassword(body.password, row?.passwordHash);
  if (!row || !ok || row.status !== 'active') throw new HttpError(401, 'wrong_credentials', WRONG);
  // A fresh session id at sign-in defeats session fixation.
  await new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
  req.session.userId = row.id;
  req.session.signedInAt = Date.now();
  await db.update(users).set({ lastSignInAt: new Date() }).where(eq(users.id, row.id));
  req.user = { id: row.id, email: row.email, name: row.name, role: row.role };
  await audit(req, { action: 'account.sign_in', targetType: 'user', targetId: row.id });
  res.json({ user: req.user });
});

authRouter.post('/sign-out', publicAccess, async (req, res) => {
  if (req.user) await audit(req, { action: 'account.sign_out', targetType: 'user', targetId: req.user.id });
  await new Promise<void>((resolve) => (req.session ? req.session.destroy(() => resolve()) : resolve()));
  res.clearCookie(SESSION_COOKIE, { path: '/' });
  res.status(204).end();
});

authRouter.get('/me', publicAccess, (req, res) => {
  res.json({ user: req.user ?? null });
});

authRouter.post('/password', signedIn(), async (req, res) => {
  const body = parse(changePasswordBody, req.body);
  const row = await findUserById(req.user!.id);
  if (!row || !(await verifyPassword(body.currentPassword, row.passwordHash))) {
    throw unauthorized('Your current password is not right.');
  }
  await db
    .update(users)
    .set({ passwordHash: await hashPassword(body.newPassword) })
    .where(eq(users.id, row.id));
  await audit(req, { action: 'account.password_changed', targetType: 'user', targetId: row.id });
  res.status(204).end();
});
