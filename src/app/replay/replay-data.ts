import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { ReplayIndex, ReplaySample } from '../../../shared/api/plans';

/** Loads a rehearsal's replay data all at once, so the projector keeps working offline. */
@Injectable({ providedIn: 'root' })
export class ReplayData {
  private readonly http = inject(HttpClient);

  async load(rehearsalId: string): Promise<{ index: ReplayIndex; samples: ReplaySample[] }> {
    const index = await firstValueFrom(this.http.get<ReplayIndex>(`/api/rehearsals/${rehearsalId}/samples`));
    const samples = await Promise.all(
      index.samples.map((s) => firstValueFrom(this.http.get<ReplaySample>(`/api/rehearsals/${rehearsalId}/samples/${s.n}`))),
    );
    return { index, samples };
  }
}
