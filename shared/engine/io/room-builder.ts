/**
 * The validation every room format shares: people ids, tie strengths, self-ties, duplicate ties
 * (merged by summing, with a warning), empty rooms and size limits. Parsers feed it rows with their
 * location; it reports issues through an IssueList and builds the RoomGraph.
 */
import type { RoomGraph, RoomTie } from '../graph';
import { DEFAULT_LIMITS, type IssueList, type IssueWhere, type ParseOptions } from './issues';

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export interface StrengthReading {
  readonly value?: number;
  readonly problem?: string;
  /** The strength was written but empty (a blank CSV cell, an empty GraphML <data>): read as 1. */
  readonly empty?: boolean;
}

/**
 * The weakest tie, relative to the strongest in the room, that the solvers can carry in double
 * precision (machine epsilon 2.2e-16): below it a weak tie's share of a degree is lost to
 * rounding (a 1e-16 tie beside ties of 1 vanishes, a 1e-15 tie comes out 10 % wrong).
 */
export const MIN_STRENGTH_RATIO = 1e-12;

/** The least strength accepted at all (far above the subnormal range, whose precision is lost). */
export const MIN_STRENGTH = 1e-100;

/**
 * Reads a strength: a positive, finite decimal number from MIN_STRENGTH to maxStrength. Missing
 * (undefined) means 1; empty text means 1 with `empty` set (the caller warns); null is refused.
 */
export function readStrength(raw: unknown, maxStrength: number, decimalComma = false): StrengthReading {
  if (raw === undefined) return { value: 1 };
  if (typeof raw === 'string' && raw.trim() === '') return { value: 1, empty: true };
  if (raw === null)
    return { problem: 'the strength is null; write a positive number, or leave the field out (a missing strength means 1)' };
  let value: number;
  if (typeof raw === 'number') {
    value = raw;
  } else if (typeof raw === 'string') {
    let text = raw.trim();
    if (decimalComma && /^[+-]?\d+,\d+$/.test(text)) text = text.replace(',', '.');
    if (!DECIMAL.test(text)) {
      return { problem: `"${clip(raw)}" is not a number; write a positive number such as 1 or 2.5` };
    }
    value = Number(text);
  } else {
    return { problem: `${shownValue(raw)} is not a number; write a positive number such as 1 or 2.5` };
  }
  const shown = clip(typeof raw === 'string' ? raw.trim() : String(raw));
  if (!Number.isFinite(value)) {
    return { problem: `${shown} is not a finite number; write a positive number such as 1 or 2.5` };
  }
  if (value <= 0) {
    if (value === 0 && typeof raw === 'string' && /[1-9]/.test(raw.replace(/[eE].*$/, ''))) {
      return { problem: `${shown} is too small to compute with (the least strength accepted is ${MIN_STRENGTH}); rescale the strengths` };
    }
    return {
      problem: `${shown} is not positive; a tie needs a strength above 0 (leave the tie out if there is none)`,
    };
  }
  if (value < MIN_STRENGTH) {
    return { problem: `${shown} is too small to compute with (the least strength accepted is ${MIN_STRENGTH}); rescale the strengths` };
  }
  if (value > maxStrength) {
    return { problem: `${value} is too large (the limit is ${maxStrength}); check the unit or rescale the strengths` };
  }
  return { value };
}

/** A value for a message; readers may pass `{ shown }` for values they describe themselves. */
function shownValue(raw: unknown): string {
  if (typeof raw === 'object' && raw !== null && typeof (raw as { shown?: unknown }).shown === 'string')
    return (raw as { shown: string }).shown;
  return clip(JSON.stringify(raw) ?? typeof raw);
}

export function clip(text: string, max = 40): string {
  return text.length > max ? `${text.slice(0, max)}...` : text;
}

interface PendingTie {
  source: number;
  target: number;
  strength: number;
  where: IssueWhere;
  merged: number;
}

