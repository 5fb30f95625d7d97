/**
 * Checks a whole room's content (people and ties by key) before it is written: duplicate
 * keys, unknown people, self-ties, duplicate ties. Used by create, duplicate and seed data;
 * file imports get the same checks from the engine's readers.
 */
import { ROOM_LIMITS, type RoomSettings } from '../../shared/api/rooms';
import { badRequest } from '../core/http-error';
import type { FieldError } from '../../shared/api/errors';
import type { NewPersonInput } from './schemas';
import type { PersonRowInput, TieRowInput } from './store';

export type { PersonRowInput, TieRowInput };

export interface RoomContent {
  people: PersonRowInput[];
  ties: TieRowInput[];
}

/** Throws a 400 naming every field at fault, like `parse` does. */
export function failFields(fields: FieldError[], where = 'request body'): never {
  const shown = fields.slice(0, 20);
  const summary = shown.map((f) => `${f.field}: ${f.message}`).join('; ');
  const more = fields.length > shown.length ? ` (and ${fields.length - shown.length} more)` : '';
  throw badRequest(`Please check the ${where}: ${summary}${more}`, { fields });
}

/** Keys p1, p2, ... that do not clash with keys already taken. */
export function keyMaker(taken: Iterable<string>): () => string {
  const used = new Set(taken);
  let n = 0;
  return () => {
    let key: string;
    do key = `p${++n}`;
    while (used.has(key));
    used.add(key);
    return key;
  };
}

export const pairKey = (a: number, b: number, directed: boolean) => (directed || a < b ? `${a}:${b}` : `${b}:${a}`);

export function checkContent(
  people: NewPersonInput[],
  ties: { source: string; target: string; strength?: number }[],
  settings: RoomSettings,
): RoomContent {
  const errors: FieldError[] = [];
  const index = new Map<string, number>();
  const nextKey = keyMaker(people.flatMap((p) => (p.key ? [p.key] : [])));
  const peopleRows: PersonRowInput[] = people.map((p, i) => {
    const key = p.key ?? nextKey();
    if (index.has(key)) {
      errors.push({
        field: `people.${i}.key`,
        message: `The person id "${key}" is used twice (first by people.${index.get(key)}); ids must be unique.`,
      });
    } else index.set(key, i);
    return {
      key,
      name: p.name,
      group: p.group ?? null,
      email: p.email ?? null,
      x: p.x ?? null,
      y: p.y ?? null,
      pinned: p.pinned ?? false,
    };
  });
  if (peopleRows.length > ROOM_LIMITS.maxPeople) {
    errors.push({ field: 'people', message: `A room can hold at most ${ROOM_LIMITS.maxPeople} people.` });
  }
  const seen = new Map<string, number>();
  const tieRows: TieRowInput[] = [];
  ties.forEach((t, i) => {
    const s = index.get(t.source);
    const g = index.get(t.target);
    if (s === undefined) errors.push({ field: `ties.${i}.source`, message: `"${t.source}" is not a person of this room.` });
    if (g === undefined) errors.push({ field: `ties.${i}.target`, message: `"${t.target}" is not a person of this room.` });
    if (s === undefined || g === undefined) return;
    if (s === g) {
      errors.push({ field: `ties.${i}`, message: `"${t.source}" is tied to themself; remove this tie.` });
      return;
    }
    const pk = pairKey(s, g, settings.directed);
    const first = seen.get(pk);
    if (first !== undefined) {
      errors.push({
        field: `ties.${i}`,
        message: `This tie repeats ties.${first} (${t.source} - ${t.target}); keep one and set its strength.`,
      });
      return;
    }
    seen.set(pk, i);
    tieRows.push({ source: s, target: g, strength: t.strength ?? 1 });
  });
  if (errors.length > 0) failFields(errors);
  return { people: peopleRows, ties: tieRows };
}
