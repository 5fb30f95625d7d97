/**
 * CSV text layer (RFC 4180 quoting): byte-order mark, delimiter detection (`,` `;` or tab, read
 * from the header line), records with the line they start on, and cell protection against
 * spreadsheet formula injection (OWASP, "CSV Injection": prefix = + - @ tab CR with a quote).
 */

export type Delimiter = ',' | ';' | '\t';

export interface CsvRecord {
  /** 1-based line where the record starts. */
  readonly line: number;
  readonly cells: string[];
}

export interface CsvText {
  readonly delimiter: Delimiter;
  readonly records: CsvRecord[];
  /** Line of an opening quote that is never closed, if any. */
  readonly unclosedQuoteLine?: number;
}

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
  const text = stripBom(input);
  const delimiter = detectDelimiter(text);
  const records: CsvRecord[] = [];
  let cells: string[] = [];
  let cell = '';
  let line = 1;
  let recordLine = 1;
  let quoted = false;
  let quoteLine = 0;
  let i = 0;
  const endRecord = () => {
    cells.push(cell);
    if (!(cells.length === 1 && cells[0].trim() === '')) records.push({ line: recordLine, cells });
    cells = [];
    cell = '';
  };
  while (i < text.length) {
    const c = text[i];
    if (quoted) {
      if (c === '"') {
        if (text[i + 1] === '"') {
          cell += '"';
          i += 2;
          continue;
        }
        quoted = false;
      } else {
        if (c === '\n') line++;
        cell += c;
      }
      i++;
      continue;
    }
    if (c === '"' && cell.trim() === '') {
      quoted = true;
      quoteLine = line;
      cell = '';
    } else if (c === delimiter) {
      cells.push(cell);
      cell = '';
    } else if (c === '\r' || c === '\n') {
      endRecord();
      if (c === '\r' && text[i + 1] === '\n') i++;
      line++;
      recordLine = line;
    } else {
      cell += c;
    }
    i++;
  }
  if (quoted) return { delimiter, records, unclosedQuoteLine: quoteLine };
  if (cell !== '' || cells.length > 0) endRecord();
  return { delimiter, records };
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
