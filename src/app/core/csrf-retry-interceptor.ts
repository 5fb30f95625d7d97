import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { catchError, throwError } from 'rxjs';
import type { ErrorEnvelope } from '../../../shared/api/errors';

/**
 * The server binds its CSRF token to the session, so a token from a session that has just ended
 * (idle timeout, deactivation, sign-in elsewhere) is refused with 403 `csrf`, and the same answer
 * sets a fresh token cookie. Sending the request once more with that fresh token turns the refusal
 * into what really happened: the request goes through, or a 401 leads to the sign-in page, and
 * what the user typed is not thrown away by a "reload the page" message.
 */
export const csrfRetryInterceptor: HttpInterceptorFn = (req, next) =>
  next(req).pipe(
    catchError((err: unknown) => {
      if (err instanceof HttpErrorResponse && err.status === 403 && csrfCode(err.error)) return next(req);
      return throwError(() => err);
    }),
  );

function csrfCode(body: unknown): boolean {
  return typeof body === 'object' && body !== null && (body as Partial<ErrorEnvelope>).error?.code === 'csrf';
}
