import { inject } from '@angular/core';
import { type CanActivateFn, Router } from '@angular/router';
import { catchError, map, type Observable, of } from 'rxjs';
import type { AccountRole } from '../../../shared/api/accounts';
import { Auth, type Account } from './auth';

/** Who is signed in, or null when that cannot be learnt (the guards then treat the visitor as signed out). */
function whoIsSignedIn(): Observable<Account | null> {
  return inject(Auth)
    .load()
    .pipe(catchError(() => of(null)));
}

/** Lets signed-in accounts through; others go to sign-in and come back afterwards. */
export const signedInGuard: CanActivateFn = (_route, state) => {
  const router = inject(Router);
  return whoIsSignedIn().pipe(map((user) => (user ? true : router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } }))));
};

/** Lets only the given roles through; others see the not-allowed page. */
export function roleGuard(...roles: AccountRole[]): CanActivateFn {
  return (_route, state) => {
    const router = inject(Router);
    return whoIsSignedIn().pipe(
      map((user) => {
        if (!user) return router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
        return roles.includes(user.role) ? true : router.createUrlTree(['/not-allowed']);
      }),
    );
  };
}

/** Sends signed-in accounts from the sign-in page to their home. */
export const signedOutGuard: CanActivateFn = () => {
  const router = inject(Router);
  return whoIsSignedIn().pipe(map((user) => (user ? router.createUrlTree([user.role === 'admin' ? '/admin' : '/rooms']) : true)));
};
