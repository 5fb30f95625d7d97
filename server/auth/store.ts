import { eq } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { forgetCachedAccount } from '../core/session-cache';
import { db, type Conn, type Tx } from '../db';

export type UserRow = typeof users.$inferSelect;

export async function findUserByEmail(email: string, tx: Conn = db): Promise<UserRow | undefined> {
  const [row] = await tx.select().from(users).where(eq(users.email, email.trim().toLowerCase()));
  return row;
}

export async function findUserById(id: number, tx: Conn = db): Promise<UserRow | undefined> {
  const [row] = await tx.select().from(users).where(eq(users.id, id));
  return row;
}

/** The account row, locked for the rest of the transaction. */
export async function lockUserById(id: number, tx: Tx): Promise<UserRow | undefined> {
  const [row] = await tx.select().from(users).where(eq(users.id, id)).for('update');
  return row;
}

/**
 * Writes account fields. The session copies of this process (`SessionCache`) are forgotten
 * before and after, so a role or status change counts on the account's next request here.
 * Inside a transaction the change is visible once it commits: a read between the write and the
 * commit may keep the old row, for at most SESSION_CACHE_MS (as in any other process).
 */
export async function updateUser(
  id: number,
  values: Partial<Omit<UserRow, 'id' | 'createdAt' | 'updatedAt'>>,
  tx: Conn = db,
): Promise<void> {
  forgetCachedAccount(id);
  await tx.update(users).set(values).where(eq(users.id, id));
  forgetCachedAccount(id);
}
