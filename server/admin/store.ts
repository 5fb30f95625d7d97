import { and, asc, count, desc, eq, like, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { auditLog, users } from '../../db/schema/accounts';
import { mailMessages } from '../../db/schema/mail';
import { rooms } from '../../db/schema/rooms';
import { workshops } from '../../db/schema/workshops';
import type { AccountRole, AccountSortKey } from '../../shared/api/accounts';
import type { ListParams } from '../../shared/api/lists';
import { db, type Tx } from '../db';
import { firstOf } from '../../shared/checked';

/** Data access for the admin console: accounts, audit log and the captured outbox. */

export type PageQuery = Pick<ListParams, 'page' | 'pageSize' | 'q'>;

const sortColumns = {
  name: users.name,
  email: users.email,
  role: users.role,
  status: users.status,
  lastSignInAt: users.lastSignInAt,
  createdAt: users.createdAt,
} satisfies Record<AccountSortKey, unknown>;

/** LIKE with the user's text taken literally (no wildcards of their own). */
const contains = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

export async function listAccounts(q: ListParams<AccountSortKey>) {
  const where: SQL | undefined = q.q ? or(like(users.name, contains(q.q)), like(users.email, contains(q.q))) : undefined;
  const order = q.direction === 'asc' ? asc(sortColumns[q.sort]) : desc(sortColumns[q.sort]);
  const rows = await db
    .select()
    .from(users)
    .where(where)
    .orderBy(order, asc(users.id))
    .limit(q.pageSize)
    .offset(q.page * q.pageSize);
  const { total } = firstOf(await db.select({ total: count() }).from(users).where(where), 'account count');
  return { rows, total };
}

/** Active admins, locked for the rest of the transaction so two demotions cannot race past the rule. */
export async function lockActiveAdmins(tx: Tx): Promise<number[]> {
  const rows = await tx
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.role, 'admin'), eq(users.status, 'active')))
    .for('update');
  return rows.map((r) => r.id);
}

export async function activeAdminIds(): Promise<number[]> {
  const rows = await db
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.role, 'admin'), eq(users.status, 'active')));
  return rows.map((r) => r.id);
}

export async function insertInvitedUser(email: string, name: string, role: AccountRole, tx: Tx): Promise<number> {
  const { id } = firstOf(await tx.insert(users).values({ email, name, role, status: 'invited' }).$returningId(), 'new account id');
  return id;
}

const target = alias(users, 'target');
const owner = alias(users, 'owner');

/**
 * The audit log, newest first. What an entry concerns is named for a reader: the account for
 * account actions; for workshop and room actions the workshop's title or room's name and the
 * account it belongs to (a deleted one falls back to the title kept in the entry's detail).
 */
export async function listAudit(q: PageQuery) {
  const joined = sql`${target.id} = CAST(${auditLog.targetId} AS UNSIGNED)`;
  const ownerId = sql`coalesce(${workshops.ownerId}, ${rooms.ownerId})`;
  const where = q.q
    ? or(
        like(auditLog.action, contains(q.q)),
        like(auditLog.actorEmail, contains(q.q)),
        like(target.email, contains(q.q)),
        like(owner.email, contains(q.q)),
        like(workshops.title, contains(q.q)),
        like(rooms.name, contains(q.q)),
      )
    : undefined;
  const base = () =>
    db
      .select({
        id: auditLog.id,
        createdAt: auditLog.createdAt,
        actorEmail: auditLog.actorEmail,
        action: auditLog.action,
        targetType: auditLog.targetType,
        targetId: auditLog.targetId,
        targetEmail: sql<string | null>`coalesce(${target.email}, ${owner.email})`,
        targetLabel: sql<string | null>`coalesce(${workshops.title}, ${rooms.name})`,
        detail: auditLog.detail,
        ip: auditLog.ip,
      })
      .from(auditLog)
      .leftJoin(target, and(eq(auditLog.targetType, 'user'), joined))
      .leftJoin(workshops, and(eq(auditLog.targetType, 'workshop'), sql`${workshops.id} = CAST(${auditLog.targetId} AS UNSIGNED)`))
      .leftJoin(rooms, and(eq(auditLog.targetType, 'room'), sql`${rooms.id} = CAST(${auditLog.targetId} AS UNSIGNED)`))
      .leftJoin(owner, sql`${owner.id} = ${ownerId}`)
      .where(where);
  const rows = await base()
    .orderBy(desc(auditLog.id))
    .limit(q.pageSize)
    .offset(q.page * q.pageSize);
  const { total } = firstOf(await db.select({ total: count() }).from(base().as('matching')), 'audit entry count');
  return { rows, total };
}

export async function listOutbox(q: PageQuery) {
  const rows = await db
    .select({ id: mailMessages.id, to: mailMessages.envelopeTo, subject: mailMessages.subject, createdAt: mailMessages.createdAt })
    .from(mailMessages)
    .orderBy(desc(mailMessages.id))
    .limit(q.pageSize)
    .offset(q.page * q.pageSize);
  const { total } = firstOf(await db.select({ total: count() }).from(mailMessages), 'outbox count');
  return { rows, total };
}

export async function findOutboxMessage(id: number) {
  const [row] = await db.select().from(mailMessages).where(eq(mailMessages.id, id));
  return row;
}
