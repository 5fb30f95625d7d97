/**
 * Org-chart CSV: one row per person and a column naming their manager (by the manager's
 * person id). The caller says which header is which (the import dialog lets the user pick).
 * The room built from it has an undirected tie between each manager and each of their
 * reports, and one between every two people who share a manager, with strengths the user
 * sets; a department column, when named, gives the groups. Reporting lines that loop, name
 * a manager who is not in the file, or list a person twice are errors with their CSV line.
 * Cost: O(rows + ties); the same-manager ties grow with the square of a team's size, so a
 * team over TEAM_PAIRS_MAX members gets no same-manager ties (a warning says so).
 */
import type { RoomGraph, RoomTie } from '../graph';
import { readCsv, unprotectCell, writeCsvRows, type CsvRecord, type Delimiter } from './csv-text';
import { DEFAULT_LIMITS, IssueList, type ParseOptions, type ParseResult } from './issues';
import { checkTextSize } from './text-limits';

export interface OrgChartColumns {
  /** Header of the person id column (required). */
  readonly person: string;
  /** Header of the manager column: the manager's person id, empty at the top (required). */
  readonly manager: string;
  readonly name?: string;
  readonly department?: string;
}

export interface OrgChartStrengths {
  /** Between a manager and each of their reports. */
  readonly reportsTo: number;
  /** Between two people with the same manager. */
  readonly sameManager: number;
}

/** A starting point to edit on the map: a report talks with their manager about three times as often as with one peer. */
export const ORG_CHART_DEFAULT_STRENGTHS: OrgChartStrengths = { reportsTo: 3, sameManager: 1 };

/** A team larger than this gets no peer ties (n(n-1)/2 of them would swamp the room). */
export const TEAM_PAIRS_MAX = 200;

export type OrgChartField = 'person' | 'name' | 'manager' | 'department';

export interface OrgChartResult extends ParseResult {
  /** Per person (graph order): the manager's person id, or null at the top. */
  readonly managers: readonly (string | null)[];
  /** The chosen columns in the file's order, so an export writes them back the same way. */
  readonly order: readonly OrgChartField[];
}

/** The header and the first rows, for the dialog's preview and column pickers. */
export function orgChartPreview(text: string, rows = 5): { columns: string[]; rows: string[][]; delimiter: Delimiter } {
  const csv = readCsv(text);
  const [header, ...rest] = csv.records;
  return {
    columns: (header?.cells ?? []).map((c) => c.trim()),
    rows: rest.slice(0, rows).map((r) => r.cells.map((c) => unprotectCell(c.trim()))),
    delimiter: csv.delimiter,
  };
}

export function parseOrgChart(
  text: string,
  columns: OrgChartColumns,
  strengths: OrgChartStrengths = ORG_CHART_DEFAULT_STRENGTHS,
  options: ParseOptions = {},
): OrgChartResult {
  const issues = new IssueList('org chart');
  const empty: OrgChartResult = {
    graph: { ids: [], directed: false, ties: [] },
    managers: [],
    order: [],
    warnings: issues.warnings,
    errors: issues.errors,
    meta: { format: 'csv' },
  };
  if (!checkTextSize(text, options, issues)) return empty;
  const csv = readCsv(text);
  if (csv.unclosedQuoteLine !== undefined) {
    issues.error('syntax', 'a quoted cell starts here but its closing quote (") is missing', { line: csv.unclosedQuoteLine });
    return empty;
  }
  const col = columnIndexes(csv.records[0], columns, issues);
  if (issues.errors.length) return { ...empty, meta: { format: 'csv', delimiter: csv.delimiter } };

  const people = readPeople(csv.records.slice(1), col, columns.person, options.maxPeople ?? DEFAULT_LIMITS.maxPeople, issues);
  const { ids, labels, groups, managerOf, lines } = people;
  if (!ids.length && !issues.errors.length) issues.error('empty-room', 'the file has a header but no people', { line: 1 });
  const parent = managerIndexes(people, columns.manager, issues);
  reportCycles(parent, ids, lines, columns.manager, issues);

  const ties = buildTies(parent, strengths, options, issues, ids);
  const graph: RoomGraph = { ids, labels, groups, directed: false, ties };
  issues.finish();
  const order = (Object.keys(col) as OrgChartField[]).filter((k) => col[k] >= 0).sort((a, b) => col[a] - col[b]);
  return {
    graph,
    managers: managerOf,
    order,
    warnings: issues.warnings,
    errors: issues.errors,
    meta: { format: 'csv', delimiter: csv.delimiter },
  };
}

type ColumnIndexes = Record<OrgChartField, number>;

/** Where each chosen column stands in the header (-1 when not chosen); an error for each chosen one that is missing. */
function columnIndexes(header: CsvRecord | undefined, columns: OrgChartColumns, issues: IssueList): ColumnIndexes {
  const at = (name: string | undefined) => (name === undefined ? -1 : (header?.cells.findIndex((c) => c.trim() === name) ?? -1));
  const col = { person: at(columns.person), manager: at(columns.manager), name: at(columns.name), department: at(columns.department) };
  for (const [key, label] of [
    ['person', columns.person],
    ['manager', columns.manager],
    ['name', columns.name],
    ['department', columns.department],
  ] as const) {
    if (label !== undefined && col[key] < 0)
      issues.error('missing-column', `the header has no column "${label}" (chosen as the ${key} column)`, { line: header?.line ?? 1 });
  }
  return col;
}

