import { itemAt } from '../../shared/checked';
import type { RoomSnapshot } from './compute';

/** One person of a room snapshot, by engine index. */
export interface SnapshotPerson {
  personId: number;
  key: string;
  name: string;
  group: string | null;
}

/**
 * The person at engine index `i`. Indices come from the engine's results for this very snapshot,
 * so one outside the room is a programming error: it throws a RangeError saying so.
 */
export function personAt(snapshot: RoomSnapshot, i: number): SnapshotPerson {
  return {
    personId: itemAt(snapshot.personIds, i, 'snapshot person id'),
    key: itemAt(snapshot.graph.ids, i, 'snapshot person key'),
    name: itemAt(snapshot.names, i, 'snapshot person name'),
    group: snapshot.graph.groups?.[i] ?? null,
  };
}
