import type { ErrorEnvelope } from '../../shared/api/errors';
import { Router } from 'express';
import { z } from 'zod';
import { BUILD_MODES, NAME_MAX, NOMINATION_LIMIT_MAX, ROSTER_MAX, TITLE_MAX, WORKSHOP_STATUSES } from '../../shared/api/workshops';
import { signedIn } from '../core/access';
import { audit } from '../core/audit';
import { parse } from '../core/validate';
import { loadRoomFor } from '../rooms/access';
import { issueJoinCode, joinUrl } from '../participants/links';
import { loadWorkshopFor } from './access';
import { releaseDebrief } from './release';
import { buildRoom, missingAnswers } from './room-build';
import { parseRoster } from './roster';
import { qrDataUrl } from './qr';
import * as service from './service';
import { deleteWorkshop, insertWorkshop, listWorkshops, participantCounts, updateWorkshop } from './store';
import type { SignedInUser } from '../types';
import { findUserById } from '../auth/service';
import { idOf } from '../core/ids';
import { coFacilitatorIds, roomAccessNote } from './co-facilitators';

const date = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-05-14.');
const createBody = z.strictObject({
  title: z.string().trim().min(1, 'Give the workshop a title.').max(TITLE_MAX),
  sessionDate: date,
  roomId: z.number().int().positive().nullable(),
  nominationLimit: z.number().int().min(1).max(NOMINATION_LIMIT_MAX).optional(),
});
const patchBody = z.strictObject({
  title: z.string().trim().min(1, 'Give the workshop a title.').max(TITLE_MAX).optional(),
  sessionDate: date.optional(),
  nominationLimit: z
    .number()
    .int()
    .min(1, 'Ask for at least one name.')
    .max(NOMINATION_LIMIT_MAX, `At most ${NOMINATION_LIMIT_MAX} names.`)
    .optional(),
  linkDays: z.number().int().min(1, 'Links must work for at least a day.').max(365, 'Links can work for at most a year.').optional(),
  showStarters: z.boolean().optional(),
});
const statusBody = z.strictObject({ to: z.enum(WORKSHOP_STATUSES, 'Unknown status.') });
const emailBody = z.strictObject({ email: z.string().trim().toLowerCase().email('Enter an e-mail address.').max(254) });
const peopleBody = z.strictObject({
  people: z
    .array(
      z.strictObject({
        name: z.string().trim().min(1, 'A name is empty.').max(NAME_MAX),
        email: z.string().trim().toLowerCase().email().max(254).nullable().optional(),
      }),
    )
    .min(1, 'Add at least one person.')
    .max(ROSTER_MAX),
});
const rosterBody = z.strictObject({ csv: z.string().min(1, 'The file is empty.').max(2_000_000, 'The file is too large for a roster.') });
const linksBody = z.strictObject({
  participantIds: z.array(z.number().int().positive()).max(ROSTER_MAX).optional(),
});
const reissueBody = z.strictObject({
  participantIds: z.array(z.number().int().positive()).min(1, 'Choose whose links to reissue.').max(ROSTER_MAX),
  confirm: z.literal(true, 'Reissuing ends the links these people already hold: confirm it with "confirm": true.'),
});
const revokeBody = z.strictObject({ participantIds: z.array(z.number().int().positive()).min(1).max(ROSTER_MAX) });
const buildBody = z.strictObject({
  mode: z.enum(BUILD_MODES.map((m) => m.value) as ['directed', 'reciprocated', 'either'], 'Choose how to read the answers.'),
});
const releaseBody = z.strictObject({
  rehearsalId: z.number().int().positive(),
  sampleRun: z.number().int().min(0),
  showStarters: z.boolean(),
});
const pid = (raw: unknown) => idOf(raw, 'That participant');

async function ownerOf(ownerId: number): Promise<SignedInUser> {
  const row = await findUserById(ownerId);
  return { id: ownerId, email: row?.email ?? '', name: row?.name ?? '', role: row?.role ?? 'facilitator' };
}

export const workshopsRouter = Router();

workshopsRouter.get('/', signedIn(), async (req, res) => {
  res.json(await listWorkshops(req.user!.id));
});

