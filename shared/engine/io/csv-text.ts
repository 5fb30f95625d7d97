/**
 * CSV text layer (RFC 4180 quoting): byte-order mark, delimiter detection (`,` `;` or tab, read
 * from the header line), records with the line they start on, and cell protection against
 * spreadsheet formula injection (OWASP, "CSV Injection": prefix = + - @ tab CR with a quote).
 */

export type Delimiter = ',' | ';' | '\t';

export interface CsvRecord {
  /** 1-based line where the record starts. */
  readonly line: number;
  /** Cells: unquoted ones trimmed, quoted ones exactly as written between the quotes. */
  readonly cells: string[];
}

export interface CsvText {
  readonly delimiter: Delimiter;
  readonly records: CsvRecord[];
  /** Line of an opening quote that is never closed, if any. */
  readonly unclosedQuoteLine?: number;
}

/** Why reading stopped before the end: an unclosed quote, or a row too long to be real. */
export interface CsvStop {
  readonly line: number;
  readonly problem: 'unclosed-quote' | 'row-too-long';
}

/** A row longer than this (in characters) is refused: in a room file it means a missing quote. */
export const MAX_CSV_ROW_CHARS = 1024 * 1024;

export function stripBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Picks the delimiter that occurs most often, outside quotes, on the first line. Ties go to ','. */
export function detectDelimiter(text: string): Delimiter {
  const counts: Record<Delimiter, number> = { ',': 0, ';': 0, '\t': 0 };
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '"') quoted = !quoted;
    else if (!quoted && (c === '\n' || c === '\r')) break;
    else if (!quoted && (c === ',' || c === ';' || c === '\t')) counts[c]++;
  }
  if (counts[';'] > counts[','] && counts[';'] >= counts['\t']) return ';';
  if (counts['\t'] > counts[','] && counts['\t'] > counts[';']) return '\t';
  return ',';
}

/** Splits CSV text into records; blank lines are skipped. */
export function readCsv(input: string): CsvText {
  const reader = new CsvReader();
  const records = [...reader.records([input])];
  return {
    delimiter: reader.delimiter,
    records,
    ...(reader.stop ? { unclosedQuoteLine: reader.stop.line } : {}),
  };
}

type RecordRead = { readonly cells: string[]; readonly next: number; readonly lines: number } | 'more' | { readonly unclosedAt: number };

/**
 * Reads CSV records from text that arrives in pieces (a file read in chunks): records are given
 * out as soon as they are complete, so a reader can stop at the first bad row without reading the
 * rest. Only an unfinished row is held back between pieces.
 */
export class CsvReader {
  delimiter: Delimiter = ',';
  /** Set when reading stopped early (unclosed quote, overlong row). */
  stop?: CsvStop;

  *records(chunks: Iterable<string>): Generator<CsvRecord> {
    let pending = '';
    let line = 1;
    let started = false;
    const it = chunks[Symbol.iterator]();
    for (let final = false; !final;) {
      const step: IteratorResult<string, unknown> = it.next();
      final = step.done === true;
      if (!step.done) pending += started || pending.length > 0 ? step.value : stripBom(step.value);
      if (!started) {
        if (!final && !/[\r\n]/.test(pending) && pending.length < MAX_CSV_ROW_CHARS) continue;
        this.delimiter = detectDelimiter(pending);
        started = true;
      }
      let i = 0;
      for (;;) {
        if (i >= pending.length) break;
        const r = readRecord(pending, i, this.delimiter.charCodeAt(0), final);
        if (r === 'more') break;
        if ('unclosedAt' in r) {
          this.stop = { line: line + countLines(pending, i, r.unclosedAt), problem: 'unclosed-quote' };
          return;
        }
        if (!(r.cells.length === 1 && r.cells[0] === '')) yield { line, cells: r.cells };
        line += r.lines;
        i = r.next;
      }
      pending = pending.slice(i);
      if (!final && pending.length > MAX_CSV_ROW_CHARS) {
        this.stop = { line, problem: 'row-too-long' };
        return;
      }
    }
  }
}

function countLines(text: string, from: number, to: number): number {
  let n = 0;
  for (let k = text.indexOf('\n', from); k >= 0 && k < to; k = text.indexOf('\n', k + 1)) n++;
  return n;
}

/** One record from offset i: its cells, where the next starts and how many line breaks it spans. */
function readRecord(text: string, i: number, d: number, final: boolean): RecordRead {
  const len = text.length;
  const cells: string[] = [];
  let lines = 0;
  for (;;) {
    let j = i;
    while (j < len && (text.charCodeAt(j) === 32 || (text.charCodeAt(j) === 9 && d !== 9))) j++;
    let e: number;
    if (j < len && text.charCodeAt(j) === 34) {
      let out = '';
      let from = j + 1;
      for (;;) {
        const q = text.indexOf('"', from);
        if (q < 0) return final ? { unclosedAt: j } : 'more';
        if (q + 1 >= len && !final) return 'more';
        if (text.charCodeAt(q + 1) === 34) {
          out += text.slice(from, q + 1);
          from = q + 2;
          continue;
        }
        out += text.slice(from, q);
        lines += countLines(text, j, q);
        e = q + 1;
        break;
      }
      // anything after the closing quote up to the delimiter is kept (lenient), trimmed
      const after = e;
      while (e < len && text.charCodeAt(e) !== d && text.charCodeAt(e) !== 10 && text.charCodeAt(e) !== 13) e++;
      cells.push(after === e ? out : out + text.slice(after, e).trim());
    } else {
      e = i;
      while (e < len) {
        const c = text.charCodeAt(e);
        if (c === d || c === 10 || c === 13) break;
        e++;
      }
      cells.push(text.slice(i, e).trim());
    }
    if (e >= len) return final ? { cells, next: len, lines } : 'more';
    const c = text.charCodeAt(e);
    if (c === d) {
      i = e + 1;
      continue;
    }
    if (c === 13) {
      if (e + 1 >= len && !final) return 'more';
      return { cells, next: text.charCodeAt(e + 1) === 10 ? e + 2 : e + 1, lines: lines + 1 };
    }
    return { cells, next: e + 1, lines: lines + 1 };
  }
}

const FORMULA_START = /^'*[=+\-@\t\r]/;

/**
 * Protects a cell against formula injection: a cell starting with = + - @ tab or CR (after any
 * quotes) gets one more leading quote. `unprotectCell` undoes exactly this, so export -> import
 * gives back the same text.
 */
export function protectCell(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value;
}

export function unprotectCell(value: string): string {
  return value.startsWith("'") && FORMULA_START.test(value) ? value.slice(1) : value;
}

/** Quotes a cell when it holds the delimiter, a quote, a line break or edge spaces. */
export function quoteCell(value: string, delimiter: Delimiter = ','): string {
  const safe = protectCell(value);
  if (safe.includes(delimiter) || /["\r\n]/.test(safe) || safe !== safe.trim()) {
    return `"${safe.replace(/"/g, '""')}"`;
  }
  return safe;
}

export function writeCsvRows(rows: readonly (readonly string[])[], delimiter: Delimiter = ','): string {
  return rows.map((r) => r.map((c) => quoteCell(c, delimiter)).join(delimiter)).join('\r\n') + '\r\n';
}
