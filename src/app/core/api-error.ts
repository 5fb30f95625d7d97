import { HttpErrorResponse } from '@angular/common/http';
import type { ErrorCode, ErrorEnvelope, FieldError } from '../../../shared/api/errors';

/** Codes the client gives errors that never reached the server's envelope. */
export const CLIENT_ERROR_CODES = ['offline', 'http', 'client'] as const;
export type ClientErrorCode = (typeof CLIENT_ERROR_CODES)[number];

/** The server's error envelope (shared/api/errors.ts) as the pages see it, with the HTTP status. */
export interface ApiError {
  status: number;
  code: ErrorCode | ClientErrorCode;
  message: string;
  details?: { fields?: FieldError[] } & Record<string, unknown>;
  /** From a Retry-After header in seconds (429 and 503 answers), when the server sent one. */
  retryAfterSeconds?: number;
}

export function toApiError(err: unknown): ApiError {
  // Already reshaped (errorInterceptor rethrows ApiError objects): keep status and details.
  if (isApiError(err)) return err;
  if (err instanceof HttpErrorResponse) {
    const body = (err.error as Partial<ErrorEnvelope> | null)?.error;
    const retry = Number(err.headers?.get('Retry-After') ?? NaN);
    const retryAfter = Number.isFinite(retry) && retry >= 0 ? { retryAfterSeconds: retry } : {};
    if (body?.message)
      return { status: err.status, code: body.code, message: body.message, details: body.details as ApiError['details'], ...retryAfter };
    if (err.status === 0) {
      return { status: 0, code: 'offline', message: 'The server cannot be reached. Check your connection and try again.' };
    }
    return { status: err.status, code: 'http', message: `The server answered ${err.status} ${err.statusText}.` };
  }
  return { status: 0, code: 'client', message: (err as Error)?.message ?? 'Something went wrong.' };
}

function isApiError(err: unknown): err is ApiError {
  const e = err as Partial<ApiError> | null;
  return (
    !!e &&
    typeof e === 'object' &&
    !(err instanceof Error) &&
    typeof e.status === 'number' &&
    typeof e.code === 'string' &&
    typeof e.message === 'string'
  );
}
