import type { Request } from 'express';
import { db, type Conn } from '../db';
import { insertAuditRow } from './audit-store';

export interface AuditEntry {
  action: string;
  targetType?: string;
  targetId?: string | number;
  detail?: Record<string, unknown>;
  /** Who acted, when not the signed-in account (accepting an invitation, using a reset link). */
  actor?: { id: number; email: string };
}

/** Records who did what, when and from where. Never pass secrets in detail. */
export async function audit(req: Request, entry: AuditEntry, tx: Conn = db): Promise<void> {
  const actor = entry.actor ?? req.user;
  await insertAuditRow(
    {
      actorId: actor?.id ?? null,
      actorEmail: actor?.email ?? null,
      action: entry.action,
      targetType: entry.targetType ?? null,
      targetId: entry.targetId === undefined ? null : String(entry.targetId),
      detail: entry.detail ?? null,
      ip: req.ip ?? null,
    },
    tx,
  );
}

/** An audit writer bound to one request, for domain services that must not see HTTP. */
export type AuditWriter = (entry: AuditEntry, tx?: Conn) => Promise<void>;
export const auditFor =
  (req: Request): AuditWriter =>
  (entry, tx) =>
    audit(req, entry, tx);
