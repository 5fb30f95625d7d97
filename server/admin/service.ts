import {
  INVITE_HOURS,
  RESET_MINUTES,
  type AccountRole,
  type AccountRow,
  type AccountSortKey,
  type InvitationState,
} from '../../shared/api/accounts';
import type { ListParams, Page } from '../../shared/api/lists';
import type { SignedInUser } from '../types';
import { db, type Tx } from '../db';
import type { AuditWriter } from '../core/audit';
import { conflict, HttpError, notFound } from '../core/http-error';
import { logger } from '../core/logging';
import { endSessionsOf } from '../core/session';
import { forgetCachedAccount } from '../core/session-cache';
import {
  findUserByEmail,
  findUserById,
  issueToken,
  latestInvites,
  lockUserById,
  revokeTokens,
  updateUser,
  type TokenRow,
  type UserRow,
} from '../auth/service';
import { appLink, invitationMail, resetMail } from '../mail/templates';
import { sendMail, type OutgoingMail } from '../mail/transport';
import { activeAdminIds, insertInvitedUser, listAccounts, lockActiveAdmins } from './store';

/** Account administration: invitations, status, roles. The last active admin always stays. */

const INVITE_MS = INVITE_HOURS * 3600 * 1000;

function invitationState(user: UserRow, token: TokenRow | undefined): InvitationState {
  if (!token) return 'none';
  if (token.usedAt) return 'accepted';
  if (user.status !== 'invited') return 'none';
  if (token.revokedAt) return 'revoked';
  return token.expiresAt.getTime() <= Date.now() ? 'expired' : 'pending';
}

export async function accountPage(q: ListParams<AccountSortKey>): Promise<Page<AccountRow>> {
  const { rows, total } = await listAccounts(q);
  const [invites, admins] = await Promise.all([latestInvites(rows.map((r) => r.id)), activeAdminIds()]);
  const items = rows.map((u): AccountRow => {
    const token = invites.get(u.id);
    const state = invitationState(u, token);
    return {
      id: u.id,
      email: u.email,
      name: u.name,
      role: u.role,
      status: u.status,
      invitation: state,
      invitationExpiresAt: state === 'pending' || state === 'expired' ? token!.expiresAt.toISOString() : null,
      lastSignInAt: u.lastSignInAt?.toISOString() ?? null,
      createdAt: u.createdAt.toISOString(),
      lastAdmin: admins.length === 1 && admins[0] === u.id,
    };
  });
  return { items, total, page: q.page, pageSize: q.pageSize };
}

async function deliver(mail: OutgoingMail, what: string): Promise<void> {
  try {
    await sendMail(mail);
  } catch (err) {
    logger.error({ err }, `could not send ${what}`);
    throw new HttpError(
      502,
      'mail_failed',
      `The ${what} is saved, but the e-mail could not be sent (${(err as Error).message}). Check the mail settings, then use "Resend".`,
    );
  }
}

async function mustFind(id: number): Promise<UserRow> {
  const user = await findUserById(id);
  if (!user) throw notFound('That account');
  return user;
}

async function mustLock(id: number, tx: Tx): Promise<UserRow> {
  const user = await lockUserById(id, tx);
  if (!user) throw notFound('That account');
  return user;
}

export async function invite(
  actor: SignedInUser,
  email: string,
  name: string,
  role: AccountRole,
  audit: AuditWriter,
): Promise<{ id: number }> {
  const existing = await findUserByEmail(email);
  if (existing) {
    throw conflict(
      existing.status === 'invited'
        ? `${email} is invited already. Use "Resend invitation" in the accounts table to send a fresh link.`
        : `An account with the e-mail ${email} exists already.`,
      { fields: [{ field: 'email', message: 'This address has an account already.' }] },
    );
  }
  const { id, token } = await db.transaction(async (tx) => {
    const id = await insertInvitedUser(email, name, role, tx);
    const { token } = await issueToken(id, 'invite', INVITE_MS, actor.id, tx);
    await audit({ action: 'account.invited', targetType: 'user', targetId: id, detail: { email, role } }, tx);
    return { id, token };
  });
  await deliver(invitationMail(email, actor.name || actor.email, appLink('/account/accept', { token }), INVITE_HOURS), 'invitation');
  return { id };
}

