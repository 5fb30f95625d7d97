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

/** Splits CSV text into records; blank lines are skipped. Unquoted cells are sliced, not built char by char. */
export function readCsv(input: string): CsvText {
  const text = stripBom(input);
  const delimiter = detectDelimiter(text);
  const d = delimiter.charCodeAt(0);
  const records: CsvRecord[] = [];
  const len = text.length;
  let cells: string[] = [];
  let line = 1;
  let recordLine = 1;
  let i = 0;
  const endRecord = () => {
    if (!(cells.length === 1 && cells[0].trim() === '')) records.push({ line: recordLine, cells });
    cells = [];
  };
  while (i <= len) {
    // start of a cell: skip leading blanks to see whether it is quoted
    let j = i;
    while (j < len && (text.charCodeAt(j) === 32 || (text.charCodeAt(j) === 9 && d !== 9))) j++;
    let cell: string;
    if (j < len && text.charCodeAt(j) === 34) {
      const quoteLine = line;
      let out = '';
      let from = j + 1;
      let k = from;
      for (;;) {
        const q = text.indexOf('"', k);
        if (q < 0) return { delimiter, records, unclosedQuoteLine: quoteLine };
        for (let p = k; p < q; p++) if (text.charCodeAt(p) === 10) line++;
        if (text.charCodeAt(q + 1) === 34) {
          out += text.slice(from, q + 1);
          from = k = q + 2;
          continue;
        }
        out += text.slice(from, q);
        i = q + 1;
        break;
      }
      // anything after the closing quote up to the delimiter is kept (lenient)
      let e = i;
      while (e < len && text.charCodeAt(e) !== d && text.charCodeAt(e) !== 10 && text.charCodeAt(e) !== 13) e++;
      cell = out + text.slice(i, e);
      i = e;
    } else {
      let e = i;
      while (e < len) {
        const c = text.charCodeAt(e);
        if (c === d || c === 10 || c === 13) break;
        e++;
      }
      cell = text.slice(i, e);
      i = e;
    }
    cells.push(cell);
    if (i >= len) {
      endRecord();
      break;
    }
    const c = text.charCodeAt(i);
    if (c === d) {
      i++;
      continue;
    }
    // line end
    endRecord();
    if (c === 13 && text.charCodeAt(i + 1) === 10) i++;
    i++;
    line++;
    recordLine = line;
    if (i >= len) break;
  }
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
