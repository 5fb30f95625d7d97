import type { AuditRow } from '../../../shared/api/accounts';
import { STATUS_LABELS, type WorkshopStatus } from '../../../shared/api/workshops';

/** Readable words for each audit action code; an unknown code is shown as "Other: code". */
const ACTIONS: Record<string, string> = {
  'account.sign_in': 'Signed in',
  'account.sign_out': 'Signed out',
  'account.sign_in_failed': 'Sign-in refused (wrong password)',
  'account.password_changed': 'Changed own password',
  'account.invited': 'Invited',
  'account.invitation_resent': 'Sent a new invitation',
  'account.invitation_revoked': 'Revoked the invitation',
  'account.invitation_accepted': 'Accepted the invitation',
  'account.reset_requested': 'Asked for a reset link',
  'account.reset_requested_unknown': 'Reset asked for an address without an active account',
  'account.reset_sent_by_admin': 'Sent a reset link',
  'account.password_reset': 'Chose a new password by reset link',
  'account.deactivated': 'Deactivated',
  'account.reactivated': 'Reactivated',
  'account.role_changed': 'Changed the role',
  'room.create': 'Created a room',
  'room.delete': 'Deleted a room',
  'room.duplicate': 'Duplicated a room',
  'room.import': 'Imported into a room',
  'room.share': 'Shared a room',
  'room.share.revoke': 'Stopped sharing a room',
  'room.share.role': 'Changed a co-facilitator’s role on a room',
  'workshop.created': 'Created a workshop',
  'workshop.deleted': 'Deleted a workshop and its answers',
  'workshop.status': 'Moved a workshop',
  'workshop.links_emailed': 'E-mailed participant links',
  'workshop.links_printed': 'Printed participant links',
  'workshop.links_reissued': 'Reissued participant links',
  'workshop.links_revoked': 'Ended participant links',
  'workshop.room_built': 'Built the room from the survey',
  'workshop.debrief_released': 'Released the debrief',
};

const ROLE_LABELS: Record<string, string> = { admin: 'admin', facilitator: 'facilitator', editor: 'editor', viewer: 'viewer' };

export function auditAction(row: Pick<AuditRow, 'action'>): string {
  return ACTIONS[row.action] ?? `Other: ${row.action}`;
}

/** "Draft → Collecting answers", "facilitator → admin", or a count ("3 links"). */
export function auditChange(row: Pick<AuditRow, 'action' | 'detail'>): string {
  const d = row.detail ?? {};
  const word = (v: unknown) => STATUS_LABELS[v as WorkshopStatus] ?? ROLE_LABELS[String(v)] ?? String(v);
  if (d['from'] !== undefined && d['to'] !== undefined) return `${word(d['from'])} → ${word(d['to'])}`;
  for (const key of ['sent', 'links'] as const) {
    if (typeof d[key] === 'number') return `${d[key]} ${d[key] === 1 ? 'person' : 'people'}`;
  }
  return '';
}

/** The account an entry concerns; for a workshop or room, its title and the account it belongs to. */
export function auditConcerns(row: Pick<AuditRow, 'targetType' | 'targetId' | 'targetEmail' | 'targetLabel' | 'detail'>): string {
  const d = row.detail ?? {};
  if (row.targetType === 'workshop' || row.targetType === 'room') {
    const kind = row.targetType === 'workshop' ? 'Workshop' : 'Room';
    const title = row.targetLabel ?? (typeof d['title'] === 'string' ? d['title'] : null);
    const name = title ? `${kind} “${title}”` : `${kind} #${row.targetId ?? '?'} (deleted)`;
    return row.targetEmail ? `${name} · ${row.targetEmail}` : name;
  }
  return row.targetEmail ?? (typeof d['email'] === 'string' ? d['email'] : '');
}