workshopsRouter.post('/', signedIn(), async (req, res) => {
  const body = parse(createBody, req.body);
  if (body.roomId !== null) await loadRoomFor(req.user, body.roomId, 'edit');
  const id = await insertWorkshop({
    ownerId: req.user!.id,
    title: body.title,
    sessionDate: body.sessionDate,
    roomId: body.roomId,
    nominationLimit: body.nominationLimit ?? 5,
  });
  const loaded = await loadWorkshopFor(req.user, id);
  if (body.roomId !== null) await service.participantsFromRoom(loaded.workshop, req.user!);
  await audit(req, { action: 'workshop.created', targetType: 'workshop', targetId: id });
  res.status(201).json(await service.workshopDetail(loaded.workshop, true));
});

workshopsRouter.get('/:id', signedIn(), async (req, res) => {
  const { workshop, owner } = await loadWorkshopFor(req.user, req.params['id']);
  res.json(await service.workshopDetail(workshop, owner));
});

workshopsRouter.patch('/:id', signedIn(), async (req, res) => {
  const { workshop, owner } = await loadWorkshopFor(req.user, req.params['id']);
  const body = parse(patchBody, req.body);
  service.assertNotClosed(workshop);
  await updateWorkshop(workshop.id, body);
  res.json(await service.workshopDetail((await loadWorkshopFor(req.user, workshop.id)).workshop, owner));
});

workshopsRouter.delete('/:id', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id'], 'own');
  const helpers = await coFacilitatorIds(workshop.id);
  await deleteWorkshop(workshop.id);
  // Their editor access to the workshop's room ended with the workshop (server/rooms/grants.ts).
  await audit(req, {
    action: 'workshop.deleted',
    targetType: 'workshop',
    targetId: workshop.id,
    detail: { roomId: workshop.roomId, roomAccessEnded: workshop.roomId === null ? [] : helpers },
  });
  res.status(204).end();
});

workshopsRouter.post('/:id/status', signedIn(), async (req, res) => {
  const { workshop, owner } = await loadWorkshopFor(req.user, req.params['id']);
  const { to } = parse(statusBody, req.body);
  await service.moveStatus(workshop, to);
  await audit(req, { action: 'workshop.status', targetType: 'workshop', targetId: workshop.id, detail: { from: workshop.status, to } });
  res.json(await service.workshopDetail((await loadWorkshopFor(req.user, workshop.id)).workshop, owner));
});

workshopsRouter.post('/:id/facilitators', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id'], 'own');
  const userId = await service.addFacilitator(workshop, parse(emailBody, req.body).email);
  const room = await roomAccessNote(workshop, userId);
  await audit(req, {
    action: 'workshop.facilitator_added',
    targetType: 'workshop',
    targetId: workshop.id,
    detail: { userId, ...room, roomAccess: room.roomId === null ? 'none' : 'editor while co-facilitating' },
  });
  res.status(201).json(await service.workshopDetail(workshop, true));
});

workshopsRouter.delete('/:id/facilitators/:userId', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id'], 'own');
  const userId = pid(req.params['userId']);
  await service.removeFacilitator(workshop, userId);
  const room = await roomAccessNote(workshop, userId);
  await audit(req, {
    action: 'workshop.facilitator_removed',
    targetType: 'workshop',
    targetId: workshop.id,
    detail: { userId, ...room, roomAccess: room.directShare ?? 'none' },
  });
  res.status(204).end();
});

/** Answers with the workshop as it now is, so the page shows the new row without asking again. */
workshopsRouter.post('/:id/participants', signedIn(), async (req, res) => {
  const { workshop, owner } = await loadWorkshopFor(req.user, req.params['id']);
  const body = parse(peopleBody, req.body);
  const result = await service.addParticipants(
    workshop,
    body.people.map((p) => ({ name: p.name, email: p.email ?? null, personId: null })),
  );
  res.status(201).json({ ...result, workshop: await service.workshopDetail(workshop, owner) });
});

workshopsRouter.post('/:id/participants/roster', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  const { rows, issues } = parseRoster(parse(rosterBody, req.body).csv);
  const result = rows.length
    ? await service.addParticipants(
        workshop,
        rows.map((r) => ({ ...r, personId: null })),
      )
    : { added: 0, skipped: [] };
  res.status(rows.length ? 201 : 400).json(
    rows.length
      ? { ...result, issues }
      : ({
          error: { code: 'bad_roster', message: issues[0]?.message ?? 'The roster has no names.', details: { issues } },
        } satisfies ErrorEnvelope),
  );
});

