import { STATUS_LABELS, STATUS_MOVES, type IssuedLink, type WorkshopDetail, type WorkshopStatus } from '../../shared/api/workshops';
import { transaction } from '../db';
import { findUserByEmail } from '../auth/service';
import { badRequest, conflict, HttpError, notFound } from '../core/http-error';
import { sendMail } from '../mail/transport';
import { linksFor, participantUrl, reissueLinks, revokeLinks, revokeToken, type ShownLink } from '../participants/links';
import { loadRoomFor } from '../rooms/access';
import { roomPeople } from '../rooms/service';
import type { SignedInUser } from '../types';
import type { DebriefSnapshot } from './debrief';
import { surveyLinkMail } from './mail';
import { qrDataUrl } from './qr';
import {
  clearClaim,
  deleteFacilitator,
  deleteParticipant,
  facilitatorsOf,
  insertFacilitator,
  insertParticipants,
  lockWorkshop,
  participantRows,
  participantsById,
  roomNameOf,
  updateWorkshop,
  type ParticipantDbRow,
  type WorkshopRow,
} from './store';

/** Workshops domain: status moves, facilitators, participants and their links. */

export async function workshopDetail(w: WorkshopRow, owner: boolean): Promise<WorkshopDetail> {
  const [facilitators, participants, roomName] = await Promise.all([facilitatorsOf(w), participantRows(w.id), roomNameOf(w.roomId)]);
  const snap = w.debrief as DebriefSnapshot | null;
  return {
    id: w.id,
    title: w.title,
    sessionDate: w.sessionDate,
    status: w.status,
    roomId: w.roomId,
    roomName,
    owner,
    nominationLimit: w.nominationLimit,
    linkDays: w.linkDays,
    showStarters: w.showStarters,
    facilitators,
    participants,
    nextStatuses: [...STATUS_MOVES[w.status]],
    debrief: snap ? { rehearsalId: snap.rehearsalId, sampleRun: snap.sampleRun, releasedAt: snap.releasedAt } : null,
    joinCodeActive: w.joinCodeHash !== null && (w.joinCodeExpiresAt?.getTime() ?? 0) > Date.now(),
  };
}

export function assertNotClosed(w: WorkshopRow): void {
  if (w.status === 'closed') throw new HttpError(409, 'workshop_closed', 'This workshop is closed, so it can no longer be changed.');
}

/** Status moves, each refusal saying what to do instead. */
export async function moveStatus(w: WorkshopRow, to: WorkshopStatus): Promise<void> {
  if (w.status === to) return;
  const allowed = STATUS_MOVES[w.status];
  if (!allowed.includes(to)) {
    const options = allowed.map((s) => `“${STATUS_LABELS[s]}”`).join(' or ');
    throw new HttpError(
      409,
      'status_move',
      w.status === 'closed'
        ? 'This workshop is closed; a closed workshop cannot be reopened.'
        : `A workshop in “${STATUS_LABELS[w.status]}” cannot move to “${STATUS_LABELS[to]}”; it can move to ${options}.`,
      { from: w.status, to, allowed },
    );
  }
  if (to === 'collecting') {
    const count = (await participantsById(w.id)).length;
    if (count < 2) throw new HttpError(409, 'too_few', 'Add at least two participants before opening the survey.');
  }
  if (to === 'debrief' && !w.debrief) {
    throw new HttpError(409, 'not_released', 'Release the results first: choose a rehearsal and a cascade under Debrief.');
  }
  await updateWorkshop(w.id, { status: to });
}

/** Adds a co-facilitator; returns their id (the route audits the change and its room access). */
export async function addFacilitator(w: WorkshopRow, email: string): Promise<number> {
  const user = await findUserByEmail(email);
  if (!user || user.status !== 'active') {
    throw badRequest('No active Ripplehall account uses that e-mail address. Ask an admin to invite them first.', {
      fields: [{ field: 'email', message: 'No active account uses this address.' }],
    });
  }
  if (user.id === w.ownerId) throw conflict('That is the owner of this workshop; they are already a facilitator.');
  await insertFacilitator(w.id, user.id);
  return user.id;
}

export async function removeFacilitator(w: WorkshopRow, userId: number): Promise<void> {
  if (!(await deleteFacilitator(w.id, userId))) throw notFound('That co-facilitator');
}

/** Adds participants, skipping names already on the list (case-insensitive). */
export async function addParticipants(
  w: WorkshopRow,
  list: { name: string; email: string | null; personId: string | null }[],
): Promise<{ added: number; skipped: string[] }> {
  assertNotClosed(w);
  const existing = new Set((await participantsById(w.id)).map((p) => p.name.toLowerCase()));
  const fresh = list.filter((p) => !existing.has(p.name.toLowerCase()));
  const skipped = list.filter((p) => existing.has(p.name.toLowerCase())).map((p) => p.name);
  const added = await insertParticipants(w.id, fresh);
  return { added, skipped };
}

