import { idOf } from '../core/ids';
import { forbidden, notFound } from '../core/http-error';
import type { SignedInUser } from '../types';
import { workshopForUser, type WorkshopRow } from './store';

/**
 * Workshops are visible to their owner and co-facilitators only; anyone else gets 404, so ids
 * cannot be probed. Participant links never reach these routes (they carry no session).
 */
export interface LoadedWorkshop {
  workshop: WorkshopRow;
  owner: boolean;
}

export function workshopIdOf(raw: unknown): number {
  return idOf(raw, 'That workshop');
}

export async function loadWorkshopFor(
  user: SignedInUser | undefined,
  rawId: unknown,
  need: 'run' | 'own' = 'run',
): Promise<LoadedWorkshop> {
  if (!user) throw notFound('That workshop');
  const found = await workshopForUser(user.id, workshopIdOf(rawId));
  if (!found) throw notFound('That workshop');
  if (need === 'own' && !found.owner) {
    throw forbidden('Only the owner of this workshop can do this.');
  }
  return found;
}
