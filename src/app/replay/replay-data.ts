import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { from, type Observable, of, switchMap } from 'rxjs';
import type { ReplayBundle } from '../../../shared/api/plans';
import { takeEarlyAnswer } from '../core/early-request';

/**
 * Loads a rehearsal's replay data all at once (the index and every sample in one answer), so the
 * first frame waits for one request and the projector keeps working offline. A cold page uses the
 * answer asked for as the app started (core/early-request) when it came back well.
 */
@Injectable({ providedIn: 'root' })
export class ReplayData {
  private readonly http = inject(HttpClient);

  load(rehearsalId: string): Observable<ReplayBundle> {
    const url = `/api/rehearsals/${encodeURIComponent(rehearsalId)}/replay`;
    const early = takeEarlyAnswer<ReplayBundle>(url);
    const asked = () => this.http.get<ReplayBundle>(url);
    if (!early) return asked();
    return from(early).pipe(switchMap((answer) => (answer ? of(answer) : asked())));
  }
}
