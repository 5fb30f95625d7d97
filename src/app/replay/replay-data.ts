import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { forkJoin, map, type Observable, of, switchMap } from 'rxjs';
import type { ReplayIndex, ReplaySample } from '../../../shared/api/plans';

/** Loads a rehearsal's replay data all at once, so the projector keeps working offline. */
@Injectable({ providedIn: 'root' })
export class ReplayData {
  private readonly http = inject(HttpClient);

  load(rehearsalId: string): Observable<{ index: ReplayIndex; samples: ReplaySample[] }> {
    return this.http.get<ReplayIndex>(`/api/rehearsals/${rehearsalId}/samples`).pipe(
      switchMap((index) => {
        const samples = index.samples.map((s) => this.http.get<ReplaySample>(`/api/rehearsals/${rehearsalId}/samples/${s.n}`));
        // forkJoin of nothing completes without a value; an index without samples still answers.
        return (samples.length ? forkJoin(samples) : of([])).pipe(map((all) => ({ index, samples: all })));
      }),
    );
  }
}
