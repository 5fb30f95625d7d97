import { Router } from 'express';
import { z } from 'zod';
import { EMAIL_MAX, NAME_MAX, RESET_REQUEST_ANSWER } from '../../shared/api/accounts';
import { publicAccess, signedIn } from '../core/access';
import { audit, auditFor } from '../core/audit';
import { rotateCsrf } from '../core/csrf';
import { HttpError } from '../core/http-error';
import { parse } from '../core/validate';
import { endSessionsOf, SESSION_COOKIE } from '../core/session';
import { acceptInvitation, completeReset, linkInfo, requestReset } from './links';
import { hashPassword, PASSWORD_MAX, PASSWORD_MIN, verifyPassword } from './passwords';
import { linkLimit, resetPerAccount, resetPerIp } from './rate-limits';
import { beforeSignIn, signInFailed, signInSucceeded } from './sign-in-guard';
import { findUserByEmail, findUserById, updateUser } from './store';
import { config } from '../config';
import { logger } from '../core/logging';

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
const secureCookies = (config.PUBLIC_URL ?? '').startsWith('https://');

/**
 * With PUBLIC_URL on https the session cookie is marked Secure, and a browser that reached us
 * over plain http drops it: say so instead of signing in to nothing.
 */
function signInAnswer(user: Express.Request['user'], overTls: boolean) {
  if (!secureCookies || overTls) return { user };
  return {
    user,
    warning:
      'Signed in, but your browser reached the server over plain http while PUBLIC_URL starts with https://: ' +
      'the session cookie is marked Secure and the browser will not keep it. Open the https address, or put a TLS proxy in front (TRUST_PROXY=true).',
  };
}

export const authRouter = Router();

authRouter.post('/sign-in', publicAccess, async (req, res) => {
  const body = parse(signInBody, req.body);
  const attempt = await beforeSignIn(req, res, body.email);
  const row = await findUserByEmail(body.email);
  const hashStarted = performance.now();
  const ok = await verifyPassword(body.password, row?.passwordHash);
  const hashMs = performance.now() - hashStarted;
  if (!row || !ok || row.status !== 'active') {
    await signInFailed(attempt);
    if (row) await audit(req, { action: 'account.sign_in_failed', targetType: 'user', targetId: row.id });
    throw new HttpError(401, 'wrong_credentials', WRONG);
  }
  await signInSucceeded(attempt, res, secureCookies);
  // A fresh session id at sign-in defeats session fixation.
  await new Promise<void>((resolve, reject) =>
    req.session.regenerate((err: unknown) =>
      err ? reject(err instanceof Error ? err : new Error('could not start a new session')) : resolve(),
    ),
  );
  req.session.userId = row.id;
  req.session.signedInAt = Date.now();
  await updateUser(row.id, { lastSignInAt: new Date() });
  req.user = { id: row.id, email: row.email, name: row.name, role: row.role };
  rotateCsrf(req, res); // bound to the new session id
  await audit(req, { action: 'account.sign_in', targetType: 'user', targetId: row.id });
  // How long the deliberate password hash took, so a client-side timing can tell it from the rest.
  res.set('Server-Timing', `hash;dur=${hashMs.toFixed(1)};desc="password hash"`);
  res.json(signInAnswer(req.user, req.secure));
});

authRouter.post('/sign-out', publicAccess, async (req, res) => {
  if (req.user) await audit(req, { action: 'account.sign_out', targetType: 'user', targetId: req.user.id });
  await new Promise<void>((resolve) => (req.session ? req.session.destroy(() => resolve()) : resolve()));
  res.clearCookie(SESSION_COOKIE, { path: '/' });
  rotateCsrf(req, res);
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
  await updateUser(row.id, { passwordHash: await hashPassword(body.newPassword) });
  // Other devices signed in with the old password are signed out; this one stays.
  const ended = await endSessionsOf(row.id, req.sessionID);
  await audit(req, { action: 'account.password_changed', targetType: 'user', targetId: row.id, detail: { otherSessionsEnded: ended } });
  res.status(204).end();
});

// Invitation links (the admin sends them; see server/admin).
authRouter.post('/invitation/check', publicAccess, linkLimit('invite'), async (req, res) => {
  res.json(await linkInfo(parse(tokenBody, req.body).token, 'invite'));
});

authRouter.post('/invitation/accept', publicAccess, linkLimit('invite'), async (req, res) => {
  const body = parse(acceptBody, req.body);
  res.json(await acceptInvitation(body.token, body.name, body.password, auditFor(req)));
});

// Password reset by e-mail.
authRouter.post('/password-reset', publicAccess, resetPerIp, resetPerAccount, (req, res) => {
  const body = parse(resetRequestBody, req.body);
  // Answer first, then do the work: the answer and its timing are the same whether or not
  // an account uses the address (the lookup, token and mail happen after the reply).
  res.status(202).json({ message: RESET_REQUEST_ANSWER });
  requestReset(body.email, auditFor(req)).catch((err) => logger.error({ err }, 'a password-reset request failed'));
});

authRouter.post('/password-reset/check', publicAccess, linkLimit('reset'), async (req, res) => {
  res.json(await linkInfo(parse(tokenBody, req.body).token, 'reset'));
});

authRouter.post('/password-reset/complete', publicAccess, linkLimit('reset'), async (req, res) => {
  const body = parse(resetBody, req.body);
  res.json(await completeReset(body.token, body.password, auditFor(req)));
});
