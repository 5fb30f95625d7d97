import type { JobDto } from '../../shared/api/plans';
import type { JobRow } from './store';

export const iso = (d: Date | null | undefined): string | null => (d ? d.toISOString() : null);

export function jobDto(row: JobRow, queuePosition: number | null = null): JobDto {
  return {
    id: row.id,
    kind: row.kind,
    status: row.status,
    progress: row.progress,
    queuePosition: row.status === 'queued' ? queuePosition : null,
    message: row.message,
    planId: row.planId,
    rehearsalId: row.rehearsalId,
    createdAt: row.createdAt.toISOString(),
    startedAt: iso(row.startedAt),
    finishedAt: iso(row.finishedAt),
  };
}
