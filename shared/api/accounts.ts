/** Account and admin API shapes, shared by the client and the server (no Node or DOM imports). */

/** Also the database's enums (db/schema/accounts.ts). */
export const ACCOUNT_ROLES = ['admin', 'facilitator'] as const;
export type AccountRole = (typeof ACCOUNT_ROLES)[number];
export const ACCOUNT_STATUSES = ['invited', 'active', 'deactivated'] as const;
export type AccountStatus = (typeof ACCOUNT_STATUSES)[number];
/** Where an invited account's latest invitation stands. */
export type InvitationState = 'pending' | 'expired' | 'revoked' | 'accepted' | 'none';

/** Password rule shown in the UI too: length over composition (NIST SP 800-63B, 2017). */
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 200;
export const NAME_MAX = 120;
export const EMAIL_MAX = 254;

/** Invitation links live 72 hours, reset links 1 hour. */
export const INVITE_HOURS = 72;
export const RESET_MINUTES = 60;

export interface AccountRow {
  id: number;
  email: string;
  name: string;
  role: AccountRole;
  status: AccountStatus;
  invitation: InvitationState;
  invitationExpiresAt: string | null;
  lastSignInAt: string | null;
  createdAt: string;
  /** The only active admin: the server refuses to take the role away, so the screen does not offer it. */
  lastAdmin: boolean;
}

export const accountSortKeys = ['name', 'email', 'role', 'status', 'lastSignInAt', 'createdAt'] as const;
export type AccountSortKey = (typeof accountSortKeys)[number];

export interface AuditRow {
  id: number;
  createdAt: string;
  actorEmail: string | null;
  action: string;
  targetType: string | null;
  targetId: string | null;
  /** The account concerned: the target account, or the owner of the workshop or room. */
  targetEmail: string | null;
  /** The workshop's title or the room's name, for workshop and room actions. */
  targetLabel: string | null;
  detail: Record<string, unknown> | null;
  ip: string | null;
}

export interface OutboxRow {
  id: number;
  to: string;
  subject: string | null;
  createdAt: string;
}

export interface OutboxMessage extends OutboxRow {
  from: string | null;
  text: string | null;
  hasHtml: boolean;
}

export interface AdminSettings {
  /** True while the local SMTP fake catches mail: the outbox page is shown only then. */
  mailFake: boolean;
}

/** What the accept-invitation and reset pages learn from a link before the form is filled. */
export interface LinkInfo {
  email: string;
  name: string;
  expiresAt: string;
}

/** The one answer to a reset request, whether or not the account exists. */
export const RESET_REQUEST_ANSWER =
  'If an active account uses that address, we have sent it a link to choose a new password. The link works once, for one hour.';
