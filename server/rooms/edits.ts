/**
 * The batch edit of the map (a drag of many people, a paste of many ties): every op is
 * checked against the room as it will be after the ops before it (edit-checks.ts), then all are written in
 * one transaction, or none. Content ops need the current version and bump it; a batch of
 * only `movePeople` ops is layout: no version needed, none bumped (layout does not change
 * the analysis, so it never makes a colleague's save stale).
 */
import type { RoomEditResult } from '../../shared/api/rooms';
import { transaction, type Tx } from '../db';
import { assertClientThere } from '../core/heavy-writes';
import { HttpError, notFound } from '../core/http-error';
import { failFields } from './content';
import { checkEdits, type Step } from './edit-checks';
import type { EditBatchInput } from './schemas';
import { staleVersion } from './service';
import * as store from './store';
import { itemAt } from '../../shared/checked';

export async function applyEdits(roomId: number, batch: EditBatchInput, clientGone?: AbortSignal): Promise<RoomEditResult> {
  const layoutOnly = batch.ops.every((op) => op.op === 'movePeople');
  if (!layoutOnly && batch.version === undefined) {
    failFields([{ field: 'version', message: 'Send the room version you started from (needed for any change other than moving people).' }]);
  }
  return transaction(async (tx) => {
    assertClientThere(clientGone);
    const room = await store.lockRoom(roomId, tx);
    if (!room) throw notFound('That room');
    if (!layoutOnly && room.version !== batch.version) throw staleVersion(room, batch.version!);
    const steps = await checkEdits(roomId, room.directed, batch.ops, tx);
    const created = await write(roomId, steps, tx);
    if (layoutOnly) await store.touchRoom(roomId, tx);
    else await store.bumpVersion(roomId, tx);
    assertClientThere(clientGone); // a batch whose client left is rolled back, not committed
    return { version: layoutOnly ? room.version : room.version + 1, layoutOnly, ...created };
  });
}

async function write(roomId: number, steps: Step[], tx: Tx): Promise<Pick<RoomEditResult, 'people' | 'ties'>> {
  const newPeople: Record<string, number> = {};
  const newTies: Record<string, number> = {};
  const idOf = (ref: number | string) => {
    if (typeof ref === 'number') return ref;
    const id = newPeople[ref];
    if (id === undefined) throw new HttpError(500, 'internal', `tempId ${ref} was not resolved`);
    return id;
  };
  let order = await store.maxOrder(roomId, tx);
  for (const step of steps) {
    switch (step.kind) {
      case 'addPeople': {
        const ids = await store.insertPeopleRows(roomId, step.rows, order + 1, tx);
        order += step.rows.length;
        step.tempIds.forEach((t, i) => (newPeople[t] = itemAt(ids, i, 'new person id')));
        break;
      }
      case 'updatePerson':
        await store.updatePeopleRows(roomId, idOf(step.ref), step.set, tx);
        break;
      case 'deletePeople':
        await store.deletePeopleRows(roomId, step.ids, tx);
        break;
      case 'addTies': {
        const ids = await store.insertTieRows(
          roomId,
          step.rows.map((r) => ({ sourceId: idOf(r.source), targetId: idOf(r.target), strength: r.strength })),
          tx,
        );
        step.tempIds.forEach((t, i) => t !== undefined && (newTies[t] = itemAt(ids, i, 'new tie id')));
        break;
      }
      case 'updateTie':
        await store.updateTieRow(roomId, step.id, step.strength, tx);
        break;
      case 'deleteTies':
        await store.deleteTieRows(roomId, step.ids, tx);
        break;
      case 'move':
        await store.movePeopleRows(
          roomId,
          step.moves.map((m) => ({ ...m, id: idOf(m.ref) })),
          tx,
        );
        break;
    }
  }
  return { people: newPeople, ties: newTies };
}
