import { HttpContextToken, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { toApiError } from './api-error';
import { Auth } from './auth';

/** Set on a request whose errors the caller shows itself (forms with field errors, 409 dialogs). */
export const HANDLES_ERRORS = new HttpContextToken<boolean>(() => false);

/** Turns server errors into one clear snackbar, and a lost session into the sign-in page. */
export const errorInterceptor: HttpInterceptorFn = (req, next) => {
  const snackBar = inject(MatSnackBar);
  const router = inject(Router);
  const auth = inject(Auth);
  return next(req).pipe(
    catchError((err: unknown) => {
      const apiError = toApiError(err);
      if (apiError.status === 401 && !req.url.startsWith('/api/auth/')) {
        auth.markSignedOut();
        void router.navigate(['/sign-in'], { queryParams: { next: router.url } });
        snackBar.open('Your session has ended. Please sign in again.', 'OK', { duration: 6000 });
      } else if (!req.context.get(HANDLES_ERRORS)) {
        snackBar.open(apiError.message, 'Dismiss', { duration: 8000, panelClass: 'rh-snack-error' });
      }
      return throwError(() => apiError);
    }),
  );
};
