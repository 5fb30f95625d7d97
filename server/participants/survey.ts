import type { Nomination, SurveyState } from '../../shared/api/workshops';
import { db } from '../db';
import { conflict, HttpError } from '../core/http-error';
import type { LinkHolder } from './links';
import {
  answersOf,
  facilitatorNames,
  lockAnswersOf,
  namesOf,
  participantsIn,
  recordConsent,
  saveAnswers,
  workshopById,
  type WorkshopRow,
} from './store';

/**
 * The survey as one participant sees it. Two browsers answering for the same person are
 * resolved by a version check (optimistic concurrency): a save names the version it started
 * from; if another save came first, the answer is 409 with the saved answers in `details`,
 * and the page keeps the person's own picks so they can compare and send again. Nothing is
 * overwritten silently and nothing typed is lost.
 */
const closedMessage = (w: WorkshopRow) =>
  w.status === 'draft'
    ? 'The survey has not opened yet. Your facilitator will tell you when it starts.'
    : 'The survey has closed, so answers can no longer be changed. Everything you saved before is kept.';

async function workshopOf(holder: LinkHolder): Promise<WorkshopRow> {
  const w = await workshopById(holder.workshopId);
  if (!w) throw new HttpError(404, 'link_invalid', 'This workshop no longer exists.');
  return w;
}

export async function surveyState(holder: LinkHolder): Promise<SurveyState> {
  const w = await workshopOf(holder);
  const [names, answers, facilitators] = await Promise.all([namesOf(w.id), answersOf(holder.participantId), facilitatorNames(w)]);
  return {
    workshopTitle: w.title,
    sessionDate: w.sessionDate,
    facilitatorNames: facilitators,
    me: { id: holder.participantId, name: holder.participantName },
    status: w.status,
    open: w.status === 'collecting',
    nominationLimit: w.nominationLimit,
    names: names.filter((n) => n.id !== holder.participantId).map((n) => ({ id: n.id, name: n.name })),
    consented: answers.consentedAt !== null,
    version: answers.version,
    nominations: answers.nominations,
    savedAt: answers.submittedAt?.toISOString() ?? null,
    nobody: answers.submittedAt !== null && answers.nominations.length === 0,
    debriefReady: (w.status === 'debrief' || w.status === 'closed') && w.debrief !== null,
  };
}

export async function giveConsent(holder: LinkHolder): Promise<SurveyState> {
  const w = await workshopOf(holder);
  if (w.status !== 'collecting') throw new HttpError(409, 'survey_closed', closedMessage(w));
  await recordConsent(holder.participantId);
  return surveyState(holder);
}

/** Checks one submission against the rules; each problem has its own message. */
export async function checkNominations(holder: LinkHolder, w: WorkshopRow, nominations: Nomination[], nobody = false): Promise<void> {
  const ids = nominations.map((n) => n.participantId);
  if (!ids.length && !nobody) {
    throw new HttpError(
      400,
      'empty_answer',
      'Pick at least one person you ask, or choose “I talk to nobody here regularly” if that is your answer.',
    );
  }
  if (ids.length && nobody) {
    throw new HttpError(
      400,
      'nobody_with_names',
      'You chose “I talk to nobody here regularly” and also picked names. Untick one of the two and send again.',
    );
  }
  if (ids.includes(holder.participantId)) {
    throw new HttpError(400, 'self_nomination', 'You picked your own name. Pick the people you ask, not yourself.');
  }
  if (new Set(ids).size !== ids.length) {
    throw new HttpError(400, 'duplicate_nomination', 'The same person is picked twice. Pick each person once.');
  }
  if (ids.length > w.nominationLimit) {
    throw new HttpError(
      400,
      'too_many_nominations',
      `You picked ${ids.length} people; this survey asks for at most ${w.nominationLimit}. Remove ${ids.length - w.nominationLimit} and send again.`,
    );
  }
  const known = await participantsIn(w.id, ids);
  const unknown = ids.filter((id) => !known.has(id));
  if (unknown.length) {
    throw new HttpError(
      400,
      'unknown_people',
      `${unknown.length === 1 ? 'One name you picked is' : `${unknown.length} names you picked are`} no longer on this workshop's list. Reload the page to see the current names; your other picks are kept.`,
      { unknown },
    );
  }
}

export async function saveSurvey(holder: LinkHolder, version: number, nominations: Nomination[], nobody = false): Promise<SurveyState> {
  const w = await workshopOf(holder);
  if (w.status !== 'collecting') throw new HttpError(409, 'survey_closed', closedMessage(w));
  await checkNominations(holder, w, nominations, nobody);
  await db.transaction(async (tx) => {
    const current = await lockAnswersOf(holder.participantId, tx);
    if (!current.consentedAt) throw conflict('Please read the privacy notice and agree to it before answering.');
    if (current.version !== version) {
      throw new HttpError(
        409,
        'answers_changed',
        'Your answers were changed in another browser or tab since you opened this page. Compare them below and send the ones you want to keep.',
        { version: current.version, nominations: current.nominations, savedAt: current.submittedAt?.toISOString() ?? null },
      );
    }
    // The survey may have closed while this request waited for the lock.
    const fresh = await workshopById(w.id, tx);
    if (fresh?.status !== 'collecting') throw new HttpError(409, 'survey_closed', closedMessage(fresh ?? w));
    await saveAnswers(holder.participantId, version + 1, nominations, tx);
  });
  return surveyState(holder);
}