export class RoomBuilder {
  private readonly ids: string[] = [];
  private readonly labels: string[] = [];
  private readonly groups: (string | null)[] = [];
  private readonly index = new Map<string, { i: number; where: IssueWhere }>();
  private readonly ties = new Map<number, PendingTie>();
  private hasLabels = false;
  private hasGroups = false;
  private tooManyPeople = false;
  private tooManyTies = false;
  private emptyStrengths = 0;
  private firstEmpty: IssueWhere | undefined;
  readonly limits: Required<Omit<ParseOptions, 'directed'>>;

  /** `trimIds`: CSV cells are trimmed; JSON and GraphML ids are kept exactly as written. */
  constructor(
    private readonly issues: IssueList,
    options: ParseOptions = {},
    private readonly trimIds = false,
  ) {
    this.limits = { ...DEFAULT_LIMITS, ...stripUndefined(options) };
  }

  get size(): number {
    return this.ids.length;
  }

  has(id: string): boolean {
    return this.index.has(id);
  }

  /** Declares a person; a repeated id is an error. Returns false when the person was not added. */
  addPerson(rawId: unknown, label: string | undefined, group: string | undefined, where: IssueWhere): boolean {
    const id = this.readId(rawId, where);
    if (id === undefined) return false;
    const seen = this.index.get(id);
    if (seen) {
      this.issues.error(
        'duplicate-person',
        `person "${clip(id)}" is listed twice (first at ${placeOf(seen.where)}); keep one row per person`,
        where,
      );
      return false;
    }
    if (this.ids.length >= this.limits.maxPeople) {
      if (!this.tooManyPeople) {
        this.tooManyPeople = true;
        this.issues.error(
          'room-too-large',
          `the room has more than ${this.limits.maxPeople} people, the most allowed; split it into smaller rooms`,
          where,
        );
      }
      return false;
    }
    this.index.set(id, { i: this.ids.length, where });
    this.ids.push(id);
    this.labels.push(label ?? id);
    this.groups.push(group ?? null);
    if (label !== undefined && label !== '') this.hasLabels = true;
    if (group !== undefined && group !== '') this.hasGroups = true;
    return true;
  }

  /** Adds a tie. With `implicitPeople` unknown ids become new people (CSV without a people file). */
  addTie(
    rawSource: unknown,
    rawTarget: unknown,
    rawStrength: unknown,
    where: IssueWhere,
    fields: { source: string; target: string; strength: string },
    directed: boolean,
    implicitPeople = false,
    decimalComma = false,
  ): void {
    const s = this.resolve(rawSource, where, fields.source, implicitPeople);
    const t = this.resolve(rawTarget, where, fields.target, implicitPeople);
    const reading = readStrength(rawStrength, this.limits.maxStrength, decimalComma);
    if (reading.problem) this.issues.error('bad-strength', reading.problem, { ...where, field: fields.strength });
    if (reading.empty && this.emptyStrengths++ === 0) this.firstEmpty = { ...where, field: fields.strength };
    if (s === undefined || t === undefined || reading.value === undefined) return;
    if (s === t) {
      this.issues.error(
        'self-tie',
        `"${clip(this.ids[s])}" is tied to themself; remove this tie (use laziness to model staying put)`,
        where,
      );
      return;
    }
    // Numeric keys (exact while there are fewer than 2^21 people) are much faster than strings.
    const key = directed || s < t ? s * 4294967296 + t : t * 4294967296 + s;
    const seen = this.ties.get(key);
    if (seen) {
      seen.strength += reading.value;
      seen.merged++;
      this.issues.warn(
        'duplicate-tie',
        `tie "${clip(this.ids[s])}" - "${clip(this.ids[t])}" repeats the one at ${placeOf(seen.where)}; strengths were added (now ${seen.strength})`,
        where,
      );
      return;
    }
    if (this.ties.size >= this.limits.maxTies) {
      if (!this.tooManyTies) {
        this.tooManyTies = true;
        this.issues.error('room-too-large', `the room has more than ${this.limits.maxTies} ties, the most allowed`, where);
      }
      return;
    }
    this.ties.set(key, { source: s, target: t, strength: reading.value, where, merged: 0 });
  }

