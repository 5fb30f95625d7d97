import { parse as parseCsv } from 'csv-parse/sync';
import { NAME_MAX, ROSTER_MAX } from '../../shared/api/workshops';

/**
 * A roster CSV: a name column and an optional e-mail column, header row optional (a first
 * row whose cells read "name" / "e-mail" is taken as the header). Each bad row is reported
 * with its line number; good rows are kept.
 */
export interface RosterRow {
  name: string;
  email: string | null;
}
export interface RosterIssue {
  line: number;
  message: string;
}

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

export function parseRoster(text: string): { rows: RosterRow[]; issues: RosterIssue[] } {
  let records: string[][];
  try {
    records = parseCsv(text.replace(/^\uFEFF/, ''), {
      relax_column_count: true,
      skip_empty_lines: true,
      trim: true,
      delimiter: [',', ';', '\t'],
    });
  } catch (err) {
    const e = err as { lines?: number; message?: string };
    return { rows: [], issues: [{ line: e.lines ?? 1, message: `The file is not a readable CSV: ${e.message ?? 'unknown problem'}.` }] };
  }
  const issues: RosterIssue[] = [];
  const rows: RosterRow[] = [];
  let nameCol = 0;
  let emailCol = 1;
  let start = 0;
  const head = (records[0] ?? []).map((c) => c.toLowerCase().replace(/[^a-z]/g, ''));
  if (head.includes('name') || head.includes('email')) {
    nameCol = head.indexOf('name') >= 0 ? head.indexOf('name') : 0;
    emailCol = head.indexOf('email');
    start = 1;
  }
  const seen = new Set<string>();
  for (const [i, record] of records.entries()) {
    if (i < start) continue;
    const line = i + 1;
    const name = (record[nameCol] ?? '').trim();
    const email = emailCol >= 0 ? (record[emailCol] ?? '').trim() : '';
    if (!name) issues.push({ line, message: 'The name is empty.' });
    else if (name.length > NAME_MAX) issues.push({ line, message: `The name is longer than ${NAME_MAX} characters.` });
    else if (email && !EMAIL.test(email)) issues.push({ line, message: `“${email}” is not an e-mail address.` });
    else if (seen.has(name.toLowerCase()))
      issues.push({ line, message: `“${name}” is listed twice; names must be unique so people can find their own.` });
    else {
      seen.add(name.toLowerCase());
      rows.push({ name, email: email ? email.toLowerCase() : null });
    }
  }
  if (rows.length > ROSTER_MAX) issues.push({ line: ROSTER_MAX + start + 1, message: `A roster can hold at most ${ROSTER_MAX} people.` });
  if (!rows.length && !issues.length) issues.push({ line: 1, message: 'The file has no names.' });
  return { rows: rows.slice(0, ROSTER_MAX), issues };
}
