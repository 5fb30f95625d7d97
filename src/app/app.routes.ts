import type { Routes } from '@angular/router';
import { roleGuard, signedInGuard, signedOutGuard } from './core/auth-guard';

/** Pages load lazily; each feature keeps its own routes file. */
export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'rooms' },
  { path: 'sign-in', canActivate: [signedOutGuard], title: 'Sign in · Ripplehall', loadComponent: () => import('./account/sign-in') },
  { path: 'account/accept', title: 'Set up your account · Ripplehall', loadComponent: () => import('./account/accept-invitation') },
  { path: 'account/forgot-password', title: 'Forgot password · Ripplehall', loadComponent: () => import('./account/forgot-password') },
  { path: 'account/reset-password', title: 'New password · Ripplehall', loadComponent: () => import('./account/reset-password') },
  { path: 'account', canActivate: [signedInGuard], title: 'Account · Ripplehall', loadComponent: () => import('./account/account-page') },
  { path: 'rooms', canActivate: [signedInGuard], loadChildren: () => import('./rooms/rooms.routes') },
  { path: 'rooms/:roomId/plans', canActivate: [signedInGuard], loadChildren: () => import('./plans/plans.routes') },
  { path: 'workshops', canActivate: [signedInGuard], loadChildren: () => import('./workshops/workshops.routes') },
  { path: 'admin', canActivate: [roleGuard('admin')], loadChildren: () => import('./admin/admin.routes') },
  // Participant pages (no account: a personal link or the projector's join code). Each is one lazy
  // level below the app, not two: a phone opening its link waits for one fewer round of chunks.
  {
    path: 'p',
    pathMatch: 'full',
    data: { bare: true },
    title: 'Your link · Ripplehall',
    loadComponent: () => import('./participant/link-help'),
  },
  {
    path: 'p/join/:code',
    data: { bare: true },
    title: 'Join a workshop · Ripplehall',
    loadComponent: () => import('./participant/join-page'),
  },
  {
    path: 'p/:token',
    data: { bare: true },
    title: 'Your workshop page · Ripplehall',
    loadComponent: () => import('./participant/participant-page'),
  },
  {
    path: 'replay/:rehearsalId',
    canActivate: [signedInGuard],
    data: { bare: true },
    title: 'Replay · Ripplehall',
    loadComponent: () => import('./replay/replay-page'),
  },
  { path: 'not-allowed', title: 'Not allowed · Ripplehall', loadComponent: () => import('./core/not-allowed') },
  { path: '**', title: 'Not found · Ripplehall', loadComponent: () => import('./core/not-found') },
];
