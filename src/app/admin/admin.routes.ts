import type { Routes } from '@angular/router';
import { outboxGuard } from './outbox-guard';

/** Mounted at /admin behind roleGuard('admin') in app.routes.ts; the server checks every call too. */
export default [
  {
    path: '',
    loadComponent: () => import('./admin-shell'),
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'accounts' },
      { path: 'accounts', title: 'Accounts · Admin · Ripplehall', loadComponent: () => import('./accounts-page') },
      { path: 'audit', title: 'Audit log · Admin · Ripplehall', loadComponent: () => import('./audit-page') },
      { path: 'outbox', canActivate: [outboxGuard], title: 'Outbox · Admin · Ripplehall', loadComponent: () => import('./outbox-page') },
    ],
  },
] satisfies Routes;
