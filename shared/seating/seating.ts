/**
 * Seating builder: turns a seating layout and a list of names into a room (people with
 * positions and groups, ties between the people who sit near each other). Pure TypeScript,
 * no DOM and no I/O, so the client preview, the server and the tests share one generator.
 *
 * Layouts
 *   round   tables of N seats: a strong tie to each neighbour on the circle, a weaker tie to
 *           everyone else at the same table ("across" the table)
 *   rows    classroom rows: strong ties to the left and right neighbours, weaker ties to the
 *           person in front and the person behind
 *   u       one U of seats facing inwards: strong ties along the U, weaker ties between the
 *           seats that face each other on the two arms
 * Mingling (round tables only): seat j of each table gets a weak tie to seat j of the next
 * table (tables in a ring), for the first `minglers` seats.
 */
import { itemAt } from '../checked';

export type SeatingKind = 'round' | 'rows' | 'u';

export interface SeatingOptions {
  kind: SeatingKind;
  /** Seats per round table, or seats per classroom row. Ignored for the U. */
  seatsPer: number;
  /** Strength of ties between neighbours. */
  neighbourStrength: number;
  /** Strength of the weaker ties (across a table, front/back, across the U). 0 leaves them out. */
  acrossStrength: number;
  /** Round tables: people per table who mingle with the next table (0 = no mingling). */
  minglers: number;
  /** Strength of a mingling tie. */
  mingleStrength: number;
}

export interface SeatedPerson {
  key: string;
  name: string;
  group: string;
  email: string | null;
  x: number;
  y: number;
}

export type SeatingTieKind = 'neighbour' | 'across' | 'mingle';

export interface SeatedTie {
  /** Indices into `people`. */
  source: number;
  target: number;
  strength: number;
  kind: SeatingTieKind;
}

export interface SeatingResult {
  people: SeatedPerson[];
  ties: SeatedTie[];
  /** Number of tables or rows (1 for the U). */
  groups: number;
  counts: Record<SeatingTieKind, number>;
}

export interface RosterEntry {
  name: string;
  email: string | null;
}

/** Largest room the builder makes; bigger rooms belong in an import. */
export const SEATING_MAX_PEOPLE = 3000;

export const DEFAULT_SEATING: SeatingOptions = {
  kind: 'round',
  seatsPer: 8,
  neighbourStrength: 3,
  acrossStrength: 1,
  minglers: 0,
  mingleStrength: 0.5,
};

/** Problems with the options, in words the form can show; empty when the options are usable. */
export function seatingProblems(opts: SeatingOptions, people: number): string[] {
  const problems: string[] = [];
  if (people < 2) problems.push('Add at least two names.');
  if (people > SEATING_MAX_PEOPLE)
    problems.push(`The builder makes rooms of up to ${SEATING_MAX_PEOPLE} people; import larger rooms from a file.`);
  if (opts.kind !== 'u' && (!Number.isInteger(opts.seatsPer) || opts.seatsPer < 2 || opts.seatsPer > 60)) {
    problems.push('Seats per table or row must be a whole number from 2 to 60.');
  }
  if (!(opts.neighbourStrength > 0) || opts.neighbourStrength > 1000) problems.push('Neighbour strength must be above 0 and at most 1000.');
  if (!(opts.acrossStrength >= 0) || opts.acrossStrength > 1000) problems.push('The weaker strength must be from 0 to 1000.');
  if (!Number.isInteger(opts.minglers) || opts.minglers < 0) problems.push('Minglers per table must be a whole number, 0 or more.');
  if (opts.minglers > 0 && !(opts.mingleStrength > 0)) problems.push('Mingling strength must be above 0.');
  return problems;
}

/** Builds the room. Throws with a plain message when `seatingProblems` is not empty. */
export function buildSeating(roster: readonly RosterEntry[], opts: SeatingOptions): SeatingResult {
  const problems = seatingProblems(opts, roster.length);
  if (problems.length) throw new Error(problems.join(' '));
  const out = new Builder(roster);
  if (opts.kind === 'round') seatRoundTables(out, opts);
  else if (opts.kind === 'rows') seatRows(out, opts);
  else seatU(out, opts);
  return out.result();
}

