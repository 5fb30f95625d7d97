/** The audit log's rows (written by core/audit.ts, read by the admin's audit page). */
import { auditLog } from '../../db/schema/accounts';
import { db, type Conn } from '../db';

export type NewAuditRow = typeof auditLog.$inferInsert;

export async function insertAuditRow(values: NewAuditRow, tx: Conn = db): Promise<void> {
  await tx.insert(auditLog).values(values);
}
