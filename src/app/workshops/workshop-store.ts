import { inject, Injectable, type OnDestroy, signal } from '@angular/core';
import { catchError, concatMap, defer, forkJoin, type Observable, of, tap } from 'rxjs';
import type { RehearsalSummary } from '../../../shared/api/plans';
import type { BuildMode, MissingAnswer, SurveyProgress, WorkshopDetail } from '../../../shared/api/workshops';
import { shownByInterceptor } from '../core/error-interceptor';
import { WorkshopsApi } from './workshops-api';

/** How often the live survey count is read again. */
const POLL_MS = 3000;

/**
 * The workshop one page shows, shared by its panels: the detail, the live survey count, the
 * answers still missing for the chosen build mode and the room's rehearsals, each read again
 * after the changes that affect it.
 */
@Injectable()
export class WorkshopStore implements OnDestroy {
  readonly api = inject(WorkshopsApi);
  readonly workshop = signal<WorkshopDetail | null>(null);
  readonly progress = signal<SurveyProgress | null>(null);
  readonly mode = signal<BuildMode>('either');
  readonly missing = signal<MissingAnswer[]>([]);
  readonly rehearsals = signal<RehearsalSummary[]>([]);
  private timer: ReturnType<typeof setInterval> | undefined;
  private workshopId = 0;

  get id(): number {
    return this.workshopId;
  }

  /** Reads everything, then keeps the live count fresh (a light poll the shell's busy bar ignores). */
  open(id: number): void {
    this.workshopId = id;
    this.reload().subscribe({
      complete: () => {
        this.timer = setInterval(() => this.poll().subscribe(), POLL_MS);
      },
      error: shownByInterceptor,
    });
  }

  ngOnDestroy(): void {
    clearInterval(this.timer);
  }

  /** Everything at once: the detail, the live count, the missing answers and the rehearsals. */
  reload(): Observable<unknown> {
    return forkJoin([this.api.detail(this.workshopId), this.poll(), this.loadMissing()]).pipe(
      tap(([w]) => this.workshop.set(w)),
      concatMap(() => this.loadRehearsals()),
    );
  }

  /** After a change to the participants: the fresh detail first, then the counts without waiting. */
  refreshParticipants(): Observable<unknown> {
    return this.api.detail(this.workshopId).pipe(
      tap((w) => {
        this.workshop.set(w);
        this.refreshCounts();
      }),
    );
  }

  /** The live count and the missing answers, in the background (a failure leaves them as they were). */
  refreshCounts(): void {
    this.poll().subscribe();
    this.loadMissing().subscribe({ error: () => undefined });
  }

  /** The live count; never fails (a missed poll keeps the last count). */
  poll(): Observable<unknown> {
    return this.api.progress(this.workshopId).pipe(
      tap((p) => this.progress.set(p)),
      catchError(() => of(null)),
    );
  }

  loadMissing(): Observable<unknown> {
    return this.api.missing(this.workshopId, this.mode()).pipe(tap((m) => this.missing.set(m)));
  }

  /** The room's rehearsals (the room is read when this runs, so one just built counts); never fails. */
  loadRehearsals(): Observable<unknown> {
    return defer(() => {
      const roomId = this.workshop()?.roomId;
      if (!roomId) return of(null);
      return this.api.rehearsals(roomId).pipe(
        catchError(() => of([])),
        tap((r) => this.rehearsals.set(r)),
      );
    });
  }

  /** Runs a change; a failure has been shown by the error interceptor. */
  run(change: Observable<unknown>): void {
    change.subscribe({ error: shownByInterceptor });
  }
}
