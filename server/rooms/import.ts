/**
 * Import: an upload (multer, memory storage, size and type limits) is decoded as strict
 * UTF-8, read by the engine's parsers (people CSV + ties CSV, GraphML, node-link JSON), checked
 * against the product's limits, and either reported (dry run) or written in one transaction
 * that replaces the room's content, or nothing.
 */
import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import { decodeUtf8, formatOf, parseRoom, type Issue, type ParseResult, type RoomGraph } from '../../shared/engine/index';
import { ROOM_LIMITS as L, type ImportFormat, type ImportIssue, type ImportReport, type RoomSettings } from '../../shared/api/rooms';
import { config } from '../config';
import { HttpError } from '../core/http-error';
import type { PersonRowInput, TieRowInput } from './store';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: L.maxUploadBytes, files: 2, fields: 10, fieldSize: 1024, parts: 14 },
});

const MB = (L.maxUploadBytes / (1024 * 1024)).toFixed(0);

/** Accepts the fields `file` and `people`; maps multer's limits to clear messages. */
export function receiveUpload(req: Request, res: Response, next: NextFunction): void {
  upload.fields([
    { name: 'file', maxCount: 1 },
    { name: 'people', maxCount: 1 },
  ])(req, res, (err: unknown) => {
    if (!err) return next();
    const e = err as { code?: string; field?: string };
    if (e.code === 'LIMIT_FILE_SIZE') {
      return next(
        new HttpError(
          413,
          'too_large',
          `The file ${e.field ? `"${e.field}" ` : ''}is larger than ${MB} MB, the upload limit. Split the room or remove unused columns.`,
        ),
      );
    }
    if (e.code === 'LIMIT_UNEXPECTED_FILE') {
      return next(
        new HttpError(
          400,
          'bad_upload',
          `Unexpected file field "${e.field}": send the room as "file" and an optional people CSV as "people".`,
        ),
      );
    }
    if (e.code?.startsWith('LIMIT_'))
      return next(new HttpError(400, 'bad_upload', `The upload was refused (${e.code}): send one room file and at most one people file.`));
    // busboy's errors (a cut-off or malformed multipart body) are the client's, not ours.
    next(new HttpError(400, 'bad_upload', 'The upload arrived incomplete or malformed: choose the file again and retry.'));
  });
}

export interface Upload {
  name: string;
  bytes: Buffer;
}

export function uploadedFiles(req: Request): { file: Upload; people?: Upload } {
  const files = (req.files ?? {}) as Record<string, Express.Multer.File[]>;
  const file = files['file']?.[0];
  if (!file) {
    throw new HttpError(400, 'bad_upload', 'Choose a file to import (field "file"): a ties CSV, a GraphML file or a node-link JSON file.');
  }
  const people = files['people']?.[0];
  return {
    file: { name: file.originalname, bytes: file.buffer },
    people: people ? { name: people.originalname, bytes: people.buffer } : undefined,
  };
}

const TYPE_HINT = 'Import a .csv (ties, plus an optional people .csv), .graphml or .json (node-link) file.';

/** Picks the format from the field or file name, and checks the content looks like it. */
export function formatFor(file: Upload, declared: ImportFormat | undefined): ImportFormat {
  const byName = formatOf(file.name);
  const format = declared ?? byName;
  if (!format) throw new HttpError(415, 'unsupported_type', `"${file.name}" is not a file type Ripplehall reads. ${TYPE_HINT}`);
  const head = file.bytes
    .subarray(0, 512)
    .toString('utf8')
    .replace(/^\uFEFF/, '')
    .trimStart();
  if (/^(%PDF|PK\u0003\u0004|\u00D0\u00CF)/.test(head) || file.bytes.subarray(0, 512).includes(0)) {
    throw new HttpError(
      415,
      'unsupported_type',
      `"${file.name}" is a binary file (a spreadsheet workbook or PDF?). Save it as CSV UTF-8 first. ${TYPE_HINT}`,
    );
  }
  if (format === 'json' && head.startsWith('<')) {
    throw new HttpError(415, 'unsupported_type', `"${file.name}" looks like XML, not JSON: name it .graphml, or export node-link JSON.`);
  }
  if (format === 'graphml' && (head.startsWith('{') || head.startsWith('['))) {
    throw new HttpError(415, 'unsupported_type', `"${file.name}" looks like JSON, not GraphML: name it .json.`);
  }
  return format;
}

export interface ParsedImport {
  format: ImportFormat;
  graph: RoomGraph;
  warnings: ImportIssue[];
  errors: ImportIssue[];
  /** Layout and settings carried by node-link JSON written by Ripplehall. */
  extras: FileExtras;
}

export interface FileExtras {
  layout: Map<string, { x: number | null; y: number | null; pinned: boolean }>;
  settings: Partial<RoomSettings>;
  name?: string;
}

const asIssue = (i: Issue): ImportIssue => ({ ...i });

