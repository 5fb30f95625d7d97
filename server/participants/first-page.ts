import type { Request } from 'express';
import { countFailedLink } from '../auth/link-guard';
import { logger } from '../core/logging';
import { findLinkHolder } from './links';
import { surveyState } from './survey';

/** The id of the data block a participant's page reads instead of asking /api/p/<token> first. */
export const FIRST_STATE_ID = 'rh-first-state';

/**
 * A participant's page, cold: the survey state (what GET /api/p/<token> answers) written into the
 * page as a JSON data block, so the phone shows it as soon as the code has run instead of one
 * more request later. Empty for a link that does not work, which counts against the address
 * like any other (else the page would tell a good link from a guess past the guessing limit);
 * the page then asks the API, which answers with the link's own message. Empty on any failure
 * too (the page asks the API as before).
 */
export async function firstStateBlock(req: Request, token: string): Promise<string> {
  try {
    const holder = await findLinkHolder(token);
    if (!holder) {
      await countFailedLink(req);
      return '';
    }
    const json = JSON.stringify(await surveyState(holder));
    // A data block ends at the first "</script": no <, > or & may appear as they are.
    const safe = json.replace(/[<>&\u2028\u2029]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
    return `<script type="application/json" id="${FIRST_STATE_ID}">${safe}</script>`;
  } catch (err) {
    logger.warn({ err }, 'the participant page is served without its first state');
    return '';
  }
}
