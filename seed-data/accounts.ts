import { eq } from 'drizzle-orm';
import { users } from '../db/schema/accounts';
import { hashPassword } from '../server/auth/passwords';
import { config } from '../config/settings';
import { db } from '../db/connection';
import { firstOf } from '../shared/checked';

/** The demo facilitator the README names; invented person. */
export const DEMO_FACILITATOR = {
  email: 'facilitator@ripplehall.local',
  name: 'Noor Valensky',
  password: 'facilitate-demo-2026',
};

/** Creates an account if the e-mail is new; leaves an existing one alone (idempotent). */
export async function ensureAccount(email: string, name: string, role: 'admin' | 'facilitator', password: string) {
  const [existing] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  if (existing) return existing.id;
  const inserted = await db
    .insert(users)
    .values({ email, name, role, status: 'active', passwordHash: await hashPassword(password) })
    .$returningId();
  return firstOf(inserted, 'new account id').id;
}

export async function seedAccounts() {
  const adminId = await ensureAccount(config.ADMIN_EMAIL, 'Ripplehall admin', 'admin', config.ADMIN_PASSWORD);
  const facilitatorId = await ensureAccount(DEMO_FACILITATOR.email, DEMO_FACILITATOR.name, 'facilitator', DEMO_FACILITATOR.password);
  return { adminId, facilitatorId };
}
