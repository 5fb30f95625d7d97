import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type { JoinState, MyDebrief, Nomination, SurveyState } from '../../../shared/api/workshops';
import { requestFlags } from '../core/request-flags';

/** Calls a participant page makes with its link token; every page shows errors itself. */
@Injectable({ providedIn: 'root' })
export class ParticipantApi {
  private readonly http = inject(HttpClient);
  private readonly own = { context: requestFlags({ ownErrors: true }) };

  state(token: string): Observable<SurveyState> {
    return this.http.get<SurveyState>(`/api/p/${encodeURIComponent(token)}`, this.own);
  }
  consent(token: string): Observable<SurveyState> {
    return this.http.post<SurveyState>(`/api/p/${encodeURIComponent(token)}/consent`, {}, this.own);
  }
  /** `nobody` is the explicit "I talk to nobody here regularly" answer (sent only when chosen). */
  save(token: string, version: number, nominations: Nomination[], nobody = false): Observable<SurveyState> {
    const body = nobody ? { version, nominations, nobody: true } : { version, nominations };
    return this.http.put<SurveyState>(`/api/p/${encodeURIComponent(token)}/answers`, body, this.own);
  }
  debrief(token: string): Observable<MyDebrief> {
    return this.http.get<MyDebrief>(`/api/p/${encodeURIComponent(token)}/debrief`, this.own);
  }
  join(code: string): Observable<JoinState> {
    return this.http.get<JoinState>(`/api/p/join/${encodeURIComponent(code)}`, this.own);
  }
  claim(code: string, participantId: number): Observable<{ path: string; name: string }> {
    return this.http.post<{ path: string; name: string }>(`/api/p/join/${encodeURIComponent(code)}/claim`, { participantId }, this.own);
  }
}
