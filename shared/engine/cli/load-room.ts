/**
 * Reads a room file for the command line: format from the extension, regular files only, size
 * capped, strict UTF-8; CSV is read in chunks and reading stops at the first error, which is
 * reported as one line.
 */
import type { RoomGraph } from '../graph';
import { formatOf, parseNodeLink, parseGraphml, parseRoomCsv, refusalLine, type Issue } from '../io/index';
import { CliError, integerFlag, type Flags } from './args';
import { MAX_FILE_BYTES, readTextFile, shownPath, textChunks } from './read-file';

export interface LoadedRoom {
  readonly graph: RoomGraph;
  readonly warnings: Issue[];
  readonly file: string;
}

export function loadRoom(flags: Flags): LoadedRoom {
  const file = flags.get('graph')!;
  const format = formatOf(file);
  if (!format) throw new CliError(`--graph ${shownPath(file)}: unknown file type; use a .json, .csv or .graphml file`);
  const people = flags.get('people');
  if (people !== undefined && format !== 'csv') throw new CliError('--people goes with a .csv ties file only');
  if (flags.has('directed') && format !== 'csv')
    throw new CliError('--directed goes with a .csv ties file only (JSON and GraphML say it in the file)');
  // The command line reads local files: limits are generous (the server keeps the parsers' defaults).
  const maxPeople = integerFlag(flags, 'max-people', 1, 100_000_000) ?? 1_000_000;
  const options = { directed: flags.has('directed'), maxPeople, maxTies: 50_000_000, maxChars: MAX_FILE_BYTES, maxErrors: 1 };
  const result =
    format === 'csv'
      ? parseRoomCsv(textChunks(file, 'ties'), people === undefined ? undefined : textChunks(people, 'people'), options)
      : format === 'json'
        ? parseNodeLink(readTextFile(file, 'json'), options)
        : parseGraphml(readTextFile(file, 'graphml'), options);
  if (result.errors.length > 0) throw new CliError(`${shownPath(file)}: ${refusalLine(result.errors)}`);
  return { graph: result.graph, warnings: result.warnings, file };
}
