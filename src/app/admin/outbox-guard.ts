import { inject } from '@angular/core';
import { type CanActivateFn, Router } from '@angular/router';
import { catchError, map, of } from 'rxjs';
import { AdminApi } from './admin-api';

/** The outbox page exists only while the server's mail fake is on. */
export const outboxGuard: CanActivateFn = () => {
  const router = inject(Router);
  return inject(AdminApi)
    .settings()
    .pipe(
      catchError(() => of({ mailFake: false })),
      map((settings) => (settings.mailFake ? true : router.createUrlTree(['/admin/accounts']))),
    );
};
