/** Rooms HTTP API (contract and route list: shared/api/rooms.ts). Every route: signedIn(), then loadRoomFor. */
import { Router, type Request } from 'express';
import { z } from 'zod';
import { EXPORT_FORMATS } from '../../shared/api/rooms';
import { signedIn } from '../core/access';
import { audit } from '../core/audit';
import { parse } from '../core/validate';
import { loadRoomFor, loadRoomGraph } from './access';
import { applyEdits } from './edits';
import { exportRoom, fileStem } from './export';
import { importRouter } from './import-routes';
import { listRooms } from './list-store';
import { writeRoomOrgChart } from './org-chart';
import { orgChartRouter } from './org-chart-routes';
import * as schemas from './schemas';
import { createRoom, duplicateRoom, roomDto, roomSummary, updateRoom } from './service';
import { idOf } from '../core/ids';
import { clientGoneSignal, heavyWrite } from '../core/heavy-writes';
import { addShare, changeShare, listShares, revokeShare } from './shares';
import * as store from './store';

export const roomsRouter = Router();
const me = (req: Request) => req.user!;

roomsRouter.use(orgChartRouter);
roomsRouter.use(importRouter);

roomsRouter.get('/', signedIn(), async (req, res) => {
  const q = parse(schemas.roomListQuery, req.query, 'query');
  res.json(await listRooms(me(req).id, q));
});

roomsRouter.post('/', signedIn(), heavyWrite, async (req, res) => {
  const body = parse(schemas.createRoomBody, req.body);
  const id = await createRoom(me(req).id, body);
  await audit(req, { action: 'room.create', targetType: 'room', targetId: id, detail: { people: body.people?.length ?? 0 } });
  res.status(201).json(await roomDto(await loadRoomFor(req.user, id, 'view')));
});

roomsRouter.get('/:id', signedIn(), async (req, res) => {
  res.json(await roomDto(await loadRoomFor(req.user, req.params.id, 'view')));
});

roomsRouter.patch('/:id', signedIn(), async (req, res) => {
  const loaded = await loadRoomFor(req.user, req.params.id, 'edit');
  const body = parse(schemas.updateRoomBody, req.body);
  await updateRoom(loaded.room.id, body);
  res.json(await roomDto(await loadRoomFor(req.user, loaded.room.id, 'view')));
});

roomsRouter.delete('/:id', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'own');
  await store.deleteRoom(room.id);
  await audit(req, { action: 'room.delete', targetType: 'room', targetId: room.id });
  res.status(204).end();
});

roomsRouter.post('/:id/duplicate', signedIn(), heavyWrite, async (req, res) => {
  const loaded = await loadRoomFor(req.user, req.params.id, 'view');
  const body = parse(schemas.duplicateBody, req.body ?? {});
  const id = await duplicateRoom(loaded, me(req).id, body.name);
  await audit(req, { action: 'room.duplicate', targetType: 'room', targetId: id, detail: { from: loaded.room.id } });
  res.status(201).json(await roomDto(await loadRoomFor(req.user, id, 'view')));
});

roomsRouter.post('/:id/edits', signedIn(), heavyWrite, async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'edit');
  const body = parse(schemas.editBatchBody, req.body, 'edits');
  res.json(await applyEdits(room.id, body, clientGoneSignal(res)));
});

roomsRouter.get('/:id/people', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'view');
  res.json(await store.listPeople(room.id, parse(schemas.peopleQuery, req.query, 'query')));
});

roomsRouter.get('/:id/ties', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'view');
  res.json(await store.listTies(room.id, parse(schemas.tiesQuery, req.query, 'query')));
});

roomsRouter.get('/:id/summary', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'view');
  res.json(await roomSummary(room.id));
});

const exportQuery = z.strictObject({ format: z.enum(EXPORT_FORMATS, `format must be one of ${EXPORT_FORMATS.join(', ')}.`) });

roomsRouter.get('/:id/export', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'view');
  const { format } = parse(exportQuery, req.query, 'query');
  if (format === 'org-chart-csv') {
    const body = '\uFEFF' + writeRoomOrgChart(await store.orgChartPeople(room.id), await store.roomOrgChart(room.id));
    res
      .set('Cache-Control', 'no-store')
      .attachment(`${fileStem(room.name)}-org-chart.csv`)
      .type('text/csv; charset=utf-8')
      .send(body);
    return;
  }
  const file = exportRoom(format, room.name, await loadRoomGraph(room.id), await store.roomPeople(room.id));
  res.set('Cache-Control', 'no-store').attachment(file.filename).type(file.contentType).send(file.body);
});

roomsRouter.get('/:id/shares', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'own');
  res.json(await listShares(room.id));
});

roomsRouter.post('/:id/shares', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'own');
  const body = parse(schemas.shareBody, req.body);
  const share = await addShare(room, me(req), body.email, body.role);
  await audit(req, { action: 'room.share', targetType: 'room', targetId: room.id, detail: { userId: share.userId, role: share.role } });
  res.status(201).json(share);
});

const userIdOf = (raw: unknown) => idOf(raw, 'That share');

roomsRouter.patch('/:id/shares/:userId', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'own');
  const { role } = parse(schemas.shareRoleBody, req.body);
  const share = await changeShare(room.id, userIdOf(req.params.userId), role);
  await audit(req, { action: 'room.share.role', targetType: 'room', targetId: room.id, detail: { userId: share.userId, role } });
  res.json(share);
});

roomsRouter.delete('/:id/shares/:userId', signedIn(), async (req, res) => {
  const { room } = await loadRoomFor(req.user, req.params.id, 'own');
  const userId = userIdOf(req.params.userId);
  await revokeShare(room.id, userId);
  await audit(req, { action: 'room.share.revoke', targetType: 'room', targetId: room.id, detail: { userId } });
  res.status(204).end();
});
