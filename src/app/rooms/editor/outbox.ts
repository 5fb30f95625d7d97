import { ROOM_LIMITS, type RoomEditOp } from '../../../../shared/api/rooms';
import type { EditorOp, Move } from './room-model';

/** Moves in one movePeople op at most (the server's limit). */
const MOVES_PER_OP = ROOM_LIMITS.maxPeople;
/** Moves in one batch at most, so the layout of a very large room goes out in bodies well under the 2 MB limit. */
export const MOVES_PER_BATCH = 5 * MOVES_PER_OP;

/**
 * Changes waiting to be saved, and the translation of local ids into the server's. A person
 * added in this batch is named by its tempId (the local id); an op that needs the server id
 * of something added in the same batch (update, delete) starts the next batch instead, so
 * every batch is valid on its own and batches go out one after another.
 */
export class Outbox {
  private queue: EditorOp[] = [];
  /** Local id -> server id, for people and ties that exist on the server. */
  readonly personIds = new Map<string, number>();
  readonly tieIds = new Map<string, number>();

  get pending(): number {
    return this.queue.length;
  }

  /** Queues ops; a move of more people than one op may carry is queued as several. */
  push(ops: readonly EditorOp[]): void {
    for (const op of ops) {
      if (op.op !== 'move' || op.moves.length <= MOVES_PER_OP) {
        this.queue.push(op);
        continue;
      }
      for (let i = 0; i < op.moves.length; i += MOVES_PER_OP) this.queue.push({ op: 'move', moves: op.moves.slice(i, i + MOVES_PER_OP) });
    }
  }

  /** Forgets unsaved changes (after the user chose to reload). */
  discard(): void {
    this.queue = [];
  }

  /** Starts again from a room read from the server (the local ids of RoomModel.replaceWith). */
  restart(people: readonly { id: number }[], ties: readonly { id: number }[]): void {
    this.discard();
    this.personIds.clear();
    this.tieIds.clear();
    for (const p of people) this.personIds.set(`p${p.id}`, p.id);
    for (const t of ties) this.tieIds.set(`t${t.id}`, t.id);
  }

  /** The next batch to send (without its version) and how many queued ops it covers. */
  next(): { ops: RoomEditOp[]; count: number; layoutOnly: boolean } | null {
    if (!this.queue.length) return null;
    const ops: RoomEditOp[] = [];
    const addedPeople = new Set<string>();
    const addedTies = new Set<string>();
    let moves: Map<string, Move> | null = null;
    let count = 0;
    const personRef = (lid: string, allowTemp: boolean): number | string | undefined => {
      if (addedPeople.has(lid)) return allowTemp ? lid : undefined;
      return this.personIds.get(lid);
    };
    let batchMoves = 0;
    const flushMoves = () => {
      const all = [...(moves?.values() ?? [])].map((m) => ({ id: personRef(m.lid, true)!, x: m.x, y: m.y, pinned: m.pinned }));
      for (let i = 0; i < all.length; i += MOVES_PER_OP) ops.push({ op: 'movePeople', moves: all.slice(i, i + MOVES_PER_OP) });
      moves = null;
    };
    for (const op of this.queue) {
      if (op.op === 'move') {
        if (count && batchMoves + op.moves.length > MOVES_PER_BATCH) break;
        batchMoves += op.moves.length;
        moves ??= new Map();
        // A person that never reached the server (added and deleted before a save) has nothing to move.
        for (const m of op.moves) if (personRef(m.lid, true) !== undefined) moves.set(m.lid, m);
        count++;
        continue;
      }
      const out = this.translate(op, addedPeople, addedTies, personRef);
      if (out === 'cut') break;
      flushMoves();
      if (out) ops.push(out);
      count++;
    }
    flushMoves();
    if (count === 0) return null;
    return { ops, count, layoutOnly: ops.every((o) => o.op === 'movePeople') };
  }

  private translate(
    op: Exclude<EditorOp, { op: 'move' }>,
    addedPeople: Set<string>,
    addedTies: Set<string>,
    personRef: (lid: string, allowTemp: boolean) => number | string | undefined,
  ): RoomEditOp | 'cut' | null {
    switch (op.op) {
      case 'addPerson': {
        if (addedPeople.has(op.lid)) return 'cut';
        addedPeople.add(op.lid);
        return { op: 'addPerson', tempId: op.lid, ...op.fields };
      }
      case 'updatePerson':
      case 'deletePerson': {
        if (addedPeople.has(op.lid)) return 'cut';
        const id = this.personIds.get(op.lid);
        if (id === undefined) return null; // never reached the server: nothing to change there
        return op.op === 'updatePerson' ? { op: 'updatePerson', id, ...op.changes } : { op: 'deletePerson', id };
      }
      case 'addTie': {
        if (addedTies.has(op.lid)) return 'cut';
        const source = personRef(op.source, true);
        const target = personRef(op.target, true);
        if (source === undefined || target === undefined) return null;
        addedTies.add(op.lid);
        return { op: 'addTie', tempId: op.lid, source, target, strength: op.strength };
      }
      case 'updateTie':
      case 'deleteTie': {
        if (addedTies.has(op.lid)) return 'cut';
        const id = this.tieIds.get(op.lid);
        if (id === undefined) return null;
        return op.op === 'updateTie' ? { op: 'updateTie', id, strength: op.strength } : { op: 'deleteTie', id };
      }
    }
  }

  /** The server took the first `count` ops: record new ids and forget deleted ones. */
  acknowledge(count: number, result: { people: Record<string, number>; ties: Record<string, number> }): void {
    const done = this.queue.splice(0, count);
    for (const op of done) {
      if (op.op === 'deletePerson') this.personIds.delete(op.lid);
      if (op.op === 'deleteTie') this.tieIds.delete(op.lid);
    }
    for (const [temp, id] of Object.entries(result.people)) this.personIds.set(temp, id);
    for (const [temp, id] of Object.entries(result.ties)) this.tieIds.set(temp, id);
  }
}
