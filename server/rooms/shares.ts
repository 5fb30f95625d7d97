/** Sharing a room with another facilitator as editor or viewer: list, add (with an e-mail), change role, revoke. */
import type { ErrorCode } from '../../shared/api/errors';
import type { ShareDto, ShareRole } from '../../shared/api/rooms';
import { HttpError, notFound } from '../core/http-error';
import { publicUrl } from '../config';
import { findUserByEmail } from '../auth/service';
import { sendMail } from '../mail/transport';
import { logger } from '../core/logging';
import type { RoomRow } from './access';
import { deleteShare, insertShare, shareRoleOf, shareRows, updateShareRole } from './shares-store';

export async function listShares(roomId: number): Promise<ShareDto[]> {
  const rows = await shareRows(roomId);
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}

async function shareOf(roomId: number, userId: number): Promise<ShareDto> {
  const found = (await listShares(roomId)).find((s) => s.userId === userId);
  if (!found) throw notFound('That share');
  return found;
}

const fieldError = (status: number, code: ErrorCode, message: string) =>
  new HttpError(status, code, message, { fields: [{ field: 'email', message }] });

export async function addShare(room: RoomRow, sharedBy: { id: number; name: string }, email: string, role: ShareRole): Promise<ShareDto> {
  const user = await findUserByEmail(email);
  if (!user || user.status !== 'active') {
    throw fieldError(
      400,
      'no_such_account',
      `No active facilitator account uses ${email}. Ask an admin to invite them first, then share again.`,
    );
  }
  if (user.id === room.ownerId) throw fieldError(400, 'own_room', 'That is the owner of this room; the owner can already do everything.');
  const existing = await shareRoleOf(room.id, user.id);
  if (existing) {
    throw fieldError(
      409,
      'already_shared',
      `The room is already shared with ${email} as ${existing}; change the role in the list instead.`,
    );
  }
  await insertShare(room.id, user.id, role);
  const notified = await notify(room, sharedBy.name, user.email, user.name, role);
  return { ...(await shareOf(room.id, user.id)), notified };
}

/** Tells the person; a mail failure is logged and reported, the share stands. */
async function notify(room: RoomRow, byName: string, to: string, toName: string, role: ShareRole): Promise<boolean> {
  const link = `${publicUrl()}/rooms/${room.id}`;
  const can = role === 'editor' ? 'view and change' : 'view (not change)';
  const text =
    `Hello ${toName},\n\n${byName} shared the room "${room.name}" with you in Ripplehall. You can ${can} it:\n${link}\n\n` +
    'The room holds who-talks-to-whom data about people: treat it as personal data and use it only for planning the briefing.\n';
  const esc = (s: string) => s.replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!);
  const html =
    `<p>Hello ${esc(toName)},</p><p>${esc(byName)} shared the room <strong>${esc(room.name)}</strong> with you in Ripplehall. ` +
    `You can ${can} it: <a href="${esc(link)}">${esc(link)}</a></p>` +
    '<p>The room holds who-talks-to-whom data about people: treat it as personal data and use it only for planning the briefing.</p>';
  try {
    await sendMail({ to, subject: `${byName} shared the room "${room.name}" with you`, text, html });
    return true;
  } catch (err) {
    logger.warn({ err, roomId: room.id }, 'share notification could not be sent');
    return false;
  }
}

export async function changeShare(roomId: number, userId: number, role: ShareRole): Promise<ShareDto> {
  await shareOf(roomId, userId);
  await updateShareRole(roomId, userId, role);
  return shareOf(roomId, userId);
}

export async function revokeShare(roomId: number, userId: number): Promise<void> {
  if (!(await deleteShare(roomId, userId))) throw notFound('That share');
}
