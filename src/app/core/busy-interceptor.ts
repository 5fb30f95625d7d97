import type { HttpInterceptorFn } from '@angular/common/http';
import { inject, Injectable, signal } from '@angular/core';
import { finalize } from 'rxjs';
import { QUIET } from './request-flags';

/** Counts requests in flight so the shell can show a slim progress bar for slow calls. */
@Injectable({ providedIn: 'root' })
export class Busy {
  private readonly count = signal(0);
  readonly active = this.count.asReadonly();
  start(): void {
    this.count.update((c) => c + 1);
  }
  stop(): void {
    this.count.update((c) => Math.max(0, c - 1));
  }
}

export const busyInterceptor: HttpInterceptorFn = (req, next) => {
  const busy = inject(Busy);
  // Polling and background reads would keep the bar on forever.
  if (req.context.get(QUIET)) return next(req);
  busy.start();
  return next(req).pipe(finalize(() => busy.stop()));
};
