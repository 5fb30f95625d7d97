import type { Routes } from '@angular/router';
import { provideCharts, withDefaultRegisterables } from 'ng2-charts';

/**
 * Mounted at rooms/:roomId/plans. Chart.js is registered here, for these pages only, so the
 * first page anyone opens (a participant's survey on a phone, the sign-in page) does not load it.
 */
export default [
  {
    path: '',
    providers: [provideCharts(withDefaultRegisterables())],
    children: [
      { path: '', title: 'Plan · Ripplehall', loadComponent: () => import('./plan-page') },
      { path: 'compare', title: 'Compare plans · Ripplehall', loadComponent: () => import('./compare-page') },
      { path: 'rehearsals', title: 'Rehearsals · Ripplehall', loadComponent: () => import('./rehearsal-page') },
      { path: ':planId/briefing', title: 'Briefing sheet · Ripplehall', loadComponent: () => import('./briefing-page') },
    ],
  },
] satisfies Routes;