/** The rows' people in file order (blank rows skipped), with their manager cells and CSV lines. */
interface OrgChartPeople {
  readonly ids: string[];
  readonly labels: string[];
  readonly groups: (string | null)[];
  readonly managerOf: (string | null)[];
  readonly lines: number[];
  /** Position in `ids`, by person id. */
  readonly index: Map<string, number>;
}

function readPeople(
  records: readonly CsvRecord[],
  col: ColumnIndexes,
  personField: string,
  maxPeople: number,
  issues: IssueList,
): OrgChartPeople {
  const people: OrgChartPeople = { ids: [], labels: [], groups: [], managerOf: [], lines: [], index: new Map() };
  const { ids, index, lines } = people;
  const cell = (cells: readonly string[], i: number) => (i < 0 || i >= cells.length ? '' : unprotectCell(cells[i].trim()));
  for (const record of records) {
    if (record.cells.every((c) => c.trim() === '')) continue;
    const id = cell(record.cells, col.person);
    const where = { line: record.line, field: personField };
    if (!id) {
      issues.error('missing-field', `the ${personField} cell is empty; give every person an id`, where);
      continue;
    }
    if (index.has(id)) {
      issues.error('duplicate-person', `"${id}" is listed twice (first on line ${lines[index.get(id)!]}); keep one row per person`, where);
      continue;
    }
    if (ids.length >= maxPeople) {
      issues.error('room-too-large', `more than ${maxPeople} people; split the org chart`, where);
      break;
    }
    index.set(id, ids.length);
    ids.push(id);
    people.labels.push(cell(record.cells, col.name) || id);
    people.groups.push(cell(record.cells, col.department) || null);
    people.managerOf.push(cell(record.cells, col.manager) || null);
    lines.push(record.line);
  }
  return people;
}

/** Each person's manager as a position (-1 at the top); managers must be other people of the file. */
function managerIndexes(people: OrgChartPeople, field: string, issues: IssueList): Int32Array {
  const { ids, lines, index } = people;
  const parent = new Int32Array(ids.length).fill(-1);
  people.managerOf.forEach((m, i) => {
    if (m === null) return;
    const j = index.get(m);
    const where = { line: lines[i], field };
    if (j === undefined) issues.error('unknown-id', `the manager "${m}" of "${ids[i]}" is not a person in this file`, where);
    else if (j === i) issues.error('reporting-cycle', `"${ids[i]}" is named as their own manager; leave the cell empty at the top`, where);
    else parent[i] = j;
  });
  return parent;
}

/** Follows each chain of managers; a chain that comes back to itself is reported once, on each of its rows. */
function reportCycles(parent: Int32Array, ids: string[], lines: number[], field: string, issues: IssueList): void {
  const state = new Uint8Array(parent.length); // 0 new, 1 on the current chain, 2 done
  for (let start = 0; start < parent.length; start++) {
    const chain: number[] = [];
    let i = start;
    while (i >= 0 && state[i] === 0) {
      state[i] = 1;
      chain.push(i);
      i = parent[i];
    }
    if (i >= 0 && state[i] === 1) {
      const loop = chain.slice(chain.indexOf(i));
      const names = [...loop, i].map((k) => `"${ids[k]}"`).join(' → ');
      for (const k of loop)
        issues.error('reporting-cycle', `the reporting line loops: ${names}; one of them needs another manager`, { line: lines[k], field });
    }
    for (const k of chain) state[k] = 2;
  }
}

function buildTies(parent: Int32Array, s: OrgChartStrengths, options: ParseOptions, issues: IssueList, ids: string[]): RoomTie[] {
  const ties: RoomTie[] = [];
  const teams = new Map<number, number[]>();
  parent.forEach((m, i) => {
    if (m < 0) return;
    ties.push({ source: m, target: i, strength: s.reportsTo });
    const team = teams.get(m);
    if (team) team.push(i);
    else teams.set(m, [i]);
  });
  for (const [m, team] of teams) {
    if (team.length > TEAM_PAIRS_MAX) {
      issues.warn(
        'no-ties',
        `"${ids[m]}" has ${team.length} reports: no ties among them were made (more than ${TEAM_PAIRS_MAX}); add the ones that matter on the map`,
        {},
      );
      continue;
    }
    for (let a = 0; a < team.length; a++)
      for (let b = a + 1; b < team.length; b++) ties.push({ source: team[a], target: team[b], strength: s.sameManager });
  }
  const maxTies = options.maxTies ?? DEFAULT_LIMITS.maxTies;
  if (ties.length > maxTies)
    issues.error('room-too-large', `the org chart makes ${ties.length} ties, more than the ${maxTies} a room may hold`, {});
  return ties;
}

export interface OrgChartRow {
  readonly key: string;
  readonly name: string;
  readonly manager: string | null;
  readonly group: string | null;
}

/**
 * Writes rows back with the headers, and in the column order, the file was imported with
 * (a name column is added when the file had none); formula-like cells are protected.
 */
export function writeOrgChart(rows: readonly OrgChartRow[], columns: OrgChartColumns, order?: readonly OrgChartField[]): string {
  const fields: OrgChartField[] = [...(order?.length ? order : (['person', 'name', 'manager', 'department'] as const))];
  if (!fields.includes('name')) fields.splice(1, 0, 'name');
  const used = fields.filter((f) => f !== 'department' || columns.department);
  const header = used.map((f) => (f === 'name' ? (columns.name ?? 'name') : columns[f]!));
  const value = (r: OrgChartRow, f: OrgChartField) =>
    f === 'person' ? r.key : f === 'name' ? r.name : f === 'manager' ? (r.manager ?? '') : (r.group ?? '');
  return writeCsvRows([header, ...rows.map((r) => used.map((f) => value(r, f)))]);
}
