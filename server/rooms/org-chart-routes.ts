/**
 * Org-chart import routes (contract: shared/api/org-chart.ts). Same rules as the other
 * imports: a dry run only reports; a commit with errors saves nothing (422); replacing a
 * room's content needs the version it started from (409 when stale).
 */
import { Router, type NextFunction, type Request, type Response } from 'express';
import { z } from 'zod';
import { DEFAULT_ROOM_SETTINGS, ROOM_LIMITS as L } from '../../shared/api/rooms';
import type { OrgChartReport } from '../../shared/api/org-chart';
import { NOT_A_STRENGTH, strength } from '../../shared/api/room-rules';
import { signedIn } from '../core/access';
import { auditFor } from '../core/audit';
import { HttpError } from '../core/http-error';
import { parse } from '../core/validate';
import { loadRoomFor, type LoadedRoom } from './access';
import { receiveUpload, uploadedFiles } from './import';
import { DEFAULT_STRENGTHS, readOrgChart } from './org-chart';
import { roomName } from './schemas';
import { contentCounts, createImportedRoom, replaceImportedContent } from './service';

export const orgChartRouter = Router();

const query = z.strictObject({ dryRun: z.enum(['true', 'false'], 'dryRun must be true or false.').default('true') });
const header = z.string().trim().min(1, 'Choose a column.').max(200, 'At most 200 characters.');
/** A multipart field is text: read it as a number, then the one tie rule (shared/api/room-rules.ts). */
const formStrength = z.coerce.number({ error: NOT_A_STRENGTH }).pipe(strength);
const form = z.strictObject({
  personColumn: header.optional(),
  managerColumn: header.optional(),
  nameColumn: header.optional(),
  departmentColumn: header.optional(),
  reportsTo: formStrength.default(DEFAULT_STRENGTHS.reportsTo),
  sameManager: formStrength.default(DEFAULT_STRENGTHS.sameManager),
  roomName: roomName.optional(),
  version: z.coerce.number({ error: 'version must be a number.' }).int().min(1).optional(),
});

function read(req: Request) {
  const { dryRun } = parse(query, req.query, 'query');
  const f = parse(form, req.body ?? {}, 'org-chart form');
  const { file } = uploadedFiles(req);
  if ((f.personColumn === undefined) !== (f.managerColumn === undefined)) {
    throw new HttpError(
      400,
      'bad_request',
      'Choose both the person id column and the manager column, or neither (to have them suggested).',
      {
        fields: [{ field: f.personColumn === undefined ? 'personColumn' : 'managerColumn', message: 'Choose this column too.' }],
      },
    );
  }
  const columns =
    f.personColumn && f.managerColumn
      ? {
          person: f.personColumn,
          manager: f.managerColumn,
          ...(f.nameColumn ? { name: f.nameColumn } : {}),
          ...(f.departmentColumn ? { department: f.departmentColumn } : {}),
        }
      : null;
  const read = readOrgChart(file, columns, { reportsTo: f.reportsTo, sameManager: f.sameManager }, dryRun === 'true');
  return { dryRun: dryRun === 'true', f, read, fileName: file.name };
}

function refuseErrors(report: OrgChartReport): void {
  const n = report.errors.length;
  if (n === 0) return;
  throw new HttpError(
    422,
    'import_errors',
    `The org chart has ${n} error${n === 1 ? '' : 's'}; nothing was saved. Fix ${n === 1 ? 'it' : 'them'} and import again.`,
    report,
  );
}

async function editableRoom(req: Request, res: Response, next: NextFunction) {
  res.locals['room'] = await loadRoomFor(req.user, req.params['id'], 'edit');
  next();
}

orgChartRouter.post('/import/org-chart', signedIn(), receiveUpload, async (req, res) => {
  const { dryRun, f, read: r, fileName } = read(req);
  if (dryRun) return void res.json(r.report);
  refuseErrors(r.report);
  const name =
    f.roomName ??
    (fileName
      .replace(/\.[^.]+$/, '')
      .trim()
      .slice(0, L.roomNameMax) ||
      'Org chart');
  const roomId = await createImportedRoom(
    req.user!.id,
    name,
    { ...DEFAULT_ROOM_SETTINGS, directed: false },
    {
      content: r.content,
      orgChart: r.saved,
      audit: auditFor(req),
      detail: { format: 'org-chart', people: r.content.people.length },
    },
  );
  res.status(201).json({ ...r.report, committed: true, roomId, version: 1 } satisfies OrgChartReport);
});

orgChartRouter.post('/:id/import/org-chart', signedIn(), editableRoom, receiveUpload, async (req, res) => {
  const loaded = res.locals['room'] as LoadedRoom;
  const { dryRun, f, read: r } = read(req);
  const report: OrgChartReport = { ...r.report, replaces: await contentCounts(loaded.room.id) };
  if (dryRun) return void res.json(report);
  if (f.version === undefined) {
    throw new HttpError(400, 'bad_request', 'Send the room version you started from (form field "version") to replace its content.', {
      fields: [{ field: 'version', message: 'Send the room version you started from.' }],
    });
  }
  refuseErrors(report);
  const version = await replaceImportedContent(loaded, f.version, false, {
    content: r.content,
    orgChart: r.saved,
    audit: auditFor(req),
    detail: { format: 'org-chart', people: r.content.people.length },
  });
  res.json({ ...report, committed: true, roomId: loaded.room.id, version } satisfies OrgChartReport);
});
