import { index, int, json, mysqlEnum, mysqlTable, text, timestamp, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { createdAt, idColumn, refColumn, updatedAt } from './columns';
import { ACCOUNT_ROLES, ACCOUNT_STATUSES } from '../../shared/api/accounts';

export const users = mysqlTable(
  'users',
  {
    id: idColumn(),
    email: varchar('email', { length: 254 }).notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    role: mysqlEnum('role', ACCOUNT_ROLES).notNull().default('facilitator'),
    status: mysqlEnum('status', ACCOUNT_STATUSES).notNull().default('invited'),
    passwordHash: varchar('password_hash', { length: 255 }),
    lastSignInAt: timestamp('last_sign_in_at', { fsp: 3 }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('users_email_uq').on(t.email)],
);

/** Single-use links sent by e-mail: invitations and password resets. Only a hash is stored. */
export const accountTokens = mysqlTable(
  'account_tokens',
  {
    id: idColumn(),
    userId: refColumn('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: mysqlEnum('purpose', ['invite', 'reset']).notNull(),
    tokenHash: varchar('token_hash', { length: 64 }).notNull(),
    expiresAt: timestamp('expires_at', { fsp: 3 }).notNull(),
    usedAt: timestamp('used_at', { fsp: 3 }),
    revokedAt: timestamp('revoked_at', { fsp: 3 }),
    createdBy: refColumn('created_by'),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('account_tokens_hash_uq').on(t.tokenHash), index('account_tokens_user_idx').on(t.userId)],
);

export const auditLog = mysqlTable(
  'audit_log',
  {
    id: idColumn(),
    actorId: refColumn('actor_id'),
    actorEmail: varchar('actor_email', { length: 254 }),
    action: varchar('action', { length: 64 }).notNull(),
    targetType: varchar('target_type', { length: 32 }),
    targetId: varchar('target_id', { length: 64 }),
    detail: json('detail'),
    ip: varchar('ip', { length: 64 }),
    createdAt: createdAt(),
  },
  (t) => [index('audit_log_created_idx').on(t.createdAt)],
);

/** express-mysql-session's table, defined here so migrations own it (createDatabaseTable: false). */
export const sessions = mysqlTable('sessions', {
  sessionId: varchar('session_id', { length: 128 }).primaryKey(),
  expires: int('expires', { unsigned: true }).notNull(),
  data: text('data'),
});
