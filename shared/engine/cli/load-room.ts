/** Reads a room file for the command line: format from the extension, strict UTF-8, first error reported. */
import { readFileSync, statSync } from 'node:fs';
import type { RoomGraph } from '../graph';
import { decodeUtf8, describeIssue, formatOf, parseRoom, type Issue } from '../io/index';
import { CliError, integerFlag, type Flags } from './args';

/** Files above this size are refused before reading (the parsers have their own caps too). */
const MAX_FILE_BYTES = 256 * 1024 * 1024;

export interface LoadedRoom {
  readonly graph: RoomGraph;
  readonly warnings: Issue[];
  readonly file: string;
}

export function loadRoom(flags: Flags): LoadedRoom {
  const file = flags.get('graph')!;
  const format = formatOf(file);
  if (!format) throw new CliError(`--graph ${file}: unknown file type; use a .json, .csv or .graphml file`);
  const people = flags.get('people');
  if (people !== undefined && format !== 'csv') throw new CliError('--people goes with a .csv ties file only');
  if (flags.has('directed') && format !== 'csv')
    throw new CliError('--directed goes with a .csv ties file only (JSON and GraphML say it in the file)');
  const text = readText(file, format === 'csv' ? 'ties' : format);
  const peopleText = people === undefined ? undefined : readText(people, 'people');
  // The command line reads local files: limits are generous (the server keeps the parsers' defaults).
  const maxPeople = integerFlag(flags, 'max-people', 1, 100_000_000) ?? 1_000_000;
  const options = { directed: flags.has('directed'), maxPeople, maxTies: 50_000_000, maxChars: MAX_FILE_BYTES };
  const result = parseRoom(format, text, options, peopleText);
  if (result.errors.length > 0) {
    const more = result.errors.length > 1 ? ` (and ${result.errors.length - 1} more problem${result.errors.length > 2 ? 's' : ''})` : '';
    throw new CliError(`${file}: ${describeIssue(result.errors[0])}${more}`);
  }
  return { graph: result.graph, warnings: result.warnings, file };
}

function readText(file: string, what: string): string {
  let bytes: Uint8Array;
  try {
    if (statSync(file).size > MAX_FILE_BYTES) throw new CliError(`${file}: the file is larger than ${MAX_FILE_BYTES / 1024 / 1024} MiB`);
    bytes = readFileSync(file);
  } catch (e) {
    if (e instanceof CliError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    const why =
      code === 'ENOENT'
        ? 'no such file'
        : code === 'EISDIR'
          ? 'is a folder, not a file'
          : code === 'EACCES'
            ? 'permission denied'
            : (e as Error).message;
    throw new CliError(`${file}: cannot read the file (${why})`);
  }
  const decoded = decodeUtf8(bytes, what);
  if (decoded.error) throw new CliError(`${file}: ${describeIssue(decoded.error)}`);
  return decoded.text;
}
