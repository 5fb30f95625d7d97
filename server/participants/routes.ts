import { Router } from 'express';
import { z } from 'zod';
import { NOMINATION_LIMIT_MAX, SURVEY_LEVEL_VALUES } from '../../shared/api/workshops';
import { participantAccess } from '../core/access';
import { parse } from '../core/validate';
import { myDebrief } from './debrief';
import { holderOf, requireJoinCode, requireLink } from './guard';
import { claimJoinName, joinState } from './join';
import { giveConsent, saveSurvey, surveyState } from './survey';

/**
 * Participant-link routes (/api/p). No account: the token in the path is the only key, and it
 * opens only its holder's own survey and results. Nothing here reaches facilitator data.
 */
const answersBody = z.strictObject({
  version: z.number().int().min(0),
  nominations: z
    .array(
      z.strictObject({
        participantId: z.number().int().positive(),
        level: z.enum(SURVEY_LEVEL_VALUES, { message: 'Choose how often: most days, about once a week, or now and then.' }),
      }),
    )
    .max(NOMINATION_LIMIT_MAX * 5, 'That is far more names than any survey asks for.'),
  /** The explicit "I talk to nobody here regularly" answer; an empty list needs it. */
  nobody: z.boolean().default(false),
});

const claimBody = z.strictObject({ participantId: z.number().int().positive() });

export const participantRouter = Router();

participantRouter.get('/join/:code', participantAccess, requireJoinCode, async (_req, res) => {
  res.json(await joinState(res.locals['joinWorkshopId'] as number));
});

participantRouter.post('/join/:code/claim', participantAccess, requireJoinCode, async (req, res) => {
  const body = parse(claimBody, req.body);
  res.status(201).json(await claimJoinName(res.locals['joinWorkshopId'] as number, body.participantId));
});

participantRouter.get('/:token', participantAccess, requireLink, async (_req, res) => {
  res.json(await surveyState(holderOf(res)));
});

participantRouter.post('/:token/consent', participantAccess, requireLink, async (_req, res) => {
  res.json(await giveConsent(holderOf(res)));
});

participantRouter.put('/:token/answers', participantAccess, requireLink, async (req, res) => {
  const body = parse(answersBody, req.body, 'answers');
  res.json(await saveSurvey(holderOf(res), body.version, body.nominations, body.nobody));
});

participantRouter.get('/:token/debrief', participantAccess, requireLink, async (_req, res) => {
  res.json(await myDebrief(holderOf(res)));
});
