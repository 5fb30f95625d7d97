import { eq } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { db, type Tx } from '../db';

type Conn = Tx | typeof db;
export type UserRow = typeof users.$inferSelect;

export async function findUserByEmail(email: string, conn: Conn = db): Promise<UserRow | undefined> {
  const [row] = await conn.select().from(users).where(eq(users.email, email.trim().toLowerCase()));
  return row;
}

export async function findUserById(id: number, conn: Conn = db, lock = false): Promise<UserRow | undefined> {
  const query = conn.select().from(users).where(eq(users.id, id));
  const [row] = lock ? await query.for('update') : await query;
  return row;
}

export async function updateUser(conn: Conn, id: number, values: Partial<Omit<UserRow, 'id' | 'createdAt' | 'updatedAt'>>): Promise<void> {
  await conn.update(users).set(values).where(eq(users.id, id));
}
