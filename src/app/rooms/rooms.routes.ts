import type { Routes } from '@angular/router';

export default [
  { path: '', title: 'Rooms · Ripplehall', loadComponent: () => import('./list/rooms-page') },
  { path: 'new/seating', title: 'Seating builder · Ripplehall', loadComponent: () => import('./seating/seating-page') },
  { path: ':roomId', title: 'Room · Ripplehall', loadComponent: () => import('./room/room-page') },
] satisfies Routes;
