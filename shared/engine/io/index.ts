export * from './issues';
export { readStrength, MIN_STRENGTH, MIN_STRENGTH_RATIO } from './room-builder';
export {
  readCsv,
  detectDelimiter,
  stripBom,
  protectCell,
  unprotectCell,
  quoteCell,
  writeCsvRows,
  type Delimiter,
  type CsvRecord,
} from './csv-text';
export { parseRoomCsv, writeRoomCsv, type RoomCsvFiles } from './csv-room';
export { parseNodeLink, writeNodeLink, type NodeLinkExtras, type JsonScalar } from './node-link';
export { readJson, JsonNumber, JsonObject, JsonSkipped, JSON_MAX_DEPTH, type JsonValue, type JsonReadResult } from './json-reader';
export { parseGraphml, writeGraphml, GRAPHML_DEFAULT_MAX_CHARS } from './graphml';
export { decodeUtf8, type DecodeResult } from './text-limits';
export { formatOf, parseRoom, writeRoom } from './room-file';
export {
  ORG_CHART_DEFAULT_STRENGTHS,
  TEAM_PAIRS_MAX,
  orgChartPreview,
  parseOrgChart,
  writeOrgChart,
  type OrgChartColumns,
  type OrgChartField,
  type OrgChartResult,
  type OrgChartRow,
  type OrgChartStrengths,
} from './org-chart';
