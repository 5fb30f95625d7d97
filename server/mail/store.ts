/** Messages kept by the local mail fake (the admin outbox and the tests read them). */
import { mailMessages } from '../../db/schema/mail';
import { db, type Conn } from '../db';

export type NewMailMessage = typeof mailMessages.$inferInsert;

export async function insertMailMessage(values: NewMailMessage, tx: Conn = db): Promise<void> {
  await tx.insert(mailMessages).values(values);
}
