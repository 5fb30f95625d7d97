import type { ImportReport } from './rooms';

/**
 * "From an org chart": a CSV with one row per person and a column naming their manager.
 * Routes (multipart, field `file`): POST /api/rooms/import/org-chart (a new room) and
 * POST /api/rooms/:id/import/org-chart (replace a room's content; form field `version`);
 * `?dryRun=true` (the default) only reports. Form fields: `personColumn`, `managerColumn`,
 * `nameColumn`, `departmentColumn` (header names; without them the server suggests columns
 * from the header), `reportsTo`, `sameManager` (tie strengths), `roomName` (new room).
 * GET /api/rooms/:id/export?format=org-chart-csv writes the same CSV back.
 */
export interface OrgChartColumnsDto {
  person: string;
  manager: string;
  name?: string;
  department?: string;
}

export interface OrgChartStrengthsDto {
  reportsTo: number;
  sameManager: number;
}

export interface OrgChartReport extends ImportReport {
  /** The header and first rows of the file, for the dialog's preview. */
  preview: { columns: string[]; rows: string[][] };
  /** The columns this report was made with (suggested from the header when none were sent). */
  columns: OrgChartColumnsDto | null;
  strengths: OrgChartStrengthsDto;
}

/** Header names the server recognises when it suggests columns (lower case, spaces and _ ignored). */
export const ORG_CHART_HEADER_HINTS = {
  person: ['id', 'personid', 'employeeid', 'employee', 'employeeno', 'employeenumber', 'staffid', 'staffno', 'person', 'key'],
  manager: ['manager', 'managerid', 'reportsto', 'supervisor', 'supervisorid', 'boss', 'linemanager'],
  name: ['name', 'fullname', 'displayname', 'label'],
  department: ['department', 'dept', 'team', 'group', 'unit', 'division'],
} as const;
