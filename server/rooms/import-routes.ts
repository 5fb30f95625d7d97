/**
 * Import routes: POST /api/rooms/import (create a room from a file) and POST /api/rooms/:id/import
 * (replace a room's content; editors and owners; `version` checked). `dryRun=true` (the default)
 * only reports; `dryRun=false` writes everything in one transaction, or nothing.
 */
import { Router, type Request, type Response, type NextFunction } from 'express';
import { z } from 'zod';
import { DEFAULT_ROOM_SETTINGS, type ImportReport, type RoomSettings } from '../../shared/api/rooms';
import { refusalLine, type Issue } from '../../shared/engine/index';
import { signedIn } from '../core/access';
import { auditFor } from '../core/audit';
import { HttpError } from '../core/http-error';
import { parse } from '../core/validate';
import { heavyWrite } from '../core/heavy-writes';
import { loadRoomFor, type LoadedRoom } from './access';
import { parseUpload } from './parse-upload';
import { contentOf, formatFor, receiveUpload, reportOf, uploadedFiles, type ParsedImport } from './import';
import { roomName } from './schemas';
import { contentCounts, createImportedRoom, replaceImportedContent } from './service';

export const importRouter = Router();

const query = z.strictObject({ dryRun: z.enum(['true', 'false'], 'dryRun must be true or false.').default('true') });
const fields = z.strictObject({
  format: z.enum(['csv', 'graphml', 'json'], 'format must be csv, graphml or json.').optional(),
  directed: z.enum(['true', 'false'], 'directed must be true or false.').optional(),
  version: z.coerce.number({ error: 'version must be a number.' }).int().min(1).optional(),
  name: roomName.optional(),
});

/** Checks the room before the upload is read, so a room of someone else costs nothing and says 404. */
async function editableRoom(req: Request, res: Response, next: NextFunction) {
  res.locals['room'] = await loadRoomFor(req.user, req.params['id'], 'edit');
  next();
}

async function read(req: Request, defaultDirected?: boolean) {
  const { dryRun } = parse(query, req.query, 'query');
  const f = parse(fields, req.body ?? {}, 'import form');
  const { file, people } = uploadedFiles(req);
  const format = formatFor(file, f.format);
  const directed = f.directed === undefined ? defaultDirected : f.directed === 'true';
  const parsed = await parseUpload(file, people, format, directed);
  return { dryRun: dryRun === 'true', f, parsed, fileName: file.name };
}

/**
 * A file with errors is refused, dry run or not: 400 with the same one line the command line
 * prints (the first error, where it is, how many more), and the whole report in the details for
 * the import dialog's table. Nothing is saved.
 */
function refuseErrors(report: ImportReport): void {
  if (report.errors.length === 0) return;
  throw new HttpError(400, 'import_errors', refusalLine(report.errors as Issue[]), { report });
}

importRouter.post('/import', signedIn(), heavyWrite, receiveUpload, async (req, res) => {
  const { dryRun, f, parsed, fileName } = await read(req);
  const report = reportOf(parsed, dryRun);
  refuseErrors(report);
  if (dryRun) return void res.json(report);
  const name =
    f.name ??
    parsed.extras.name ??
    (fileName
      .replace(/\.[^.]+$/, '')
      .trim()
      .slice(0, 120) ||
      'Imported room');
  const settings: RoomSettings = { ...DEFAULT_ROOM_SETTINGS, ...parsed.extras.settings, directed: parsed.graph.directed };
  const roomId = await createImportedRoom(req.user!.id, name, settings, {
    content: contentOf(parsed),
    audit: auditFor(req),
    detail: { format: parsed.format, people: report.counts.people },
  });
  res.status(201).json({ ...report, committed: true, roomId, version: 1 } satisfies ImportReport);
});

importRouter.post('/:id/import', signedIn(), editableRoom, heavyWrite, receiveUpload, async (req, res) => {
  const loaded = res.locals['room'] as LoadedRoom;
  const { dryRun, f, parsed } = await read(req, loaded.room.directed);
  const report: ImportReport = { ...reportOf(parsed, dryRun), replaces: await contentCounts(loaded.room.id) };
  refuseErrors(report);
  if (dryRun) return void res.json(report);
  if (f.version === undefined) {
    throw new HttpError(400, 'bad_request', 'Send the room version you started from (form field "version") to replace its content.', {
      fields: [{ field: 'version', message: 'Send the room version you started from.' }],
    });
  }
  const version = await replaceContent(req, loaded, parsed, f.version);
  res.json({ ...report, committed: true, roomId: loaded.room.id, version } satisfies ImportReport);
});

/** Replaces people and ties (and the direction, which the file decides) in one transaction. */
async function replaceContent(req: Request, loaded: LoadedRoom, parsed: ParsedImport, version: number): Promise<number> {
  const content = contentOf(parsed);
  return replaceImportedContent(loaded, version, parsed.graph.directed, {
    content,
    orgChart: null,
    audit: auditFor(req),
    detail: { format: parsed.format, people: content.people.length },
  });
}
