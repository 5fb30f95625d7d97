/**
 * Problems found while reading a room file. Each issue says where (CSV line, GraphML element or
 * JSON path), which field, and what to fix; the rooms screen shows them as a table and the
 * command line prints the first one.
 */
import type { RoomGraph } from '../graph';
import type { NodeLinkExtras } from './node-link';

export type IssueSeverity = 'error' | 'warning';

export type IssueCode =
  | 'encoding'
  | 'too-large'
  | 'syntax'
  | 'unsafe-markup'
  | 'missing-column'
  | 'missing-field'
  | 'unknown-id'
  | 'duplicate-person'
  | 'duplicate-tie'
  | 'self-tie'
  | 'bad-strength'
  | 'bad-id'
  | 'empty-room'
  | 'room-too-large'
  | 'mixed-direction'
  | 'delimiter'
  | 'no-ties'
  | 'isolated-person'
  | 'ignored-column'
  | 'reporting-cycle'
  | 'too-many-issues'
  | 'too-deep'
  | 'strength-range'
  | 'empty-strength';

export interface Issue {
  readonly severity: IssueSeverity;
  readonly code: IssueCode;
  /** What is wrong and what to do, without the location (the table shows that in its own columns). */
  readonly message: string;
  /** Which input: 'ties' or 'people' for CSV, else the format name. */
  readonly file?: string;
  /** 1-based line of the CSV row (or of the GraphML element when known). */
  readonly line?: number;
  /** GraphML element or JSON path, e.g. `edge #3 (id "e3")` or `links[2]`. */
  readonly element?: string;
  /** Column, attribute or property, e.g. `strength`. */
  readonly field?: string;
}

export type RoomFormat = 'json' | 'csv' | 'graphml';

export interface ParseMeta {
  readonly format: RoomFormat;
  /** CSV only: the delimiter that was detected. */
  readonly delimiter?: ',' | ';' | '\t';
  /** JSON only: node positions and the "graph" object's scalars (a room written by Ripplehall). */
  readonly nodeLink?: NodeLinkExtras;
}

export interface ParseResult {
  /** The room read so far; only trustworthy when `errors` is empty. */
  readonly graph: RoomGraph;
  readonly warnings: Issue[];
  readonly errors: Issue[];
  readonly meta: ParseMeta;
}

export interface ParseOptions {
  /** Most people a room may hold (default 100 000). */
  readonly maxPeople?: number;
  /** Most ties a room may hold (default 2 000 000). */
  readonly maxTies?: number;
  /** Largest accepted tie strength (default 1e9): larger values usually mean a unit or typing mistake. */
  readonly maxStrength?: number;
  /** Largest input text in characters (default 64 MiB). */
  readonly maxChars?: number;
  /** CSV only: read each row as "source asks target" (default false: undirected ties). */
  readonly directed?: boolean;
  /** Reading stops after this many errors (default 50; the command line uses 1). */
  readonly maxErrors?: number;
}

export const DEFAULT_LIMITS = {
  maxPeople: 100_000,
  maxTies: 2_000_000,
  maxStrength: 1e9,
  maxChars: 64 * 1024 * 1024,
  maxErrors: 50,
} as const;

/** The longest one-line refusal (command line and web import alike). */
export const MAX_MESSAGE_CHARS = 300;

/** Keeps a bounded list of issues so a huge bad file cannot exhaust memory. */
export class IssueList {
  readonly errors: Issue[] = [];
  readonly warnings: Issue[] = [];
  private dropped = { error: 0, warning: 0 };
  private readonly errorCap: number;

  /** `maxErrors`: once this many errors are listed, `full` is true and readers stop. */
  constructor(
    private readonly file: string,
    private readonly cap = 500,
    maxErrors: number = DEFAULT_LIMITS.maxErrors,
  ) {
    this.errorCap = Math.max(1, Math.min(cap, maxErrors));
  }

  /** True once the error list is full: the reader should stop reading. */
  get full(): boolean {
    return this.errors.length >= this.errorCap;
  }

  error(code: IssueCode, message: string, where: IssueWhere = {}): void {
    this.push('error', code, message, where);
  }

  warn(code: IssueCode, message: string, where: IssueWhere = {}): void {
    this.push('warning', code, message, where);
  }

  get hasErrors(): boolean {
    return this.errors.length > 0;
  }

  /** Adds a closing note when issues were dropped or reading stopped early. */
  finish(): void {
    if (this.full && this.errorCap > 1 && this.dropped.error === 0) {
      this.errors.push({
        severity: 'error',
        code: 'too-many-issues',
        file: this.file,
        message: `reading stopped after ${this.errorCap} errors; fix the ones above first`,
      });
    }
    for (const severity of ['error', 'warning'] as const) {
      const n = this.dropped[severity];
      if (n === 0) continue;
      const list = severity === 'error' ? this.errors : this.warnings;
      list.push({
        severity,
        code: 'too-many-issues',
        file: this.file,
        message: `${n} more ${severity}${n === 1 ? '' : 's'} not listed; fix the ones above first`,
      });
    }
  }

  private push(severity: IssueSeverity, code: IssueCode, message: string, where: IssueWhere): void {
    const list = severity === 'error' ? this.errors : this.warnings;
    if (list.length >= (severity === 'error' ? this.errorCap : this.cap)) {
      this.dropped[severity]++;
      return;
    }
    list.push({ severity, code, message, file: where.file ?? this.file, ...pick(where) });
  }
}

export interface IssueWhere {
  readonly file?: string;
  readonly line?: number;
  readonly element?: string;
  readonly field?: string;
}

function pick(where: IssueWhere): Omit<IssueWhere, 'file'> {
  const out: { line?: number; element?: string; field?: string } = {};
  if (where.line !== undefined) out.line = where.line;
  if (where.element !== undefined) out.element = where.element;
  if (where.field !== undefined) out.field = where.field;
  return out;
}

/** One line of text for a log or the command line: `ties line 4, strength: ... `. */
export function describeIssue(issue: Issue): string {
  const place: string[] = [];
  if (issue.file) place.push(issue.file);
  if (issue.line !== undefined) place.push(`line ${issue.line}`);
  if (issue.element) place.push(issue.element);
  let where = place.join(' ');
  if (issue.field) where += where ? `, ${issue.field}` : issue.field;
  return where ? `${where}: ${issue.message}` : issue.message;
}

/**
 * The one line that refuses a file: the first error with its place, and how many more there are,
 * at most MAX_MESSAGE_CHARS long. The command line prints it after the file name; the web import
 * answers it as the message of its 400.
 */
export function refusalLine(errors: readonly Issue[], room = MAX_MESSAGE_CHARS): string {
  const n = errors.filter((e) => e.code !== 'too-many-issues').length;
  const cut = n < errors.length;
  const others = cut ? ' at least' : '';
  const more = n > 1 ? ` (and${others} ${n - 1} more problem${n > 2 ? 's' : ''})` : cut ? ' (and more problems)' : '';
  return clipLine(describeIssue(errors[0]), room - more.length) + more;
}

/** Cuts one line to `max` characters, ending with "..." when cut. */
export function clipLine(text: string, max = MAX_MESSAGE_CHARS): string {
  const line = text.replace(/\s*[\r\n]+\s*/g, ' ').trim();
  return line.length > max ? `${line.slice(0, Math.max(0, max - 3))}...` : line;
}