workshopsRouter.post('/:id/participants/from-room', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  res.status(201).json(await service.participantsFromRoom(workshop, await ownerOf(workshop.ownerId)));
});

workshopsRouter.delete('/:id/participants/:pid', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  await service.removeParticipant(workshop, pid(req.params['pid']));
  res.status(204).end();
});

workshopsRouter.post('/:id/participants/:pid/reset-claim', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  await service.resetClaim(workshop, pid(req.params['pid']));
  res.status(204).end();
});

workshopsRouter.post('/:id/links/email', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  const body = parse(linksBody, req.body);
  const result = await service.emailLinks(workshop, req.user!, body.participantIds);
  await audit(req, {
    action: 'workshop.links_emailed',
    targetType: 'workshop',
    targetId: workshop.id,
    detail: { sent: result.sent.length },
  });
  res.json(result);
});

workshopsRouter.post('/:id/links/sheet', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  const body = parse(linksBody, req.body);
  const links = await service.sheetLinks(workshop, body.participantIds);
  await audit(req, { action: 'workshop.links_printed', targetType: 'workshop', targetId: workshop.id, detail: { links: links.length } });
  res.set('Cache-Control', 'no-store').json(links);
});

workshopsRouter.post('/:id/links/reissue', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  const body = parse(reissueBody, req.body);
  const links = await service.reissueParticipantLinks(workshop, body.participantIds);
  await audit(req, { action: 'workshop.links_reissued', targetType: 'workshop', targetId: workshop.id, detail: { links: links.length } });
  res.set('Cache-Control', 'no-store').json(links);
});

workshopsRouter.post('/:id/links/revoke', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  const revoked = await service.revokeParticipantLinks(workshop, parse(revokeBody, req.body).participantIds);
  await audit(req, { action: 'workshop.links_revoked', targetType: 'workshop', targetId: workshop.id, detail: { links: revoked } });
  res.json({ revoked });
});

workshopsRouter.post('/:id/join-code', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  service.assertNotClosed(workshop);
  const { code, expiresAt } = await issueJoinCode(workshop.id, 1);
  const url = joinUrl(code);
  res.set('Cache-Control', 'no-store').json({ url, qr: await qrDataUrl(url), expiresAt: expiresAt.toISOString() });
});

workshopsRouter.delete('/:id/join-code', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  await updateWorkshop(workshop.id, { joinCodeHash: null, joinCodeExpiresAt: null });
  res.status(204).end();
});

workshopsRouter.get('/:id/progress', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  const c = (await participantCounts([workshop.id])).get(workshop.id);
  res.set('Cache-Control', 'no-store').json({
    status: workshop.status,
    participants: c?.participants ?? 0,
    answered: c?.answered ?? 0,
    consented: c?.consented ?? 0,
    updatedAt: c?.updatedAt?.toISOString() ?? null,
  });
});

workshopsRouter.get('/:id/missing', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  const mode = BUILD_MODES.find((m) => m.value === req.query['mode'])?.value ?? 'directed';
  res.json(await missingAnswers(workshop.id, mode));
});

workshopsRouter.post('/:id/build', signedIn(), async (req, res) => {
  const { workshop } = await loadWorkshopFor(req.user, req.params['id']);
  service.assertNotClosed(workshop);
  const { mode } = parse(buildBody, req.body);
  const result = await buildRoom(workshop, await ownerOf(workshop.ownerId), mode);
  await audit(req, {
    action: 'workshop.room_built',
    targetType: 'workshop',
    targetId: workshop.id,
    detail: { roomId: result.roomId, mode },
  });
  res.json(result);
});

workshopsRouter.post('/:id/release', signedIn(), async (req, res) => {
  const { workshop, owner } = await loadWorkshopFor(req.user, req.params['id']);
  const body = parse(releaseBody, req.body);
  await releaseDebrief(workshop, await ownerOf(workshop.ownerId), body);
  await audit(req, { action: 'workshop.debrief_released', targetType: 'workshop', targetId: workshop.id, detail: body });
  res.json(await service.workshopDetail((await loadWorkshopFor(req.user, workshop.id)).workshop, owner));
});
