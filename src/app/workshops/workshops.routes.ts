import type { Routes } from '@angular/router';

export default [
  { path: '', title: 'Workshops · Ripplehall', loadComponent: () => import('./workshop-list') },
  { path: ':id', title: 'Workshop · Ripplehall', loadComponent: () => import('./workshop-page') },
  { path: ':id/sheet', title: 'Links to print · Ripplehall', loadComponent: () => import('./link-sheet') },
  { path: ':id/qr', data: { bare: true }, title: 'Join by QR code · Ripplehall', loadComponent: () => import('./join-projector') },
] satisfies Routes;
