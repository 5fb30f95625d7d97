import type { Request } from 'express';
import { auditLog } from '../../db/schema/accounts';
import { db, type Tx } from '../db';

export interface AuditEntry {
  action: string;
  targetType?: string;
  targetId?: string | number;
  detail?: Record<string, unknown>;
}

/** Records who did what, when and from where. Never pass secrets in detail. */
export async function audit(req: Request, entry: AuditEntry, tx: Tx | typeof db = db): Promise<void> {
  await tx.insert(auditLog).values({
    actorId: req.user?.id ?? null,
    actorEmail: req.user?.email ?? null,
    action: entry.action,
    targetType: entry.targetType ?? null,
    targetId: entry.targetId === undefined ? null : String(entry.targetId),
    detail: entry.detail ?? null,
    ip: req.ip ?? null,
  });
}
