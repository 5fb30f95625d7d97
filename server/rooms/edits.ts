/**
 * The batch edit of the map (a drag of many people, a paste of many ties): every op is
 * checked against the room as it will be after the ops before it, then all are written in
 * one transaction, or none. Content ops need the current version and bump it; a batch of
 * only `movePeople` ops is layout: no version needed, none bumped (layout does not change
 * the analysis, so it never makes a colleague's save stale).
 */
import { ROOM_LIMITS, type RoomEditResult } from '../../shared/api/rooms';
import type { people as peopleTable } from '../../db/schema/rooms';
import { transaction, type Tx } from '../db';
import { assertClientThere } from '../core/heavy-writes';
import { HttpError, notFound } from '../core/http-error';
import type { FieldError } from '../core/validate';
import { failFields, keyMaker, pairKey } from './content';
import type { EditBatchInput, EditOpInput } from './schemas';
import { staleVersion } from './service';
import * as store from './store';
import { itemAt } from '../../shared/checked';

interface PersonState {
  key: string;
  name: string;
}

type PersonSet = Partial<typeof peopleTable.$inferInsert>;

/** A write to perform once every op has been checked. Ids of new people are resolved late. */
type Step =
  | { kind: 'addPeople'; tempIds: string[]; rows: store.PersonRowInput[] }
  | { kind: 'updatePerson'; ref: number | string; set: PersonSet }
  | { kind: 'deletePeople'; ids: number[] }
  | { kind: 'addTies'; tempIds: (string | undefined)[]; rows: { source: number | string; target: number | string; strength: number }[] }
  | { kind: 'updateTie'; id: number; strength: number }
  | { kind: 'deleteTies'; ids: number[] }
  | { kind: 'move'; moves: { ref: number | string; x: number; y: number; pinned?: boolean }[] };

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
    const steps = await plan(roomId, room.directed, batch.ops, tx);
    const created = await write(roomId, steps, tx);
    if (layoutOnly) await store.touchRoom(roomId, tx);
    else await store.bumpVersion(roomId, tx);
    assertClientThere(clientGone); // a batch whose client left is rolled back, not committed
    return { version: layoutOnly ? room.version : room.version + 1, layoutOnly, ...created };
  });
}

