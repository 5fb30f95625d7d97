import type { Routes } from '@angular/router';

/** Mounted at rooms/:roomId/plans. */
export default [
  { path: '', title: 'Plan · Ripplehall', loadComponent: () => import('./plan-page') },
  { path: 'compare', title: 'Compare plans · Ripplehall', loadComponent: () => import('./compare-page') },
  { path: 'rehearsals', title: 'Rehearsals · Ripplehall', loadComponent: () => import('./rehearsal-page') },
  { path: ':planId/briefing', title: 'Briefing sheet · Ripplehall', loadComponent: () => import('./briefing-page') },
] satisfies Routes;