class Builder {
  readonly people: SeatedPerson[] = [];
  readonly ties: SeatedTie[] = [];
  groups = 0;
  private readonly seen = new Set<string>();

  constructor(private readonly roster: readonly RosterEntry[]) {}

  get size(): number {
    return this.roster.length;
  }

  seat(index: number, group: string, x: number, y: number): void {
    const entry = itemAt(this.roster, index, 'roster entry');
    this.people.push({ key: `s${index + 1}`, name: entry.name, group, email: entry.email, x: Math.round(x), y: Math.round(y) });
  }

  tie(a: number, b: number, strength: number, kind: SeatingTieKind): void {
    if (a === b || strength <= 0) return;
    const k = a < b ? `${a}:${b}` : `${b}:${a}`;
    if (this.seen.has(k)) return; // one tie per pair: the first (strongest) kind wins
    this.seen.add(k);
    this.ties.push({ source: a, target: b, strength, kind });
  }

  result(): SeatingResult {
    const counts = { neighbour: 0, across: 0, mingle: 0 };
    for (const t of this.ties) counts[t.kind]++;
    return { people: this.people, ties: this.ties, groups: this.groups, counts };
  }
}

const SEAT_GAP = 46;

function seatRoundTables(out: Builder, opts: SeatingOptions): void {
  const n = out.size;
  const per = opts.seatsPer;
  const tables = Math.ceil(n / per);
  out.groups = tables;
  const cols = Math.ceil(Math.sqrt(tables));
  const radius = Math.max(40, (per * SEAT_GAP) / (2 * Math.PI));
  const cell = radius * 2 + 110;
  const firstOf = (t: number) => t * per;
  const sizeOf = (t: number) => Math.min(per, n - t * per);
  for (let t = 0; t < tables; t++) {
    const cx = (t % cols) * cell + cell / 2;
    const cy = Math.floor(t / cols) * cell + cell / 2;
    const s = sizeOf(t);
    for (let j = 0; j < s; j++) {
      const angle = (2 * Math.PI * j) / s - Math.PI / 2;
      out.seat(firstOf(t) + j, `Table ${t + 1}`, cx + radius * Math.cos(angle), cy + radius * Math.sin(angle));
    }
  }
  for (let t = 0; t < tables; t++) {
    const base = firstOf(t);
    const s = sizeOf(t);
    // Neighbours on the circle (the builder drops the duplicate when s = 2).
    for (let j = 0; j < s; j++) out.tie(base + j, base + ((j + 1) % s), opts.neighbourStrength, 'neighbour');
    for (let a = 0; a < s; a++) {
      for (let b = a + 2; b < s; b++) {
        if (a === 0 && b === s - 1) continue; // neighbours across the join of the circle
        out.tie(base + a, base + b, opts.acrossStrength, 'across');
      }
    }
  }
  if (opts.minglers > 0 && tables > 1) {
    for (let t = 0; t < tables; t++) {
      const next = (t + 1) % tables;
      if (tables === 2 && t === 1) break; // two tables: one link, not two
      const m = Math.min(opts.minglers, sizeOf(t), sizeOf(next));
      for (let j = 0; j < m; j++) out.tie(firstOf(t) + j, firstOf(next) + j, opts.mingleStrength, 'mingle');
    }
  }
}

function seatRows(out: Builder, opts: SeatingOptions): void {
  const n = out.size;
  const per = opts.seatsPer;
  const rows = Math.ceil(n / per);
  out.groups = rows;
  const at = (r: number, c: number) => r * per + c;
  for (let i = 0; i < n; i++) {
    const r = Math.floor(i / per);
    const c = i % per;
    out.seat(i, `Row ${r + 1}`, 60 + c * 70, 60 + r * 80);
  }
  for (let i = 0; i < n; i++) {
    const r = Math.floor(i / per);
    const c = i % per;
    if (c + 1 < per && i + 1 < n) out.tie(i, i + 1, opts.neighbourStrength, 'neighbour');
    const behind = at(r + 1, c);
    if (behind < n) out.tie(i, behind, opts.acrossStrength, 'across');
  }
}