/** Checks every op in order against a model of the room; returns the writes or throws 400 naming each bad op. */
async function plan(roomId: number, directed: boolean, ops: EditOpInput[], tx: Tx): Promise<Step[]> {
  const folk = new Map<number | string, PersonState>();
  for (const p of await store.roomPeople(roomId, tx)) folk.set(p.id, { key: p.key, name: p.name });
  const tieIds = new Map<number, { s: number | string; t: number | string }>();
  const pairs = new Set<string>();
  const refNo = new Map<number | string, number>(); // person ref -> small number for pair keys
  const num = (r: number | string) => {
    if (!refNo.has(r)) refNo.set(r, refNo.size);
    return refNo.get(r)!;
  };
  for (const t of await store.roomTies(roomId, tx)) {
    tieIds.set(t.id, { s: t.sourceId, t: t.targetId });
    pairs.add(pairKey(num(t.sourceId), num(t.targetId), directed));
  }
  const keys = new Map<string, number | string>([...folk].map(([ref, p]) => [p.key, ref]));
  const nextKey = keyMaker(keys.keys());
  const errors: FieldError[] = [];
  const steps: Step[] = [];
  const err = (i: number, field: string | undefined, message: string): void => {
    errors.push({ field: `ops.${i}${field ? `.${field}` : ''}`, message });
  };
  const person = (i: number, field: string, ref: number | string) => {
    if (folk.has(ref)) return true;
    err(
      i,
      field,
      typeof ref === 'number'
        ? `Person ${ref} is not in this room (or was deleted earlier in this batch).`
        : `No person with tempId "${ref}" was added earlier in this batch.`,
    );
    return false;
  };
  const last = () => steps[steps.length - 1];

  ops.forEach((op, i) => {
    switch (op.op) {
      case 'addPerson': {
        if (folk.has(op.tempId)) return err(i, 'tempId', `The tempId "${op.tempId}" is used twice in this batch.`);
        const key = op.key ?? nextKey();
        if (keys.has(key)) return err(i, 'key', `The person id "${key}" is already used in this room.`);
        if (folk.size >= ROOM_LIMITS.maxPeople) return err(i, undefined, `A room can hold at most ${ROOM_LIMITS.maxPeople} people.`);
        folk.set(op.tempId, { key, name: op.name });
        keys.set(key, op.tempId);
        const row = {
          key,
          name: op.name,
          group: op.group ?? null,
          email: op.email ?? null,
          x: op.x ?? null,
          y: op.y ?? null,
          pinned: op.pinned ?? false,
        };
        const prev = last();
        if (prev?.kind === 'addPeople') {
          prev.tempIds.push(op.tempId);
          prev.rows.push(row);
        } else steps.push({ kind: 'addPeople', tempIds: [op.tempId], rows: [row] });
        return;
      }
      case 'updatePerson': {
        if (!person(i, 'id', op.id)) return;
        const state = folk.get(op.id)!;
        const set: PersonSet = {};
        if (op.key !== undefined && op.key !== state.key) {
          if (keys.has(op.key)) return err(i, 'key', `The person id "${op.key}" is already used in this room.`);
          keys.delete(state.key);
          keys.set(op.key, op.id);
          state.key = op.key;
          set.personKey = op.key;
        }
        if (op.name !== undefined) set.name = state.name = op.name;
        if (op.group !== undefined) set.groupName = op.group;
        if (op.email !== undefined) set.email = op.email;
        if (op.x !== undefined) set.x = op.x;
        if (op.y !== undefined) set.y = op.y;
        if (op.pinned !== undefined) set.pinned = op.pinned;
        if (Object.keys(set).length > 0) steps.push({ kind: 'updatePerson', ref: op.id, set });
        return;
      }
      case 'deletePerson': {
        if (!person(i, 'id', op.id)) return;
        keys.delete(folk.get(op.id)!.key);
        folk.delete(op.id);
        for (const [id, t] of tieIds) if (t.s === op.id || t.t === op.id) tieIds.delete(id);
        for (const k of [...pairs]) {
          const [a, b] = k.split(':').map(Number);
          if (a === num(op.id) || b === num(op.id)) pairs.delete(k);
        }
        const prev = last();
        if (prev?.kind === 'deletePeople') prev.ids.push(op.id);
        else steps.push({ kind: 'deletePeople', ids: [op.id] });
        return;
      }
      case 'addTie': {
        const okS = person(i, 'source', op.source);
        const okT = person(i, 'target', op.target);
        if (!okS || !okT) return;
        if (op.source === op.target) return err(i, 'target', `${folk.get(op.source)!.name} cannot be tied to themself.`);
        const pk = pairKey(num(op.source), num(op.target), directed);
        if (pairs.has(pk)) {
          return err(
            i,
            undefined,
            `${folk.get(op.source)!.name} and ${folk.get(op.target)!.name} are already tied${directed ? ' in this direction' : ''}; change that tie's strength instead.`,
          );
        }
        if (pairs.size >= ROOM_LIMITS.maxTies) return err(i, undefined, `A room can hold at most ${ROOM_LIMITS.maxTies} ties.`);
        pairs.add(pk);
        const prev = last();
        const row = { source: op.source, target: op.target, strength: op.strength };
        if (prev?.kind === 'addTies') {
          prev.tempIds.push(op.tempId);
          prev.rows.push(row);
        } else steps.push({ kind: 'addTies', tempIds: [op.tempId], rows: [row] });
        return;
      }
      case 'updateTie':
        if (!tieIds.has(op.id)) return err(i, 'id', `Tie ${op.id} is not in this room (or was deleted earlier in this batch).`);
        steps.push({ kind: 'updateTie', id: op.id, strength: op.strength });
        return;
      case 'deleteTie': {
        const t = tieIds.get(op.id);
        if (!t) return err(i, 'id', `Tie ${op.id} is not in this room (or was deleted earlier in this batch).`);
        tieIds.delete(op.id);
        pairs.delete(pairKey(num(t.s), num(t.t), directed));
        const prev = last();
        if (prev?.kind === 'deleteTies') prev.ids.push(op.id);
        else steps.push({ kind: 'deleteTies', ids: [op.id] });
        return;
      }
      case 'movePeople': {
        const moves: { ref: number | string; x: number; y: number; pinned?: boolean }[] = [];
        op.moves.forEach((m, j) => {
          if (!folk.has(m.id)) return err(i, `moves.${j}.id`, `Person ${m.id} is not in this room.`);
          moves.push({ ref: m.id, x: m.x, y: m.y, pinned: m.pinned });
        });
        steps.push({ kind: 'move', moves });
        return;
      }
    }
  });
  if (errors.length > 0) failFields(errors, 'edits (nothing was saved)');
  return steps;
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
