import { Router } from 'express';
import { z } from 'zod';
import { EMAIL_MAX, NAME_MAX, RESET_REQUEST_ANSWER } from '../../shared/api/accounts';
import { publicAccess, signedIn } from '../core/access';
import { audit, auditFor } from '../core/audit';
import { HttpError } from '../core/http-error';
import { parse } from '../core/validate';
import { endSessionsOf, SESSION_COOKIE } from '../core/session';
import { acceptInvitation, completeReset, linkInfo, requestReset } from './links';
import { hashPassword, PASSWORD_MAX, PASSWORD_MIN, verifyPassword } from './passwords';
import { linkPerIp, resetPerAccount, resetPerIp, signInPerAccount, signInPerIp } from './rate-limits';
import { findUserByEmail, findUserById, updateUser } from './store';
import { db } from '../db';

// Re-exported for code that imported the limiters from here before they moved.
export { signInPerAccount, signInPerIp } from './rate-limits';

const email = z.string().trim().toLowerCase().email('Enter an e-mail address.').max(EMAIL_MAX);
const newPassword = z
  .string()
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
  .max(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters.`);
const token = z.string().min(1, 'The link has no token.').max(200);

const signInBody = z.strictObject({
  email,
  password: z.string().min(1, 'Enter your password.').max(PASSWORD_MAX),
});
const changePasswordBody = z.strictObject({
  currentPassword: z.string().min(1, 'Enter your current password.').max(PASSWORD_MAX),
  newPassword,
});
const tokenBody = z.strictObject({ token });
const acceptBody = z.strictObject({
  token,
  name: z.string().trim().min(1, 'Enter your name.').max(NAME_MAX),
  password: newPassword,
});
const resetRequestBody = z.strictObject({ email });
const resetBody = z.strictObject({ token, password: newPassword });

const WRONG = 'That e-mail and password do not match an active account.';

export const authRouter = Router();

authRouter.post('/sign-in', publicAccess, signInPerIp, signInPerAccount, async (req, res) => {
  const body = parse(signInBody, req.body);
  const row = await findUserByEmail(body.email);
  const ok = await verifyPassword(body.password, row?.passwordHash);
  if (!row || !ok || row.status !== 'active') {
    if (row) await audit(req, { action: 'account.sign_in_failed', targetType: 'user', targetId: row.id });
    throw new HttpError(401, 'wrong_credentials', WRONG);
  }
  // A fresh session id at sign-in defeats session fixation.
  await new Promise<void>((resolve, reject) =>
    req.session.regenerate((err: unknown) =>
      err ? reject(err instanceof Error ? err : new Error('could not start a new session')) : resolve(),
    ),
  );
  req.session.userId = row.id;
  req.session.signedInAt = Date.now();
  await updateUser(db, row.id, { lastSignInAt: new Date() });
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
    throw new HttpError(400, 'wrong_password', 'Your current password is not right.', {
      fields: [{ field: 'currentPassword', message: 'This is not your current password.' }],
    });
  }
  await updateUser(db, row.id, { passwordHash: await hashPassword(body.newPassword) });
  // Other devices signed in with the old password are signed out; this one stays.
  const ended = await endSessionsOf(row.id, req.sessionID);
  await audit(req, { action: 'account.password_changed', targetType: 'user', targetId: row.id, detail: { otherSessionsEnded: ended } });
  res.status(204).end();
});

// Invitation links (the admin sends them; see server/admin).
authRouter.post('/invitation/check', publicAccess, linkPerIp, async (req, res) => {
  res.json(await linkInfo(parse(tokenBody, req.body).token, 'invite'));
});

authRouter.post('/invitation/accept', publicAccess, linkPerIp, async (req, res) => {
  const body = parse(acceptBody, req.body);
  res.json(await acceptInvitation(body.token, body.name, body.password, auditFor(req)));
});

// Password reset by e-mail.
authRouter.post('/password-reset', publicAccess, resetPerIp, resetPerAccount, async (req, res) => {
  const body = parse(resetRequestBody, req.body);
  await requestReset(body.email, auditFor(req));
  res.status(202).json({ message: RESET_REQUEST_ANSWER });
});

authRouter.post('/password-reset/check', publicAccess, linkPerIp, async (req, res) => {
  res.json(await linkInfo(parse(tokenBody, req.body).token, 'reset'));
});

authRouter.post('/password-reset/complete', publicAccess, linkPerIp, async (req, res) => {
  const body = parse(resetBody, req.body);
  res.json(await completeReset(body.token, body.password, auditFor(req)));
});
