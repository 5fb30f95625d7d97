/**
 * "From an org chart": reads an uploaded org-chart CSV with the columns the user chose (or
 * columns suggested from the header), builds the room with the engine's org-chart reader,
 * and writes the same CSV back on export. No HTTP here (org-chart-routes.ts) and no SQL (store.ts).
 */
import {
  decodeUtf8,
  ORG_CHART_DEFAULT_STRENGTHS,
  orgChartPreview,
  parseOrgChart,
  writeOrgChart,
  type OrgChartField,
  type RoomGraph,
} from '../../shared/engine/index';
import {
  ORG_CHART_HEADER_HINTS,
  type OrgChartColumnsDto,
  type OrgChartReport,
  type OrgChartStrengthsDto,
} from '../../shared/api/org-chart';
import { ROOM_LIMITS as L, type ImportIssue } from '../../shared/api/rooms';
import type { Upload } from './import';
import type { PersonRowInput, TieRowInput } from './store';

export interface OrgChartRead {
  report: OrgChartReport;
  content: { people: PersonRowInput[]; ties: TieRowInput[] };
  /** Stored with the room, so the export writes the same headers in the same order. */
  saved: string | null;
}

/** The header a hint list recognises, if any (case, spaces, dashes and underscores ignored). */
function suggest(columns: string[], hints: readonly string[], taken: Set<string>): string | undefined {
  const plain = (s: string) => s.toLowerCase().replace(/[\s_-]+/g, '');
  return columns.find((c) => !taken.has(c) && hints.includes(plain(c)));
}

export function suggestColumns(columns: string[]): OrgChartColumnsDto | null {
  const taken = new Set<string>();
  const pick = (hints: readonly string[]) => {
    const c = suggest(columns, hints, taken);
    if (c) taken.add(c);
    return c;
  };
  const manager = pick(ORG_CHART_HEADER_HINTS.manager);
  const person = pick(ORG_CHART_HEADER_HINTS.person);
  const name = pick(ORG_CHART_HEADER_HINTS.name);
  const department = pick(ORG_CHART_HEADER_HINTS.department);
  if (!person || !manager) return null;
  return { person, manager, ...(name ? { name } : {}), ...(department ? { department } : {}) };
}

export function readOrgChart(
  file: Upload,
  chosen: OrgChartColumnsDto | null,
  strengths: OrgChartStrengthsDto,
  dryRun: boolean,
): OrgChartRead {
  const base = {
    format: 'csv' as const,
    dryRun,
    committed: false,
    directed: false,
    strengths,
  };
  const decoded = decodeUtf8(file.bytes, 'org chart');
  if (decoded.error) return refused(base, { ...decoded.error }, { columns: [], rows: [] }, chosen);
  const preview = orgChartPreview(decoded.text);
  const columns = chosen ?? suggestColumns(preview.columns);
  if (!columns) {
    const error: ImportIssue = {
      severity: 'error',
      code: 'missing-column',
      file: 'org chart',
      line: 1,
      message: 'choose which column holds the person id and which one names their manager',
    };
    return refused(base, error, { columns: preview.columns, rows: preview.rows }, null);
  }
  const result = parseOrgChart(decoded.text, columns, strengths, {
    maxPeople: L.maxPeople,
    maxTies: L.maxTies,
    maxChars: L.maxUploadBytes,
  });
  const { graph } = result;
  const errors: ImportIssue[] = result.errors.map((e) => ({ ...e }));
  errors.push(...tooLong(graph));
  const report: OrgChartReport = {
    ...base,
    counts: { people: graph.ids.length, ties: graph.ties.length, groups: new Set(graph.groups?.filter((g) => g)).size },
    warnings: result.warnings.map((w) => ({ ...w })),
    errors,
    preview: { columns: preview.columns, rows: preview.rows },
    columns,
  };
  const people: PersonRowInput[] = graph.ids.map((key, i) => ({
    key,
    name: graph.labels?.[i] ?? key,
    group: graph.groups?.[i] || null,
    email: null,
    x: null,
    y: null,
    pinned: false,
    managerKey: result.managers[i],
  }));
  const ties: TieRowInput[] = graph.ties.map((t) => ({ source: t.source, target: t.target, strength: t.strength }));
  return { report, content: { people, ties }, saved: JSON.stringify({ columns, order: result.order }) };
}

type ReportBase = Pick<OrgChartReport, 'format' | 'dryRun' | 'committed' | 'directed' | 'strengths'>;

/** A file refused before any row was read: the one error, and the preview so far. */
function refused(
  base: ReportBase,
  error: ImportIssue,
  preview: OrgChartReport['preview'],
  columns: OrgChartColumnsDto | null,
): OrgChartRead {
  return {
    report: { ...base, counts: { people: 0, ties: 0, groups: 0 }, warnings: [], errors: [error], preview, columns },
    content: { people: [], ties: [] },
    saved: null,
  };
}

/** Ids, names and departments longer than the room's columns hold (at most 200 errors in all). */
function tooLong(graph: RoomGraph): ImportIssue[] {
  const errors: ImportIssue[] = [];
  const add = (message: string) => errors.push({ severity: 'error', code: 'too-long', file: 'org chart', message });
  graph.ids.forEach((id, i) => {
    if (errors.length >= 200) return;
    if (id.length > L.personKeyMax) add(`the id "${id.slice(0, 40)}..." is longer than ${L.personKeyMax} characters`);
    if ((graph.labels?.[i] ?? '').length > L.personNameMax)
      add(`the name of "${id.slice(0, 40)}" is longer than ${L.personNameMax} characters`);
    if ((graph.groups?.[i] ?? '').length > L.groupMax)
      add(`the department of "${id.slice(0, 40)}" is longer than ${L.groupMax} characters`);
  });
  return errors;
}

export const DEFAULT_STRENGTHS: OrgChartStrengthsDto = { ...ORG_CHART_DEFAULT_STRENGTHS };

/** The org-chart CSV of a room: its manager keys, under the headers it was imported with (or plain ones). */
export function writeRoomOrgChart(
  people: { key: string; name: string; group: string | null; managerKey: string | null }[],
  saved: string | null,
): string {
  let columns: OrgChartColumnsDto = { person: 'id', name: 'name', manager: 'manager', department: 'department' };
  let order: OrgChartField[] | undefined;
  try {
    if (saved) ({ columns, order } = JSON.parse(saved) as { columns: OrgChartColumnsDto; order: OrgChartField[] });
  } catch {
    // A damaged note falls back to plain headers; the people and managers are still written.
  }
  const keys = new Set(people.map((p) => p.key));
  // A manager deleted on the map since the import is no longer named.
  const rows = people.map((p) => ({
    key: p.key,
    name: p.name,
    group: p.group,
    manager: p.managerKey && keys.has(p.managerKey) ? p.managerKey : null,
  }));
  return writeOrgChart(rows, columns, order);
}
