import { eq } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { db } from '../db';

export async function findUserByEmail(email: string) {
  const [row] = await db.select().from(users).where(eq(users.email, email.trim().toLowerCase()));
  return row;
}

export async function findUserById(id: number) {
  const [row] = await db.select().from(users).where(eq(users.id, id));
  return row;
}
