import { FIRST_STATE_ID, type SurveyState } from '../../../shared/api/workshops';

/**
 * What the Express server hands the renderer when it draws a participant's page
 * (server/client-pages.ts): the same state it writes into the page, for the same address.
 */
export interface ParticipantPageContext {
  path: string;
  firstState: SurveyState;
}

/** The state the server rendered a participant's page with, if it is for `token`'s page. */
export function renderedState(context: unknown, token: string): SurveyState | null {
  const c = context as Partial<ParticipantPageContext> | null | undefined;
  return c && c.path === `/p/${token}` && c.firstState?.me ? c.firstState : null;
}

/**
 * The survey state the server wrote into a participant's page when it served it, for `token`.
 * Taken once: the block is removed, so coming back to the page later asks the server again.
 * Null when there is none (another page, a link that does not work, an older server).
 */
export function takeFirstState(token: string, doc: Document, path = doc.location?.pathname): SurveyState | null {
  const block = doc.getElementById(FIRST_STATE_ID);
  if (!block) return null;
  block.remove();
  // Written for the address the page was served at: only that link's page may use it.
  if (path !== `/p/${token}`) return null;
  try {
    const state = JSON.parse(block.textContent ?? '') as SurveyState | null;
    return state && typeof state === 'object' && state.me ? state : null;
  } catch {
    return null;
  }
}