  /** Checks the whole room (empty, no ties, isolated people, strength range) and returns the graph. */
  finish(directed: boolean, file: string): RoomGraph {
    if (this.firstEmpty) {
      const n = this.emptyStrengths;
      this.issues.warn(
        'empty-strength',
        `${n === 1 ? 'this tie has' : `${n} ties have`} an empty strength, read as 1 (an empty strength means 1; write a number to say otherwise)`,
        this.firstEmpty,
      );
    }
    if (!this.issues.hasErrors) this.checkStrengthRange();
    if (this.ids.length === 0) {
      if (!this.issues.hasErrors)
        this.issues.error('empty-room', 'the room has no people; add at least one person (and ties between people)', { file });
    } else if (this.ties.size === 0) {
      this.issues.warn('no-ties', 'the room has no ties; nobody can pass anything on', { file });
    } else {
      const touched = new Uint8Array(this.ids.length);
      for (const t of this.ties.values()) {
        touched[t.source] = 1;
        touched[t.target] = 1;
      }
      for (let i = 0; i < this.ids.length; i++) {
        if (!touched[i]) {
          this.issues.warn(
            'isolated-person',
            `"${clip(this.ids[i])}" has no ties; they hear only if briefed (or through background mixing)`,
            {
              ...this.index.get(this.ids[i])!.where,
              field: undefined,
            },
          );
        }
      }
    }
    const ties: RoomTie[] = [...this.ties.values()].map((t) => ({ source: t.source, target: t.target, strength: t.strength }));
    const graph: { -readonly [K in keyof RoomGraph]: RoomGraph[K] } = { ids: this.ids, directed, ties };
    if (this.hasLabels) graph.labels = this.labels;
    if (this.hasGroups) graph.groups = this.groups;
    return graph;
  }

  /** Refuses a room whose weakest tie is beyond double precision next to its strongest. */
  private checkStrengthRange(): void {
    let weak: PendingTie | undefined;
    let strong: PendingTie | undefined;
    for (const t of this.ties.values()) {
      if (!weak || t.strength < weak.strength) weak = t;
      if (!strong || t.strength > strong.strength) strong = t;
    }
    if (!weak || !strong || weak.strength >= strong.strength * MIN_STRENGTH_RATIO) return;
    const ratio = (weak.strength / strong.strength).toPrecision(2);
    this.issues.error(
      'strength-range',
      `${weak.strength} is ${ratio} times the strongest tie (${strong.strength}, ${placeOf(strong.where)}); ` +
        `below ${MIN_STRENGTH_RATIO} times, double precision cannot carry it: drop the weak tie or narrow the strengths`,
      { ...weak.where, field: 'strength' },
    );
  }

  private readId(raw: unknown, where: IssueWhere): string | undefined {
    if (typeof raw === 'number' && Number.isFinite(raw)) return String(raw);
    if (typeof raw === 'string' && raw.trim() !== '') return this.trimIds ? raw.trim() : raw;
    const shown = raw === undefined ? 'missing' : raw === '' ? 'empty' : `${shownValue(raw)}, not a name or number`;
    this.issues.error('bad-id', `the person id is ${shown}; every person needs an id`, { ...where, field: where.field ?? 'id' });
    return undefined;
  }

  private resolve(raw: unknown, at: IssueWhere, field: string, implicitPeople: boolean): number | undefined {
    // Fast path without allocations: most ties name people already seen.
    let id: string | undefined;
    if (typeof raw === 'string') {
      const text = this.trimIds ? raw.trim() : raw;
      if (text.trim() !== '') id = text;
    } else if (typeof raw === 'number' && Number.isFinite(raw)) {
      id = String(raw);
    }
    if (id === undefined) {
      this.readId(raw, { ...at, field });
      return undefined;
    }
    const seen = this.index.get(id);
    if (seen) return seen.i;
    const where = { ...at, field };
    if (implicitPeople) {
      return this.addPerson(id, undefined, undefined, where) ? this.ids.length - 1 : undefined;
    }
    this.issues.error('unknown-id', `"${clip(id)}" is not a person of this room; add them to the people list or correct the id`, where);
    return undefined;
  }
}

export function placeOf(where: IssueWhere): string {
  if (where.line !== undefined) return `line ${where.line}`;
  if (where.element !== undefined) return where.element;
  return 'an earlier row';
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}
