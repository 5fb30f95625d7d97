import type { HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { toApiError } from './api-error';
import { Auth } from './auth';
import { ErrorSnack } from './error-snack';
import { HANDLES_ERRORS } from './request-flags';

export { HANDLES_ERRORS, QUIET, requestFlags } from './request-flags';

/**
 * The error callback for a request whose failure needs nothing more than the snackbar this
 * interceptor has already shown (or the sign-in page it led to).
 */
export const shownByInterceptor = (): void => undefined;

/** Turns server errors into one clear snackbar, and a lost session into the sign-in page. */
export const errorInterceptor: HttpInterceptorFn = (req, next) => {
  const router = inject(Router);
  const auth = inject(Auth);
  const errorSnack = inject(ErrorSnack);
  return next(req).pipe(
    catchError((err: unknown) => {
      const apiError = toApiError(err);
      if (apiError.status === 401 && !req.url.startsWith('/api/auth/')) {
        auth.markSignedOut();
        // Announced on the sign-in page it leads to, after the navigation (not before it).
        void router
          .navigate(['/sign-in'], { queryParams: { next: router.url } })
          .then(() => errorSnack.announce('Your session has ended. Please sign in again.'));
      } else if (!req.context.get(HANDLES_ERRORS)) {
        errorSnack.show(apiError.message);
      }
      return throwError(() => apiError);
    }),
  );
};
