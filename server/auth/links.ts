import { RESET_MINUTES, type LinkInfo } from '../../shared/api/accounts';
import { db } from '../db';
import type { AuditWriter } from '../core/audit';
import { HttpError } from '../core/http-error';
import { logger } from '../core/logging';
import { endSessionsOf } from '../core/session';
import { resetMail, appLink } from '../mail/templates';
import { sendMail } from '../mail/transport';
import { hashPassword } from './passwords';
import { findUserByEmail, findUserById, lockUserById, updateUser } from './store';
import { findUsableToken, issueToken, lockUsableToken, markUsed, revokeTokens, type TokenPurpose } from './tokens';

/** Accepting an invitation and resetting a password through the single-use e-mail links. */

const deadLink = (purpose: TokenPurpose) =>
  new HttpError(
    410,
    'link_invalid',
    purpose === 'invite'
      ? 'This invitation link no longer works: it was used already, replaced by a newer one, revoked, or it expired. Ask your admin to send a new invitation.'
      : 'This reset link no longer works: it was used already, replaced by a newer one, or it expired (links last one hour). Ask for a new link.',
  );

/** What a link's page shows before the form is sent; fails the same way for every dead link. */
export async function linkInfo(token: string, purpose: TokenPurpose): Promise<LinkInfo> {
  const row = await findUsableToken(token, purpose);
  const user = row && (await findUserById(row.userId));
  const wanted = purpose === 'invite' ? 'invited' : 'active';
  if (!row || !user || user.status !== wanted) throw deadLink(purpose);
  return { email: user.email, name: user.name, expiresAt: row.expiresAt.toISOString() };
}

export async function acceptInvitation(token: string, name: string, password: string, audit: AuditWriter): Promise<{ email: string }> {
  const passwordHash = await hashPassword(password); // slow: outside the transaction
  return db.transaction(async (tx) => {
    const row = await lockUsableToken(token, 'invite', tx);
    const user = row && (await lockUserById(row.userId, tx));
    if (!row || !user || user.status !== 'invited') throw deadLink('invite');
    await updateUser(user.id, { name, passwordHash, status: 'active' }, tx);
    await markUsed(row.id, tx);
    await audit({ action: 'account.invitation_accepted', targetType: 'user', targetId: user.id, actor: user }, tx);
    return { email: user.email };
  });
}

/**
 * Sends a reset link when an active account uses the address. The caller answers the same
 * way in every case, and the mail goes out after the answer, so neither the words nor the
 * timing tell whether the account exists.
 */
export async function requestReset(email: string, audit: AuditWriter): Promise<void> {
  const user = await findUserByEmail(email);
  if (!user || user.status !== 'active') {
    await audit({ action: 'account.reset_requested_unknown', detail: { status: user?.status ?? 'no_account' } });
    return;
  }
  const { token } = await issueToken(user.id, 'reset', RESET_MINUTES * 60 * 1000, null);
  await audit({ action: 'account.reset_requested', targetType: 'user', targetId: user.id });
  const mail = resetMail(user.email, appLink('/account/reset-password', { token }), RESET_MINUTES);
  sendMail(mail).catch((err) => logger.error({ err, userId: user.id }, 'could not send a password reset e-mail'));
}

export async function completeReset(token: string, password: string, audit: AuditWriter): Promise<{ email: string }> {
  const passwordHash = await hashPassword(password);
  const result = await db.transaction(async (tx) => {
    const row = await lockUsableToken(token, 'reset', tx);
    const user = row && (await lockUserById(row.userId, tx));
    if (!row || !user || user.status !== 'active') throw deadLink('reset');
    await updateUser(user.id, { passwordHash }, tx);
    await markUsed(row.id, tx);
    await revokeTokens(user.id, 'reset', tx);
    await audit({ action: 'account.password_reset', targetType: 'user', targetId: user.id, actor: user }, tx);
    return { id: user.id, email: user.email };
  });
  // A new password ends every open session of the account, wherever it is.
  await endSessionsOf(result.id);
  return { email: result.email };
}
