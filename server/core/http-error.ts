import type { ErrorCode } from '../../shared/api/errors';

/** An operational error: the client did something we can explain. Becomes a JSON answer (shared/api/errors.ts). */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details?: unknown) => new HttpError(400, 'bad_request', message, details);
export const unauthorized = (message = 'Please sign in first.') => new HttpError(401, 'unauthorized', message);
export const forbidden = (message = 'Your role does not allow this.') => new HttpError(403, 'forbidden', message);
/** Also used for things that exist but are not the caller's, so ids cannot be probed. */
export const notFound = (what = 'That item') => new HttpError(404, 'not_found', `${what} was not found.`);
export const conflict = (message: string, details?: unknown) => new HttpError(409, 'conflict', message, details);
