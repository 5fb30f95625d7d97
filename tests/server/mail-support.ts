import { and, desc, gt, like } from 'drizzle-orm';
import { mailMessages } from '../../db/schema/mail';
import { db } from '../../server/db';

/** Reads messages the local SMTP fake caught (they crossed a real SMTP conversation). */

export async function lastMailId(): Promise<number> {
  const [row] = await db.select({ id: mailMessages.id }).from(mailMessages).orderBy(desc(mailMessages.id)).limit(1);
  return row?.id ?? 0;
}

export type CaughtMail = typeof mailMessages.$inferSelect;

/** Waits for a message to `to` newer than `afterId` (mail may be sent after the HTTP answer). */
export async function waitForMail(to: string, afterId: number, timeoutMs = 5000): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const [row] = await db
      .select()
      .from(mailMessages)
      .where(and(gt(mailMessages.id, afterId), like(mailMessages.envelopeTo, `%${to}%`)))
      .orderBy(desc(mailMessages.id))
      .limit(1);
    if (row) return row;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no mail to ${to} arrived within ${timeoutMs} ms`);
}

export async function mailsTo(to: string, afterId: number): Promise<CaughtMail[]> {
  return db
    .select()
    .from(mailMessages)
    .where(and(gt(mailMessages.id, afterId), like(mailMessages.envelopeTo, `%${to}%`)));
}

/** The token of the first app link (…?token=…) in the plain-text part. */
export function tokenFrom(mail: CaughtMail, path: string): string {
  const token = new RegExp(`https?://\\S+${path.replace(/\//g, '\\/')}\\?token=([A-Za-z0-9_-]+)`).exec(mail.textBody ?? '')?.[1];
  if (!token) throw new Error(`no ${path} link in mail "${mail.subject}":\n${mail.textBody}`);
  return token;
}
