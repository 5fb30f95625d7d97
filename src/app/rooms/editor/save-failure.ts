import type { StaleVersionDetails } from '../../../../shared/api/rooms';
import type { ApiError } from '../../core/api-error';

/** How long to wait before resending when the server is still saving another large change (it answers Retry-After: 2). */
export const BUSY_RETRY_MS = 2500;
/** A Retry-After is followed within these bounds. */
const RETRY_MIN_MS = 1000;
const RETRY_MAX_MS = 30_000;

/** What the editor does after a refused save. */
export type SaveFailure =
  /** The room changed elsewhere: the user picks "reload" or "keep mine". */
  | { kind: 'conflict'; conflict: StaleVersionDetails }
  /** The server is still writing this person's other large change: everything stays queued and is sent again after `waitMs`. */
  | { kind: 'busy'; message: string; waitMs: number }
  /** Anything else: shown, kept, sent again on "Retry". */
  | { kind: 'failed'; message: string };

/** Reads a refused save; `version` is the room's version the save was sent against. */
export function saveFailure(e: ApiError, version: number): SaveFailure {
  if (e.status === 409) {
    const conflict = (e.details as unknown as StaleVersionDetails | undefined) ?? {
      currentVersion: version,
      yourVersion: version,
      message: e.message,
    };
    return { kind: 'conflict', conflict };
  }
  if (e.status === 429 && e.code === 'busy_writing') {
    // The server's Retry-After decides when, within sensible bounds.
    const waitMs =
      e.retryAfterSeconds !== undefined ? Math.min(RETRY_MAX_MS, Math.max(RETRY_MIN_MS, e.retryAfterSeconds * 1000)) : BUSY_RETRY_MS;
    return { kind: 'busy', waitMs, message: `${e.message} Ripplehall will send it again in ${Math.round(waitMs / 1000)} seconds.` };
  }
  const fields = e.details?.fields?.map((f) => `${f.field}: ${f.message}`).join('; ');
  return { kind: 'failed', message: fields ? `${e.message} (${fields})` : e.message };
}