function seatU(out: Builder, opts: SeatingOptions): void {
  const n = out.size;
  out.groups = 1;
  // Left arm (top to bottom), the base (left to right), right arm (bottom to top).
  const arm = Math.floor(n / 3);
  const base = n - 2 * arm;
  const width = Math.max(base + 1, 2) * 60;
  const height = Math.max(arm + 1, 2) * 60;
  for (let i = 0; i < n; i++) {
    let x: number;
    let y: number;
    let side: string;
    if (i < arm) {
      [x, y, side] = [60, 60 + i * 60, 'Left side'];
    } else if (i < arm + base) {
      [x, y, side] = [60 + ((i - arm + 1) * width) / (base + 1), 60 + height, 'Front'];
    } else {
      [x, y, side] = [60 + width, 60 + (n - 1 - i) * 60, 'Right side'];
    }
    out.seat(i, side, x, y);
  }
  for (let i = 0; i + 1 < n; i++) out.tie(i, i + 1, opts.neighbourStrength, 'neighbour');
  // Seat i of the left arm faces seat n-1-i of the right arm.
  for (let i = 0; i < arm; i++) out.tie(i, n - 1 - i, opts.acrossStrength, 'across');
}

/** Names from a pasted list: one per line (or separated by semicolons); blanks are skipped. */
export function namesFromList(text: string): RosterEntry[] {
  return text
    .replace(/^\uFEFF/, '')
    .split(/\r?\n|;/)
    .map((s) => s.trim())
    .filter((s) => s.length > 0)
    .map((name) => ({ name: name.slice(0, 120), email: null }));
}

export interface RosterParse {
  entries: RosterEntry[];
  errors: string[];
}

/**
 * Names from a roster CSV with a header row. The name column is `name` (or `full name`,
 * `person`); an `email` / `e-mail` column is optional. Commas or semicolons, quotes allowed.
 */
export function namesFromRosterCsv(text: string): RosterParse {
  const clean = text.replace(/^\uFEFF/, '');
  const lines = clean.split(/\r?\n/).filter((l) => l.trim().length > 0);
  const first = lines[0];
  if (first === undefined) return { entries: [], errors: ['The roster file is empty.'] };
  const delimiter = (first.match(/;/g)?.length ?? 0) > (first.match(/,/g)?.length ?? 0) ? ';' : ',';
  const header = splitCsvLine(first, delimiter).map((h) => h.trim().toLowerCase());
  const nameCol = header.findIndex((h) => ['name', 'full name', 'person', 'participant'].includes(h));
  const emailCol = header.findIndex((h) => ['email', 'e-mail', 'mail'].includes(h));
  if (nameCol < 0) {
    return { entries: [], errors: [`Line 1: no name column. Name one column "name" (found: ${header.join(', ') || 'nothing'}).`] };
  }
  const entries: RosterEntry[] = [];
  const errors: string[] = [];
  for (const [i, line] of lines.entries()) {
    if (i === 0) continue; // the header
    const cells = splitCsvLine(line, delimiter);
    const name = (cells[nameCol] ?? '').trim();
    if (!name) {
      errors.push(`Line ${i + 1}: the name is empty.`);
      continue;
    }
    const email = emailCol >= 0 ? (cells[emailCol] ?? '').trim() || null : null;
    entries.push({ name: name.slice(0, 120), email });
  }
  return { entries, errors };
}

function splitCsvLine(line: string, delimiter: string): string[] {
  const cells: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === delimiter) {
      cells.push(cur);
      cur = '';
    } else cur += ch;
  }
  cells.push(cur);
  return cells;
}