export async function participantsFromRoom(w: WorkshopRow, owner: SignedInUser): Promise<{ added: number; skipped: string[] }> {
  if (w.roomId === null)
    throw conflict('This workshop has no room yet: its room will be built from the survey. Add participants from a roster instead.');
  await loadRoomFor(owner, w.roomId, 'view');
  const people = await roomPeople(w.roomId);
  return addParticipants(
    w,
    people.map((p) => ({ name: p.name, email: p.email, personId: String(p.id) })),
  );
}

export async function removeParticipant(w: WorkshopRow, participantId: number): Promise<void> {
  assertNotClosed(w);
  if (!(await deleteParticipant(w.id, participantId))) throw notFound('That participant');
}

export async function resetClaim(w: WorkshopRow, participantId: number): Promise<void> {
  const [p] = await participantsById(w.id, [participantId]);
  if (!p) throw new HttpError(404, 'not_found', 'That participant was not found.');
  await transaction(async (tx) => {
    await lockWorkshop(w.id, tx);
    await clearClaim(p.id, tx);
    await revokeLinks([p.id], tx);
  });
}

async function targets(w: WorkshopRow, ids: number[] | undefined) {
  const list = await participantsById(w.id, ids);
  if (ids && list.length !== new Set(ids).size)
    throw badRequest('Some of the chosen participants are not in this workshop. Reload the page.');
  if (!list.length) throw badRequest('This workshop has no participants yet.');
  return list;
}

/** Each chosen participant's own link for a printed sheet: live links are shown again, never replaced. */
export async function sheetLinks(w: WorkshopRow, ids: number[] | undefined): Promise<IssuedLink[]> {
  assertNotClosed(w);
  const list = await targets(w, ids);
  const links = await transaction(async (tx) => {
    await lockWorkshop(w.id, tx);
    return linksFor(
      list.map((p) => p.id),
      'sheet',
      w.linkDays,
      tx,
    );
  });
  return withQr(list, links);
}

async function withQr(list: ParticipantDbRow[], links: Map<number, ShownLink>): Promise<IssuedLink[]> {
  return Promise.all(
    list.map(async (p) => {
      const link = links.get(p.id)!;
      const url = participantUrl(link.token);
      return { participantId: p.id, name: p.name, email: p.email, url, expiresAt: link.expiresAt.toISOString(), qr: await qrDataUrl(url) };
    }),
  );
}

/**
 * E-mails each chosen participant with an address their own link (the live one when they have
 * it). A message that fails to send ends only a link it had just issued, which nobody holds;
 * a link the person already has keeps working.
 */
export async function emailLinks(
  w: WorkshopRow,
  sender: SignedInUser,
  ids: number[] | undefined,
): Promise<{ sent: string[]; withoutEmail: string[]; failed: string[] }> {
  assertNotClosed(w);
  const list = await targets(w, ids);
  const withEmail = list.filter((p) => p.email);
  const withoutEmail = list.filter((p) => !p.email).map((p) => p.name);
  if (!withEmail.length)
    throw badRequest('None of the chosen participants has an e-mail address. Print a sheet of links or show the QR code instead.');
  const links = await transaction(async (tx) => {
    await lockWorkshop(w.id, tx);
    return linksFor(
      withEmail.map((p) => p.id),
      'email',
      w.linkDays,
      tx,
    );
  });
  const sent: string[] = [];
  const failed: string[] = [];
  for (const p of withEmail) {
    const link = links.get(p.id)!;
    try {
      await sendMail(
        surveyLinkMail({
          to: p.email!,
          name: p.name,
          workshopTitle: w.title,
          sessionDate: w.sessionDate,
          facilitator: sender.name,
          url: participantUrl(link.token),
          expiresAt: link.expiresAt,
        }),
      );
      sent.push(p.name);
    } catch {
      if (link.fresh) await revokeToken(link.token);
      failed.push(p.name);
    }
  }
  return { sent, withoutEmail, failed };
}

/** The confirmed reissue: the chosen people's links stop working and each gets a new one. */
export async function reissueParticipantLinks(w: WorkshopRow, ids: number[]): Promise<IssuedLink[]> {
  assertNotClosed(w);
  const list = await targets(w, ids);
  const links = await transaction(async (tx) => {
    await lockWorkshop(w.id, tx);
    return reissueLinks(
      list.map((p) => p.id),
      w.linkDays,
      tx,
    );
  });
  return withQr(list, links);
}

export async function revokeParticipantLinks(w: WorkshopRow, ids: number[]): Promise<number> {
  const list = await targets(w, ids);
  return transaction(async (tx) => {
    await lockWorkshop(w.id, tx);
    return revokeLinks(
      list.map((p) => p.id),
      tx,
    );
  });
}
