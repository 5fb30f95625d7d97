import { inject } from '@angular/core';
import { type CanActivateFn, Router } from '@angular/router';
import { AdminApi } from './admin-api';

/** The outbox page exists only while the server's mail fake is on. */
export const outboxGuard: CanActivateFn = async () => {
  const api = inject(AdminApi);
  const router = inject(Router); // before the await: inject() needs the injection context
  const settings = await api.settings().catch(() => ({ mailFake: false }));
  return settings.mailFake ? true : router.createUrlTree(['/admin/accounts']);
};
