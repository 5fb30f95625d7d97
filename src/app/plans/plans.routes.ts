import type { Routes } from '@angular/router';

/** Mounted at rooms/:roomId/plans. */
export default [{ path: '', title: 'Plan · Ripplehall', loadComponent: () => import('./plan-page') }] satisfies Routes;
