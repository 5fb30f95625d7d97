/**
 * CSV rooms: a ties file (`source,target[,strength]` header) and an optional people file
 * (`id,name[,group]` header). Without a people file, people are taken from the ties in order of
 * first appearance. Cells may be protected by a leading quote against formula injection; the
 * quote is removed on reading (see csv-text.ts).
 */
import type { RoomGraph } from '../graph';
import { readCsv, unprotectCell, writeCsvRows, type CsvText, type Delimiter } from './csv-text';
import { IssueList, type ParseOptions, type ParseResult } from './issues';
import { RoomBuilder } from './room-builder';
import { checkTextSize } from './text-limits';

const TIE_COLUMNS = { source: ['source', 'from'], target: ['target', 'to'], strength: ['strength', 'weight'] };
const PEOPLE_COLUMNS = { id: ['id'], name: ['name', 'label'], group: ['group'] };

export function parseRoomCsv(tiesText: string, peopleText?: string, options: ParseOptions = {}): ParseResult {
  const issues = new IssueList('ties');
  const builder = new RoomBuilder(issues, options, true);
  const directed = options.directed ?? false;
  let delimiter: Delimiter = ',';

  if (peopleText !== undefined && checkTextSize(peopleText, options, issues, 'people')) {
    const people = readTable(peopleText, 'people', PEOPLE_COLUMNS, ['id'], issues);
    if (people) {
      for (const row of people.rows) {
        builder.addPerson(row.get('id'), nonEmpty(row.get('name')), nonEmpty(row.get('group')), { file: 'people', line: row.line });
      }
    }
  }
  if (checkTextSize(tiesText, options, issues, 'ties')) {
    const ties = readTable(tiesText, 'ties', TIE_COLUMNS, ['source', 'target'], issues);
    if (ties) {
      delimiter = ties.delimiter;
      const implicit = peopleText === undefined;
      for (const row of ties.rows) {
        builder.addTie(
          row.get('source'),
          row.get('target'),
          row.get('strength'),
          { file: 'ties', line: row.line },
          { source: ties.names.get('source')!, target: ties.names.get('target')!, strength: ties.names.get('strength') ?? 'strength' },
          directed,
          implicit,
          delimiter === ';',
        );
      }
    }
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
  readonly rows: Row[];
}

function readTable(
  text: string,
  file: string,
  columns: Record<string, string[]>,
  required: string[],
  issues: IssueList,
): Table | undefined {
  const csv: CsvText = readCsv(text);
  if (csv.unclosedQuoteLine !== undefined) {
    issues.error('syntax', 'a quoted cell starts here but its closing quote (") is missing', { file, line: csv.unclosedQuoteLine });
    return undefined;
  }
  if (csv.delimiter !== ',') {
    const name = csv.delimiter === ';' ? 'semicolons (;)' : 'tabs';
    issues.warn('delimiter', `columns are separated by ${name}, not commas; read that way`, { file, line: csv.records[0]?.line ?? 1 });
  }
  const header = csv.records[0];
  if (!header) {
    issues.error('missing-column', `the file is empty; the first line must be a header such as ${required.join(',')}`, { file, line: 1 });
    return undefined;
  }
  const position = new Map<string, number>();
  const names = new Map<string, string>();
  header.cells.forEach((raw, at) => {
    const cell = raw.trim();
    const key = Object.keys(columns).find((k) => columns[k].includes(cell.toLowerCase()));
    if (key && !position.has(key)) {
      position.set(key, at);
      names.set(key, cell);
    } else if (cell !== '') {
      issues.warn('ignored-column', `column "${cell}" is not used (expected ${Object.keys(columns).join(', ')})`, {
        file,
        line: header.line,
        field: cell,
      });
    }
  });
  const missing = required.filter((k) => !position.has(k));
  if (missing.length > 0) {
    issues.error(
      'missing-column',
      `the header has no ${missing.join(' or ')} column; the first line must name the columns, e.g. ${Object.keys(columns).join(csv.delimiter)}`,
      { file, line: header.line },
    );
    return undefined;
  }
  const rows: Row[] = [];
  for (const record of csv.records.slice(1)) {
    const cells = record.cells;
    rows.push({
      line: record.line,
      get: (column) => {
        const at = position.get(column);
        return at === undefined || at >= cells.length ? undefined : unprotectCell(cells[at].trim());
      },
    });
    for (const k of required) {
      const at = position.get(k)!;
      if (at >= cells.length) {
        issues.error(
          'missing-field',
          `this row has no ${names.get(k)} value (it has ${cells.length} cell${cells.length === 1 ? '' : 's'})`,
          {
            file,
            line: record.line,
            field: names.get(k),
          },
        );
      }
    }
  }
  return { delimiter: csv.delimiter, names, rows: rows.filter((r) => required.every((k) => r.get(k) !== undefined)) };
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
