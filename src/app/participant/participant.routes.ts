import type { Routes } from '@angular/router';

/** Participant pages: no account, a personal link or the projector's join code. */
export default [
  { path: '', pathMatch: 'full', data: { bare: true }, title: 'Your link · Ripplehall', loadComponent: () => import('./link-help') },
  { path: 'join/:code', data: { bare: true }, title: 'Join a workshop · Ripplehall', loadComponent: () => import('./join-page') },
  { path: ':token', data: { bare: true }, title: 'Your workshop page · Ripplehall', loadComponent: () => import('./participant-page') },
] satisfies Routes;
