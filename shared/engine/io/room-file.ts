/** Chooses the reader or writer by file name extension: .json, .csv or .graphml (also .xml). */
import type { RoomGraph } from '../graph';
import { parseRoomCsv, writeRoomCsv } from './csv-room';
import { parseGraphml, writeGraphml } from './graphml';
import type { ParseOptions, ParseResult, RoomFormat } from './issues';
import { parseNodeLink, writeNodeLink } from './node-link';

export function formatOf(fileName: string): RoomFormat | undefined {
  const ext = /\.([^./\\]+)$/.exec(fileName.toLowerCase())?.[1];
  if (ext === 'json') return 'json';
  if (ext === 'csv' || ext === 'tsv' || ext === 'txt') return 'csv';
  if (ext === 'graphml' || ext === 'xml') return 'graphml';
  return undefined;
}

/** Parses room text of a known format; `peopleText` is the optional people CSV. */
export function parseRoom(format: RoomFormat, text: string, options: ParseOptions = {}, peopleText?: string): ParseResult {
  switch (format) {
    case 'json':
      return parseNodeLink(text, options);
    case 'graphml':
      return parseGraphml(text, options);
    case 'csv':
      return parseRoomCsv(text, peopleText, options);
  }
}

/** Writes a room; CSV gives the ties file here (use writeRoomCsv for both files). */
export function writeRoom(format: RoomFormat, graph: RoomGraph): string {
  switch (format) {
    case 'json':
      return writeNodeLink(graph);
    case 'graphml':
      return writeGraphml(graph);
    case 'csv':
      return writeRoomCsv(graph).ties;
  }
}
