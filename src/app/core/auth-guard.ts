import { inject } from '@angular/core';
import { type CanActivateFn, Router } from '@angular/router';
import type { AccountRole } from '../../../shared/api/accounts';
import { Auth } from './auth';

/** Lets signed-in accounts through; others go to sign-in and come back afterwards. */
export const signedInGuard: CanActivateFn = async (_route, state) => {
  const auth = inject(Auth);
  const router = inject(Router);
  const user = await auth.load().catch(() => null);
  return user ? true : router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
};

/** Lets only the given roles through; others see the not-allowed page. */
export function roleGuard(...roles: AccountRole[]): CanActivateFn {
  return async (_route, state) => {
    const auth = inject(Auth);
    const router = inject(Router);
    const user = await auth.load().catch(() => null);
    if (!user) return router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
    return roles.includes(user.role) ? true : router.createUrlTree(['/not-allowed']);
  };
}

/** Sends signed-in accounts from the sign-in page to their home. */
export const signedOutGuard: CanActivateFn = async () => {
  const auth = inject(Auth);
  const router = inject(Router); // before the await: inject() needs the injection context
  const user = await auth.load().catch(() => null);
  return user ? router.createUrlTree([user.role === 'admin' ? '/admin' : '/rooms']) : true;
};
