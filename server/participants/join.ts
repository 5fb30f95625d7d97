import type { JoinState } from '../../shared/api/workshops';
import { db } from '../db';
import { HttpError } from '../core/http-error';
import { issueLinks } from './links';
import { claimName, lockedStatus, namesOf, withActiveLinks, workshopById } from './store';

/**
 * The join page behind the projector QR code: a participant picks their own name once and
 * gets a personal link. A name is taken once picked, and also while its person already holds a
 * working link (e-mailed or printed), so the QR code cannot be used to answer for them. The
 * facilitator's reset (which revokes that person's links) frees it again. Names can be picked only
 * while the survey collects answers: once it closes, the QR code opens nothing new.
 */
const JOINABLE = new Set(['collecting']);
const notJoinable = (status: string) =>
  status === 'draft'
    ? 'The survey has not opened yet. Your facilitator will tell you when to scan the code.'
    : 'The survey is closed, so names can no longer be picked here. If you already have your personal link, it still shows your page.';

export async function joinState(workshopId: number): Promise<JoinState> {
  const w = await workshopById(workshopId);
  if (!w) throw new HttpError(404, 'link_invalid', 'This workshop no longer exists.');
  const [names, linked] = await Promise.all([namesOf(workshopId), withActiveLinks(workshopId)]);
  return {
    workshopTitle: w.title,
    open: JOINABLE.has(w.status),
    status: w.status,
    names: names.map((n) => ({ id: n.id, name: n.name, taken: n.claimedAt !== null || linked.has(n.id) })),
  };
}

export async function claimJoinName(workshopId: number, participantId: number): Promise<{ path: string; name: string }> {
  const w = await workshopById(workshopId);
  if (!w) throw new HttpError(404, 'link_invalid', 'This workshop no longer exists.');
  if (!JOINABLE.has(w.status)) throw new HttpError(409, 'join_closed', notJoinable(w.status));
  return db.transaction(async (tx) => {
    // The survey may close while this claim waits; the row lock makes the check and the claim one step.
    const status = await lockedStatus(workshopId, tx);
    if (!status || !JOINABLE.has(status)) throw new HttpError(409, 'join_closed', notJoinable(status ?? 'closed'));
    const names = await namesOf(workshopId, tx);
    const linked = await withActiveLinks(workshopId, tx);
    const mine = names.find((n) => n.id === participantId);
    if (!mine)
      throw new HttpError(400, 'unknown_name', "That name is not on this workshop's list. Reload the page to see the current names.");
    if (linked.has(participantId) || !(await claimName(workshopId, participantId, tx))) {
      const allTaken = names.every((n) => n.claimedAt !== null || linked.has(n.id) || n.id === participantId);
      throw new HttpError(
        409,
        allTaken ? 'all_names_taken' : 'name_taken',
        allTaken
          ? 'Every name on the list has been picked. If one of them is yours, ask your facilitator to reset it; if yours is missing, ask them to add you.'
          : `“${mine.name}” is already taken: picked here, or sent a personal link. If that is you, use the link you received or ask your facilitator to reset the name; otherwise pick your own.`,
      );
    }
    const { token } = (await issueLinks([participantId], 'join', w.linkDays, tx)).get(participantId)!;
    return { path: `/p/${token}`, name: mine.name };
  });
}
