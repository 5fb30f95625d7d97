import type { Request } from 'express';
import { countFailedLink } from '../auth/link-guard';
import { FIRST_STATE_ID, type SurveyState } from '../../shared/api/workshops';
import { logger } from '../core/logging';
import { findLinkHolder } from './links';
import { surveyState } from './survey';

/**
 * A participant's page, cold: the survey state (what GET /api/p/<token> answers), which the server
 * draws the page with and writes into it as a JSON data block, so the phone shows it without one
 * more request. Null for a link that does not work, which counts against the address like any
 * other (else the page would tell a good link from a guess past the guessing limit); the page
 * then asks the API, which answers with the link's own message. Null on any failure too (the
 * page asks the API as before).
 */
export async function firstState(req: Request, token: string): Promise<SurveyState | null> {
  try {
    const holder = await findLinkHolder(token);
    if (!holder) {
      await countFailedLink(req);
      return null;
    }
    return await surveyState(holder);
  } catch (err) {
    logger.warn({ err }, 'the participant page is served without its first state');
    return null;
  }
}

/** The state as the page's data block; empty for none. */
export function firstStateBlock(state: SurveyState | null): string {
  if (!state) return '';
  // A data block ends at the first "</script": no <, > or & may appear as they are.
  const safe = JSON.stringify(state).replace(/[<>&\u2028\u2029]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
  return `<script type="application/json" id="${FIRST_STATE_ID}">${safe}</script>`;
}
