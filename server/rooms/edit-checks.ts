/**
 * The checks of a batch edit (rooms/edits.ts): every op is checked, in order, against a model of
 * the room as it will be after the ops before it; what passes becomes a write step, what fails
 * an error naming the op. One checker per kind of op.
 */
import { ROOM_LIMITS } from '../../shared/api/rooms';
import type { people as peopleTable } from '../../db/schema/rooms';
import type { Tx } from '../db';
import type { FieldError } from '../../shared/api/errors';
import { failFields, keyMaker, pairKey, type PersonRowInput } from './content';
import type { EditOpInput } from './schemas';
import * as store from './store';

type PersonSet = Partial<typeof peopleTable.$inferInsert>;
type Ref = number | string;
type Op<K extends EditOpInput['op']> = Extract<EditOpInput, { op: K }>;

/** A write to perform once every op has been checked. Ids of new people are resolved late. */
export type Step =
  | { kind: 'addPeople'; tempIds: string[]; rows: PersonRowInput[] }
  | { kind: 'updatePerson'; ref: Ref; set: PersonSet }
  | { kind: 'deletePeople'; ids: number[] }
  | { kind: 'addTies'; tempIds: (string | undefined)[]; rows: { source: Ref; target: Ref; strength: number }[] }
  | { kind: 'updateTie'; id: number; strength: number }
  | { kind: 'deleteTies'; ids: number[] }
  | { kind: 'move'; moves: { ref: Ref; x: number; y: number; pinned?: boolean }[] };

/** The room as the ops so far have left it, and the steps and errors they produced. */
class RoomModel {
  readonly people = new Map<Ref, { key: string; name: string }>();
  readonly keys = new Map<string, Ref>();
  readonly tieIds = new Map<number, { s: Ref; t: Ref }>();
  readonly pairs = new Set<string>();
  readonly steps: Step[] = [];
  readonly errors: FieldError[] = [];
  private readonly refNo = new Map<Ref, number>(); // person ref -> small number for pair keys
  nextKey: () => string = () => '';

  constructor(readonly directed: boolean) {}

  num(r: Ref): number {
    if (!this.refNo.has(r)) this.refNo.set(r, this.refNo.size);
    return this.refNo.get(r)!;
  }

  pair(a: Ref, b: Ref): string {
    return pairKey(this.num(a), this.num(b), this.directed);
  }

  err(i: number, field: string | undefined, message: string): void {
    this.errors.push({ field: `ops.${i}${field ? `.${field}` : ''}`, message });
  }

  /** True when the person is in the room; otherwise notes the error. */
  person(i: number, field: string, ref: Ref): boolean {
    if (this.people.has(ref)) return true;
    this.err(
      i,
      field,
      typeof ref === 'number'
        ? `Person ${ref} is not in this room (or was deleted earlier in this batch).`
        : `No person with tempId "${ref}" was added earlier in this batch.`,
    );
    return false;
  }

  last(): Step | undefined {
    return this.steps[this.steps.length - 1];
  }
}

async function loadModel(roomId: number, directed: boolean, tx: Tx): Promise<RoomModel> {
  const m = new RoomModel(directed);
  for (const p of await store.roomPeople(roomId, tx)) m.people.set(p.id, { key: p.key, name: p.name });
  for (const t of await store.roomTies(roomId, tx)) {
    m.tieIds.set(t.id, { s: t.sourceId, t: t.targetId });
    m.pairs.add(m.pair(t.sourceId, t.targetId));
  }
  for (const [ref, p] of m.people) m.keys.set(p.key, ref);
  m.nextKey = keyMaker(m.keys.keys());
  return m;
}

function checkAddPerson(m: RoomModel, op: Op<'addPerson'>, i: number): void {
  if (m.people.has(op.tempId)) return m.err(i, 'tempId', `The tempId "${op.tempId}" is used twice in this batch.`);
  const key = op.key ?? m.nextKey();
  if (m.keys.has(key)) return m.err(i, 'key', `The person id "${key}" is already used in this room.`);
  if (m.people.size >= ROOM_LIMITS.maxPeople) return m.err(i, undefined, `A room can hold at most ${ROOM_LIMITS.maxPeople} people.`);
  m.people.set(op.tempId, { key, name: op.name });
  m.keys.set(key, op.tempId);
  const row = {
    key,
    name: op.name,
    group: op.group ?? null,
    email: op.email ?? null,
    x: op.x ?? null,
    y: op.y ?? null,
    pinned: op.pinned ?? false,
  };
  const prev = m.last();
  if (prev?.kind === 'addPeople') {
    prev.tempIds.push(op.tempId);
    prev.rows.push(row);
  } else m.steps.push({ kind: 'addPeople', tempIds: [op.tempId], rows: [row] });
}

