/**
 * CSV rooms: a ties file (`source,target[,strength]` header) and an optional people file
 * (`id,name[,group]` header). Without a people file, people are taken from the ties in order of
 * first appearance. Cells may be protected by a leading quote against formula injection; the
 * quote is removed on reading (see csv-text.ts).
 */
import type { RoomGraph } from '../graph';
import { CsvReader, unprotectCell, writeCsvRows, type CsvRecord, type Delimiter } from './csv-text';
import { IssueList, type ParseOptions, type ParseResult } from './issues';
import { RoomBuilder } from './room-builder';
import { checkTextSize } from './text-limits';

const TIE_COLUMNS = { source: ['source', 'from'], target: ['target', 'to'], strength: ['strength', 'weight'] };
const PEOPLE_COLUMNS = { id: ['id'], name: ['name', 'label'], group: ['group'] };

/** CSV text, whole or in pieces (the command line reads files in chunks and stops at the first error). */
export type CsvInput = string | Iterable<string>;

export function parseRoomCsv(tiesText: CsvInput, peopleText?: CsvInput, options: ParseOptions = {}): ParseResult {
  const issues = new IssueList('ties', 500, options.maxErrors);
  const builder = new RoomBuilder(issues, options);
  const directed = options.directed ?? false;
  let delimiter: Delimiter = ',';
  const sized = (input: CsvInput, file: string) => typeof input !== 'string' || checkTextSize(input, options, issues, file);

  if (peopleText !== undefined && sized(peopleText, 'people')) {
    readTable(peopleText, 'people', PEOPLE_COLUMNS, ['id'], issues, (row) => {
      builder.addPerson(row.get('id'), nonEmpty(row.get('name')), nonEmpty(row.get('group')), { file: 'people', line: row.line });
    });
  }
  if (!issues.full && sized(tiesText, 'ties')) {
    const implicit = peopleText === undefined;
    delimiter = readTable(tiesText, 'ties', TIE_COLUMNS, ['source', 'target'], issues, (row, table) => {
      builder.addTie(
        row.get('source'),
        row.get('target'),
        row.get('strength'),
        { file: 'ties', line: row.line },
        { source: table.names.get('source')!, target: table.names.get('target')!, strength: table.names.get('strength') ?? 'strength' },
        directed,
        implicit,
        table.delimiter === ';',
      );
    });
  }
  const graph = builder.finish(directed, 'ties');
  issues.finish();
  return { graph, warnings: issues.warnings, errors: issues.errors, meta: { format: 'csv', delimiter } };
}

interface Row {
  readonly line: number;
  get(column: string): string | undefined;
}

interface Table {
  readonly delimiter: Delimiter;
  /** Canonical column -> the header text used in the file. */
  readonly names: Map<string, string>;
}

/** Reads the header, then hands each complete row to `onRow`, one at a time; stops once the error list is full. */
function readTable(
  input: CsvInput,
  file: string,
  columns: Record<string, string[]>,
  required: string[],
  issues: IssueList,
  onRow: (row: Row, table: Table) => void,
): Delimiter {
  const reader = new CsvReader();
  const records = reader.records(typeof input === 'string' ? [input] : input);
  const first = records.next();
  const header = first.done ? undefined : first.value;
  const table = header ? readHeader(header, reader.delimiter, file, columns, required, issues) : undefined;
  if (!header && !reader.stop) {
    issues.error('missing-column', `the file is empty; the first line must be a header such as ${required.join(',')}`, { file, line: 1 });
  }
  if (table) {
    const position = table.position;
    for (const record of records) {
      const cells = record.cells;
      let complete = true;
      for (const k of required) {
        const at = position.get(k)!;
        if (at >= cells.length) {
          complete = false;
          const n = cells.length;
          issues.error('missing-field', `this row has no ${table.names.get(k)} value (it has ${n} cell${n === 1 ? '' : 's'})`, {
            file,
            line: record.line,
            field: table.names.get(k),
          });
        }
      }
      if (complete) {
        onRow(
          {
            line: record.line,
            get: (column) => {
              const at = position.get(column);
              return at === undefined || at >= cells.length ? undefined : unprotectCell(cells[at]);
            },
          },
          table,
        );
      }
      if (issues.full) break;
    }
  }
  if (reader.stop && !issues.full) {
    const message =
      reader.stop.problem === 'unclosed-quote'
        ? 'a quoted cell starts here but its closing quote (") is missing'
        : 'this row is longer than 1 MiB; a closing quote (") is probably missing';
    issues.error('syntax', message, { file, line: reader.stop.line });
  }
  return reader.delimiter;
}

function readHeader(
  header: CsvRecord,
  delimiter: Delimiter,
  file: string,
  columns: Record<string, string[]>,
  required: string[],
  issues: IssueList,
): (Table & { position: Map<string, number> }) | undefined {
  if (delimiter !== ',') {
    const name = delimiter === ';' ? 'semicolons (;)' : 'tabs';
    issues.warn('delimiter', `columns are separated by ${name}, not commas; read that way`, { file, line: header.line });
  }
  const position = new Map<string, number>();
  const names = new Map<string, string>();
  header.cells.forEach((cell, at) => {
    const key = Object.keys(columns).find((k) => columns[k].includes(cell.toLowerCase()));
    if (key && !position.has(key)) {
      position.set(key, at);
      names.set(key, cell);
    } else if (cell !== '') {
      issues.warn('ignored-column', `column "${clipCell(cell)}" is not used (expected ${Object.keys(columns).join(', ')})`, {
        file,
        line: header.line,
        field: clipCell(cell),
      });
    }
  });
  const missing = required.filter((k) => !position.has(k));
  if (missing.length > 0) {
    issues.error(
      'missing-column',
      `the header has no ${missing.join(' or ')} column; the first line must name the columns, e.g. ${Object.keys(columns).join(delimiter)}`,
      { file, line: header.line },
    );
    return undefined;
  }
  return { delimiter, names, position };
}

function clipCell(cell: string): string {
  return cell.length > 40 ? `${cell.slice(0, 40)}...` : cell;
}

function nonEmpty(s: string | undefined): string | undefined {
  return s === undefined || s === '' ? undefined : s;
}

export interface RoomCsvFiles {
  readonly people: string;
  readonly ties: string;
  /** CSV carries no direction: read the ties back with `{ directed }`. */
  readonly directed: boolean;
}

/** Writes the people and ties files; cells are protected against formula injection. */
export function writeRoomCsv(graph: RoomGraph): RoomCsvFiles {
  const peopleRows: string[][] = [['id', 'name', 'group']];
  graph.ids.forEach((id, i) => peopleRows.push([id, graph.labels?.[i] ?? '', graph.groups?.[i] ?? '']));
  const tieRows: string[][] = [['source', 'target', 'strength']];
  for (const t of graph.ties) tieRows.push([graph.ids[t.source], graph.ids[t.target], String(t.strength)]);
  return { people: writeCsvRows(peopleRows), ties: writeCsvRows(tieRows), directed: graph.directed };
}
