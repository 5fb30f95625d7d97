import type { PersonDto, TieDto } from '../../../../shared/api/rooms';

/**
 * The room as the editor holds it: people and ties under local ids that never change while
 * the page is open (the server id of a person can change when a delete is undone). Every
 * change is an EditorOp; applying one returns its inverse, so undo needs no hand-written
 * reverse for each command.
 */
export interface PersonFields {
  key: string;
  name: string;
  group: string | null;
  email: string | null;
  x: number | null;
  y: number | null;
  pinned: boolean;
}

export interface EditorPerson extends PersonFields {
  lid: string;
}

export interface EditorTie {
  lid: string;
  source: string;
  target: string;
  strength: number;
}

export interface Move {
  lid: string;
  x: number;
  y: number;
  pinned: boolean;
}

export type EditorOp =
  | { op: 'addPerson'; lid: string; fields: PersonFields }
  | { op: 'updatePerson'; lid: string; changes: Partial<PersonFields> }
  | { op: 'deletePerson'; lid: string }
  | { op: 'addTie'; lid: string; source: string; target: string; strength: number }
  | { op: 'updateTie'; lid: string; strength: number }
  | { op: 'deleteTie'; lid: string }
  | { op: 'move'; moves: Move[] };

export class RoomModel {
  readonly people = new Map<string, EditorPerson>();
  readonly ties = new Map<string, EditorTie>();

  /** Takes the room as the server sent it: person `id` becomes local id `p<id>`, tie `id` becomes `t<id>`. */
  replaceWith(people: readonly PersonDto[], ties: readonly TieDto[]): void {
    this.people.clear();
    this.ties.clear();
    for (const p of people) {
      const fields: PersonFields = { key: p.key, name: p.name, group: p.group, email: p.email, x: p.x, y: p.y, pinned: p.pinned };
      this.people.set(`p${p.id}`, { lid: `p${p.id}`, ...fields });
    }
    for (const t of ties)
      this.ties.set(`t${t.id}`, { lid: `t${t.id}`, source: `p${t.sourceId}`, target: `p${t.targetId}`, strength: t.strength });
  }

  /** Applies one op and returns the op that undoes it. Throws on an op that does not fit the model. */
  apply(op: EditorOp): EditorOp {
    switch (op.op) {
      case 'addPerson': {
        if (this.people.has(op.lid)) throw new Error(`Person ${op.lid} is already in the room.`);
        this.people.set(op.lid, { lid: op.lid, ...op.fields });
        return { op: 'deletePerson', lid: op.lid };
      }
      case 'updatePerson': {
        const p = this.person(op.lid);
        const before: Partial<PersonFields> = {};
        for (const k of Object.keys(op.changes) as (keyof PersonFields)[]) (before as Record<string, unknown>)[k] = p[k];
        Object.assign(p, op.changes);
        return { op: 'updatePerson', lid: op.lid, changes: before };
      }
      case 'deletePerson': {
        const p = this.person(op.lid);
        for (const t of this.ties.values()) {
          if (t.source === op.lid || t.target === op.lid) throw new Error('Delete the ties of a person before the person.');
        }
        this.people.delete(op.lid);
        const { lid, ...fields } = p;
        return { op: 'addPerson', lid, fields };
      }
      case 'addTie': {
        if (this.ties.has(op.lid)) throw new Error(`Tie ${op.lid} is already in the room.`);
        this.person(op.source);
        this.person(op.target);
        this.ties.set(op.lid, { lid: op.lid, source: op.source, target: op.target, strength: op.strength });
        return { op: 'deleteTie', lid: op.lid };
      }
      case 'updateTie': {
        const t = this.tie(op.lid);
        const before = t.strength;
        t.strength = op.strength;
        return { op: 'updateTie', lid: op.lid, strength: before };
      }
      case 'deleteTie': {
        const t = this.tie(op.lid);
        this.ties.delete(op.lid);
        return { op: 'addTie', lid: t.lid, source: t.source, target: t.target, strength: t.strength };
      }
      case 'move': {
        const before: Move[] = [];
        for (const m of op.moves) {
          const p = this.person(m.lid);
          before.push({ lid: m.lid, x: p.x ?? m.x, y: p.y ?? m.y, pinned: p.pinned });
          p.x = m.x;
          p.y = m.y;
          p.pinned = m.pinned;
        }
        return { op: 'move', moves: before };
      }
    }
  }

  /** Applies ops in order; returns the inverses in the order that undoes them (last first). */
  applyAll(ops: readonly EditorOp[]): EditorOp[] {
    const inverse: EditorOp[] = [];
    for (const op of ops) inverse.unshift(this.apply(op));
    return inverse;
  }

  tiesOf(lid: string): EditorTie[] {
    return [...this.ties.values()].filter((t) => t.source === lid || t.target === lid);
  }

  /** The tie between two people, either way round when undirected. */
  findTie(a: string, b: string, directed: boolean): EditorTie | undefined {
    for (const t of this.ties.values()) {
      if (t.source === a && t.target === b) return t;
      if (!directed && t.source === b && t.target === a) return t;
    }
    return undefined;
  }

  person(lid: string): EditorPerson {
    const p = this.people.get(lid);
    if (!p) throw new Error(`Person ${lid} is not in the room.`);
    return p;
  }

  tie(lid: string): EditorTie {
    const t = this.ties.get(lid);
    if (!t) throw new Error(`Tie ${lid} is not in the room.`);
    return t;
  }
}