function checkUpdatePerson(m: RoomModel, op: Op<'updatePerson'>, i: number): void {
  if (!m.person(i, 'id', op.id)) return;
  const state = m.people.get(op.id)!;
  const set: PersonSet = {};
  if (op.key !== undefined && op.key !== state.key) {
    if (m.keys.has(op.key)) return m.err(i, 'key', `The person id "${op.key}" is already used in this room.`);
    m.keys.delete(state.key);
    m.keys.set(op.key, op.id);
    state.key = op.key;
    set.personKey = op.key;
  }
  if (op.name !== undefined) set.name = state.name = op.name;
  if (op.group !== undefined) set.groupName = op.group;
  if (op.email !== undefined) set.email = op.email;
  if (op.x !== undefined) set.x = op.x;
  if (op.y !== undefined) set.y = op.y;
  if (op.pinned !== undefined) set.pinned = op.pinned;
  if (Object.keys(set).length > 0) m.steps.push({ kind: 'updatePerson', ref: op.id, set });
}

function checkDeletePerson(m: RoomModel, op: Op<'deletePerson'>, i: number): void {
  if (!m.person(i, 'id', op.id)) return;
  m.keys.delete(m.people.get(op.id)!.key);
  m.people.delete(op.id);
  for (const [id, t] of m.tieIds) if (t.s === op.id || t.t === op.id) m.tieIds.delete(id);
  for (const k of [...m.pairs]) {
    const [a, b] = k.split(':').map(Number);
    if (a === m.num(op.id) || b === m.num(op.id)) m.pairs.delete(k);
  }
  const prev = m.last();
  if (prev?.kind === 'deletePeople') prev.ids.push(op.id);
  else m.steps.push({ kind: 'deletePeople', ids: [op.id] });
}

function checkAddTie(m: RoomModel, op: Op<'addTie'>, i: number): void {
  const okS = m.person(i, 'source', op.source);
  const okT = m.person(i, 'target', op.target);
  if (!okS || !okT) return;
  const source = m.people.get(op.source)!.name;
  if (op.source === op.target) return m.err(i, 'target', `${source} cannot be tied to themself.`);
  const pk = m.pair(op.source, op.target);
  if (m.pairs.has(pk)) {
    const target = m.people.get(op.target)!.name;
    const how = m.directed ? ' in this direction' : '';
    return m.err(i, undefined, `${source} and ${target} are already tied${how}; change that tie's strength instead.`);
  }
  if (m.pairs.size >= ROOM_LIMITS.maxTies) return m.err(i, undefined, `A room can hold at most ${ROOM_LIMITS.maxTies} ties.`);
  m.pairs.add(pk);
  const prev = m.last();
  const row = { source: op.source, target: op.target, strength: op.strength };
  if (prev?.kind === 'addTies') {
    prev.tempIds.push(op.tempId);
    prev.rows.push(row);
  } else m.steps.push({ kind: 'addTies', tempIds: [op.tempId], rows: [row] });
}

function checkUpdateTie(m: RoomModel, op: Op<'updateTie'>, i: number): void {
  if (!m.tieIds.has(op.id)) return m.err(i, 'id', `Tie ${op.id} is not in this room (or was deleted earlier in this batch).`);
  m.steps.push({ kind: 'updateTie', id: op.id, strength: op.strength });
}

function checkDeleteTie(m: RoomModel, op: Op<'deleteTie'>, i: number): void {
  const t = m.tieIds.get(op.id);
  if (!t) return m.err(i, 'id', `Tie ${op.id} is not in this room (or was deleted earlier in this batch).`);
  m.tieIds.delete(op.id);
  m.pairs.delete(m.pair(t.s, t.t));
  const prev = m.last();
  if (prev?.kind === 'deleteTies') prev.ids.push(op.id);
  else m.steps.push({ kind: 'deleteTies', ids: [op.id] });
}

function checkMovePeople(m: RoomModel, op: Op<'movePeople'>, i: number): void {
  const moves: { ref: Ref; x: number; y: number; pinned?: boolean }[] = [];
  op.moves.forEach((move, j) => {
    if (!m.people.has(move.id)) return m.err(i, `moves.${j}.id`, `Person ${move.id} is not in this room.`);
    moves.push({ ref: move.id, x: move.x, y: move.y, pinned: move.pinned });
  });
  m.steps.push({ kind: 'move', moves });
}

const CHECKERS: { [K in EditOpInput['op']]: (m: RoomModel, op: Op<K>, i: number) => void } = {
  addPerson: checkAddPerson,
  updatePerson: checkUpdatePerson,
  deletePerson: checkDeletePerson,
  addTie: checkAddTie,
  updateTie: checkUpdateTie,
  deleteTie: checkDeleteTie,
  movePeople: checkMovePeople,
};

/** Checks every op in order against a model of the room; returns the writes or throws 400 naming each bad op. */
export async function checkEdits(roomId: number, directed: boolean, ops: EditOpInput[], tx: Tx): Promise<Step[]> {
  const model = await loadModel(roomId, directed, tx);
  ops.forEach((op, i) => (CHECKERS[op.op] as (m: RoomModel, op: EditOpInput, i: number) => void)(model, op, i));
  if (model.errors.length > 0) failFields(model.errors, 'edits (nothing was saved)');
  return model.steps;
}