/** Decodes and parses; never throws for bad content (it becomes errors in the report). */
export function readImport(file: Upload, people: Upload | undefined, format: ImportFormat, directed: boolean | undefined): ParsedImport {
  const decoded = decodeUtf8(file.bytes, format === 'csv' ? 'ties' : format);
  const decodedPeople = people ? decodeUtf8(people.bytes, 'people') : undefined;
  const empty: RoomGraph = { ids: [], directed: false, ties: [] };
  const extras: FileExtras = { layout: new Map(), settings: {} };
  const encodingErrors = [decoded.error, decodedPeople?.error].filter((e): e is Issue => e !== undefined);
  if (encodingErrors.length > 0) return { format, graph: empty, warnings: [], errors: encodingErrors.map(asIssue), extras };
  if (people && format !== 'csv') {
    return {
      format,
      graph: empty,
      warnings: [],
      errors: [
        {
          severity: 'error',
          code: 'syntax',
          message: 'A people CSV goes with a ties CSV only; GraphML and JSON files hold the people themselves.',
        },
      ],
      extras,
    };
  }
  const result: ParseResult = parseRoom(
    format,
    decoded.text!,
    { maxPeople: config.MAX_ROOM_PEOPLE, maxTies: config.MAX_ROOM_TIES, maxStrength: L.maxStrength, maxChars: L.maxUploadBytes, directed },
    decodedPeople?.text,
  );
  const errors = result.errors.map(asIssue);
  errors.push(...checkLengths(result.graph, format));
  if (format === 'json' && errors.length === 0) readJsonExtras(result, extras);
  return { format, graph: result.graph, warnings: result.warnings.map(asIssue), errors, extras };
}

/** The engine accepts any text; the database and the screens have limits. */
function checkLengths(graph: RoomGraph, format: ImportFormat): ImportIssue[] {
  const out: ImportIssue[] = [];
  const file = format === 'csv' ? 'people' : format;
  const add = (message: string, field: string) =>
    out.length < 200 && out.push({ severity: 'error', code: 'too-long', file, field, message });
  graph.ids.forEach((id, i) => {
    if (id.length > L.personKeyMax)
      add(`the person id "${id.slice(0, 40)}..." is longer than ${L.personKeyMax} characters; shorten it`, 'id');
    else if (/[\r\n\t]/.test(id)) add(`the person id "${id.slice(0, 40)}" contains a line break or tab; remove it`, 'id');
    const name = graph.labels?.[i] ?? id;
    if (name.length > L.personNameMax)
      add(`the name of "${id.slice(0, 40)}" is longer than ${L.personNameMax} characters; shorten it`, 'name');
    const group = graph.groups?.[i];
    if (group && group.length > L.groupMax)
      add(`the group of "${id.slice(0, 40)}" is longer than ${L.groupMax} characters; shorten it`, 'group');
  });
  return out;
}

/** Ripplehall's own JSON export also carries the layout and the room settings; other files need not. */
function readJsonExtras(result: ParseResult, extras: FileExtras): void {
  const found = result.meta.nodeLink;
  if (!found) return;
  const coordinate = (v: number | undefined) => (v !== undefined && Math.abs(v) <= 1e7 ? v : null);
  for (const [id, at] of found.layout) {
    const x = coordinate(at.x);
    const y = coordinate(at.y);
    if (x !== null || y !== null) extras.layout.set(id, { x, y, pinned: at.pinned === true });
  }
  const g = found.graph;
  const within = (v: unknown, lo: number, hi: number) => (typeof v === 'number' && v >= lo && v <= hi ? v : undefined);
  const minutes = within(g.get('minutesPerHop'), 0.1, 1440);
  const laziness = within(g.get('laziness'), 0, 0.95);
  const mixing = within(g.get('mixing'), 0, 0.5);
  if (minutes !== undefined) extras.settings.minutesPerHop = minutes;
  if (laziness !== undefined) extras.settings.laziness = laziness;
  if (mixing !== undefined) extras.settings.mixing = mixing;
  const name = g.get('name');
  if (typeof name === 'string' && name.trim()) extras.name = name.trim().slice(0, L.roomNameMax);
}

export function reportOf(parsed: ParsedImport, dryRun: boolean): ImportReport {
  const { graph } = parsed;
  return {
    format: parsed.format,
    dryRun,
    committed: false,
    counts: { people: graph.ids.length, ties: graph.ties.length, groups: new Set(graph.groups?.filter((g) => g)).size },
    directed: graph.directed,
    warnings: parsed.warnings,
    errors: parsed.errors,
  };
}

/** Rows to write: people in file order, ties by index. */
export function contentOf(parsed: ParsedImport): { people: PersonRowInput[]; ties: TieRowInput[] } {
  const { graph, extras } = parsed;
  return {
    people: graph.ids.map((key, i) => {
      const at = extras.layout.get(key);
      return {
        key,
        name: graph.labels?.[i] ?? key,
        group: graph.groups?.[i] || null,
        email: null,
        x: at?.x ?? null,
        y: at?.y ?? null,
        pinned: at?.pinned ?? false,
      };
    }),
    ties: graph.ties.map((t) => ({ source: t.source, target: t.target, strength: t.strength })),
  };
}