export async function resendInvitation(actor: SignedInUser, id: number, audit: AuditWriter): Promise<void> {
  const { user, token } = await db.transaction(async (tx) => {
    const user = await mustLock(id, tx);
    if (user.status !== 'invited') throw conflict(`${user.email} has accepted the invitation already; there is nothing to resend.`);
    const { token } = await issueToken(id, 'invite', INVITE_MS, actor.id, tx);
    await audit({ action: 'account.invitation_resent', targetType: 'user', targetId: id }, tx);
    return { user, token };
  });
  await deliver(invitationMail(user.email, actor.name || actor.email, appLink('/account/accept', { token }), INVITE_HOURS), 'invitation');
}

export async function revokeInvitation(id: number, audit: AuditWriter): Promise<void> {
  await db.transaction(async (tx) => {
    const user = await mustLock(id, tx);
    if (user.status !== 'invited') throw conflict(`${user.email} has accepted the invitation already; deactivate the account instead.`);
    const revoked = await revokeTokens(id, 'invite', tx);
    if (!revoked) throw conflict(`${user.email} has no open invitation link to revoke.`);
    await audit({ action: 'account.invitation_revoked', targetType: 'user', targetId: id }, tx);
  });
}

const LAST_ADMIN = 'This is the last active admin account. Make another account an admin first, so someone can still manage accounts.';

export async function setStatus(actor: SignedInUser, id: number, status: 'active' | 'deactivated', audit: AuditWriter): Promise<void> {
  await db.transaction(async (tx) => {
    const admins = await lockActiveAdmins(tx);
    const user = await mustLock(id, tx);
    if (user.status === 'invited') throw conflict(`${user.email} has not accepted the invitation yet; revoke the invitation instead.`);
    if (user.status === status) return;
    if (status === 'deactivated' && admins.includes(id) && admins.length <= 1) throw conflict(LAST_ADMIN);
    if (status === 'deactivated' && id === actor.id) throw conflict('You cannot deactivate your own account. Ask another admin to do it.');
    await updateUser(id, { status }, tx);
    if (status === 'deactivated') await revokeTokens(id, 'reset', tx);
    await audit({ action: status === 'active' ? 'account.reactivated' : 'account.deactivated', targetType: 'user', targetId: id }, tx);
  });
  // The change is visible once committed: forget this process's session copies again (a read
  // between the write and the commit kept the old status).
  forgetCachedAccount(id);
  // Ends that account's sessions at once; its next request is answered 401.
  if (status === 'deactivated') await endSessionsOf(id);
}

export async function changeRole(id: number, role: AccountRole, audit: AuditWriter): Promise<void> {
  await db.transaction(async (tx) => {
    const admins = await lockActiveAdmins(tx);
    const user = await mustLock(id, tx);
    if (user.role === role) return;
    if (role !== 'admin' && admins.includes(id) && admins.length <= 1) throw conflict(LAST_ADMIN);
    await updateUser(id, { role }, tx);
    await audit({ action: 'account.role_changed', targetType: 'user', targetId: id, detail: { from: user.role, to: role } }, tx);
  });
  // As in setStatus: the open sessions of the account get the new role on their next request.
  forgetCachedAccount(id);
}

/** An admin sends a reset link to an active account ("resets access"). */
export async function sendResetLink(id: number, audit: AuditWriter): Promise<void> {
  const user = await mustFind(id);
  if (user.status !== 'active') throw conflict(`${user.email} is not active; a reset link would not work.`);
  const { token } = await issueToken(id, 'reset', RESET_MINUTES * 60 * 1000, null);
  await audit({ action: 'account.reset_sent_by_admin', targetType: 'user', targetId: id });
  await deliver(resetMail(user.email, appLink('/account/reset-password', { token }), RESET_MINUTES), 'reset link');
}
